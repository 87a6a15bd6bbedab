/**
 * What the session routes need of the app's sign-in machinery, built once per app by createApp:
 * passport's verdict on the credentials, starting and ending the session, the CSRF token, and
 * the rate limits. The limits belong to the app (a test app's lower limit stays its own), so
 * they are counted here, with express-rate-limit's memory store, rather than in middleware
 * shared by every app.
 *
 * Rate limits (OWASP Authentication Cheat Sheet, "Protect Against Automated Attacks" and
 * "Account Lockout"; NIST SP 800-63B §5.2.2, "Rate Limiting (Throttling)", at most 100 failed
 * attempts on one account): the e-mail in a key is normalised as the sign-in itself reads it
 * (trimmed, lower case), so " Member2@…" and "member2@…" are one count. Three counts, each in
 * its own store, and any of them full answers 429 `too_many_attempts`:
 * - every attempt for one e-mail from one client address (one person's typos stop here first,
 *   without locking anyone else out);
 * - failed attempts for one e-mail from any address (several addresses hammering one account);
 * - failed attempts from one address for any e-mail (one address spraying many accounts; high,
 *   because a building's network may reach Phasebook through one address).
 * A successful sign-in does not count against the last two. Reset mails are limited per address
 * and e-mail and per e-mail; a password change per person.
 */
import type { Request, RequestHandler, Response } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import { AppError } from "../../errors";
import type { AuthUser } from "../../middleware/auth";
import type { PassportInstance } from "./passport";

export interface SignIn {
  /** passport-local's verdict on the request's { email, password }: the person, or false. */
  authenticate(req: Request, res: Response): Promise<AuthUser | false>;
  /** Starts the person's session on a new session id (also after a password change). */
  logIn(req: Request, user: AuthUser): Promise<void>;
  /** Ends the session (its row and cookie) and drops the CSRF cookie. */
  logOut(req: Request, res: Response): Promise<void>;
  /** The browser's CSRF token (see server/http/csrf.ts). */
  csrfToken(req: Request, res: Response): string;
  /** Counts an attempt; beyond a limit throws 429 too_many_attempts (with RateLimit headers). */
  limit(kind: "login" | "reset" | "passwordChange", req: Request, res: Response): Promise<void>;
}

export interface RateLimitSetting {
  windowMs: number;
  limit: number;
}

export interface RateLimits {
  /** Every sign-in attempt for one e-mail from one client address. */
  login: RateLimitSetting;
  /** Failed sign-ins for one e-mail, from any address. */
  loginPerEmail: RateLimitSetting;
  /** Failed sign-ins from one client address, for any e-mail. */
  loginPerAddress: RateLimitSetting;
  /** Reset mails asked for one e-mail from one address. */
  reset: RateLimitSetting;
  /** Reset mails asked for one e-mail from any address (no mail-bombing a colleague). */
  resetPerEmail: RateLimitSetting;
  /** Password changes (right or wrong current password) by one signed-in person. */
  passwordChange: RateLimitSetting;
}

/** The session cookie's name (app.ts sets express-session up with it). */
export const SESSION_COOKIE = "phasebook.sid";

const MINUTES = 60 * 1000;

export const DEFAULT_RATE_LIMITS: RateLimits = {
  login: { windowMs: 15 * MINUTES, limit: 10 },
  loginPerEmail: { windowMs: 15 * MINUTES, limit: 20 },
  loginPerAddress: { windowMs: 15 * MINUTES, limit: 100 },
  reset: { windowMs: 60 * MINUTES, limit: 5 },
  resetPerEmail: { windowMs: 60 * MINUTES, limit: 10 },
  passwordChange: { windowMs: 15 * MINUTES, limit: 5 },
};

/** The e-mail as the sign-in reads it: trimmed and lower case. */
export function normalisedEmail(req: Request): string {
  const raw: unknown = req.body?.email;
  return typeof raw === "string" ? raw.trim().toLowerCase() : "";
}

const address = (req: Request) => ipKeyGenerator(req.ip ?? "");

function limiter(name: string, { windowMs, limit }: RateLimitSetting, key: (req: Request) => string, message: string, onlyFailures = false): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    identifier: name,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    skipSuccessfulRequests: onlyFailures,
    keyGenerator: key,
    handler: (_req, _res, next) => next(new AppError(429, "too_many_attempts", message)),
  });
}

function run(middleware: RequestHandler, req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) => {
    void middleware(req, res, (err?: unknown) => (err ? reject(err) : resolve()));
  });
}

export function createSignIn(
  deps: { rateLimits?: Partial<RateLimits> },
  passport: PassportInstance,
  csrf: { token(req: Request, res: Response): string; forget(res: Response): void },
): SignIn {
  const limits = { ...DEFAULT_RATE_LIMITS, ...deps.rateLimits };
  const signInWords = "Too many sign-in attempts; wait a few minutes and try again.";
  const resetWords = "Too many reset requests; wait an hour and try again.";
  const chains: Record<Parameters<SignIn["limit"]>[0], RequestHandler[]> = {
    login: [
      limiter("login", limits.login, (req) => `${address(req)}|${normalisedEmail(req)}`, signInWords),
      limiter("login-email", limits.loginPerEmail, normalisedEmail, signInWords, true),
      limiter("login-address", limits.loginPerAddress, address, signInWords, true),
    ],
    reset: [
      limiter("reset", limits.reset, (req) => `${address(req)}|${normalisedEmail(req)}`, resetWords),
      limiter("reset-email", limits.resetPerEmail, normalisedEmail, resetWords),
    ],
    passwordChange: [
      limiter("password-change", limits.passwordChange, (req) => `person ${req.user?.id ?? address(req)}`, "Too many password changes; wait a few minutes and try again."),
    ],
  };
  return {
    csrfToken: csrf.token,
    authenticate: (req, res) =>
      new Promise((resolve, reject) => {
        const verdict = (err: unknown, user: Express.User | false) => (err ? reject(err) : resolve(user || false));
        // passport calls next only when a strategy passes without a verdict: nobody signed in.
        passport.authenticate("local", verdict)(req, res, (err?: unknown) => (err ? reject(err) : resolve(false)));
      }),
    // passport regenerates the session id on sign-in (no session fixation); nothing of the
    // session before it is kept, so signing in is the only thing that writes a session.
    logIn: (req, user) => new Promise((resolve, reject) => req.login(user, { session: true }, (e) => (e ? reject(e) : resolve()))),
    // passport's logout gives the request a new, empty session, which express-session would
    // then store (its id differs from the cookie's): destroyed at once, with its cookie, so
    // signing out leaves no row behind.
    logOut: (req, res) =>
      new Promise((resolve, reject) =>
        req.logout((e) => {
          if (e) return reject(e);
          req.session.destroy((err) => {
            if (err) return reject(err);
            res.clearCookie(SESSION_COOKIE, { path: "/" });
            csrf.forget(res);
            resolve();
          });
        }),
      ),
    limit: async (kind, req, res) => {
      for (const middleware of chains[kind]) await run(middleware, req, res);
    },
  };
}
