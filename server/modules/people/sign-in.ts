/**
 * What the session routes need of the app's sign-in machinery, built once per app by createApp:
 * passport's verdict on the credentials, starting and ending the session, the session's CSRF
 * token, and the sign-in and reset rate limits. The limits belong to the app (a test app's lower
 * limit stays its own), so they are counted here rather than in middleware shared by every app.
 */
import type { Request, RequestHandler, Response } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import { AppError } from "../../errors";
import type { AuthUser } from "../../middleware/auth";
import type { PassportInstance } from "./passport";

export interface SignIn {
  /** passport-local's verdict on the request's { email, password }: the person, or false. */
  authenticate(req: Request, res: Response): Promise<AuthUser | false>;
  /** Starts the person's session; the CSRF token is kept across the session id change. */
  logIn(req: Request, user: AuthUser): Promise<void>;
  logOut(req: Request): Promise<void>;
  csrfToken(req: Request): string;
  /** Counts an attempt; beyond the limit throws 429 too_many_attempts (with RateLimit headers). */
  limit(kind: "login" | "reset", req: Request, res: Response): Promise<void>;
}

export interface RateLimitSetting {
  windowMs: number;
  limit: number;
}

/** Ten sign-in attempts per address and e-mail in fifteen minutes. */
const LOGIN_LIMIT: RateLimitSetting = { windowMs: 15 * 60 * 1000, limit: 10 };
/** Five reset mails per address and e-mail an hour. */
const RESET_LIMIT: RateLimitSetting = { windowMs: 60 * 60 * 1000, limit: 5 };

/** Per address and e-mail, so one person's typos do not lock out a shared lab network. */
function limiter({ windowMs, limit }: RateLimitSetting, message: string): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? "")}|${String(req.body?.email ?? "").toLowerCase()}`,
    handler: (_req, _res, next) => next(new AppError(429, "too_many_attempts", message)),
  });
}

function run(middleware: RequestHandler, req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) => {
    void middleware(req, res, (err?: unknown) => (err ? reject(err) : resolve()));
  });
}

export function createSignIn(
  deps: { loginRateLimit?: RateLimitSetting },
  passport: PassportInstance,
  csrfToken: (req: Request) => string,
): SignIn {
  const limits = {
    login: limiter(deps.loginRateLimit ?? LOGIN_LIMIT, "Too many sign-in attempts; wait a few minutes and try again."),
    reset: limiter(RESET_LIMIT, "Too many reset requests; wait an hour and try again."),
  };
  return {
    csrfToken,
    authenticate: (req, res) =>
      new Promise((resolve, reject) => {
        const verdict = (err: unknown, user: Express.User | false) => (err ? reject(err) : resolve(user || false));
        // passport calls next only when a strategy passes without a verdict: nobody signed in.
        passport.authenticate("local", verdict)(req, res, (err?: unknown) => (err ? reject(err) : resolve(false)));
      }),
    logIn: (req, user) => new Promise((resolve, reject) => req.login(user, { session: true, keepSessionInfo: true }, (e) => (e ? reject(e) : resolve()))),
    logOut: (req) => new Promise((resolve, reject) => req.logout({ keepSessionInfo: true }, (e) => (e ? reject(e) : resolve()))),
    limit: (kind, req, res) => run(limits[kind], req, res),
  };
}
