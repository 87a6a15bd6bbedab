/**
 * CSRF protection by a signed double-submit cookie (OWASP Cross-Site Request Forgery Prevention
 * Cheat Sheet, "Signed Double-Submit Cookie"), with csrf-csrf: `GET /api/auth/csrf` sets an
 * httpOnly cookie holding `HMAC(secret, random).random` and answers the same token as
 * `{ token }`; every change (POST, PUT, PATCH, DELETE) must send it back in `x-csrf-token` with
 * the cookie. Another site can neither read the token nor send the header, and cannot forge a
 * cookie the server accepts without the secret.
 *
 * Nothing is stored on the server: an anonymous visitor asking for a token writes no session
 * and no row (the session is written only when someone signs in). The token is bound to the
 * cookie, not to the session, so a script that fetched it before signing in keeps using it
 * after (API.md); signing out drops the cookie, and the next token is a new one.
 */
import crypto from "node:crypto";
import type { Request, RequestHandler, Response } from "express";
import cookieParser from "cookie-parser";
import { doubleCsrf } from "csrf-csrf";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

export interface Csrf {
  /** Checks the token of every change under /api; GET, HEAD and OPTIONS pass untouched (no cookie parsing on reads). */
  protect: RequestHandler;
  /** The token for this browser: the cookie's when it carries a valid one, else a new one (and its cookie). */
  token(req: Request, res: Response): string;
  /** Drops the cookie (sign-out), so the next person at the same browser gets a new token. */
  forget(res: Response): void;
}

export function createCsrf(opts: { sessionSecret: string; secureCookies: boolean; skip?: (req: Request) => boolean }): Csrf {
  // A key of its own, derived from the session secret, so the two uses never share one.
  const secret = crypto.createHmac("sha256", opts.sessionSecret).update("phasebook csrf token").digest("hex");
  // The __Host- prefix (RFC 6265bis) pins the cookie to this host and path /, and needs Secure.
  const cookieName = opts.secureCookies ? "__Host-phasebook.csrf" : "phasebook.csrf";
  const cookieOptions = { httpOnly: true, sameSite: "strict" as const, secure: opts.secureCookies, path: "/" };
  const { doubleCsrfProtection, generateCsrfToken } = doubleCsrf({
    getSecret: () => secret,
    // Bound to the cookie alone: the session id changes at sign-in and the token must outlive it.
    getSessionIdentifier: () => "",
    cookieName,
    cookieOptions,
    getCsrfTokenFromRequest: (req) => req.get("x-csrf-token"),
    skipCsrfProtection: opts.skip,
    errorConfig: { statusCode: 403, code: "csrf_invalid", message: "CSRF token missing or stale" },
  });
  const parseCookies = cookieParser();
  const withCookies = (req: Request, res: Response, then: () => void) => {
    if (req.cookies) return then();
    parseCookies(req, res, (err?: unknown) => {
      if (err) throw err;
      then();
    });
  };
  return {
    protect: (req, res, next) => {
      if (SAFE_METHODS.has(req.method)) return next();
      withCookies(req, res, () => doubleCsrfProtection(req, res, next));
    },
    token: (req, res) => {
      let token = "";
      withCookies(req, res, () => {
        token = generateCsrfToken(req, res);
      });
      return token;
    },
    forget: (res) => {
      res.clearCookie(cookieName, cookieOptions);
    },
  };
}
