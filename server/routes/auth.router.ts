/** Session routes of the HTTP contract: csrf, login, logout, me; plus password change and reset. */
import { Router, type RequestHandler } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import {
  changePasswordInput,
  loginInput,
  resetConfirmInput,
  resetRequestInput,
  type ChangePasswordInput,
  type ResetConfirmInput,
  type ResetRequestInput,
} from "@shared/schemas/auth";
import type { Ctx } from "../context";
import { currentUser, requireAuth } from "../middleware/auth";
import { body, validate } from "../middleware/validate";
import { sendProblem } from "../middleware/problem";
import { Unauthenticated } from "../errors";

export function createAuthRouter(ctx: Ctx, passport: import("passport").PassportStatic, csrfToken: (req: Express.Request) => string): Router {
  const r = Router();
  const { windowMs, limit } = ctx.loginRateLimit ?? { windowMs: 15 * 60 * 1000, limit: 10 };
  // Per address and e-mail, so one person's typos do not lock out a shared lab network.
  const loginLimiter = rateLimit({
    windowMs,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? "")}|${String(req.body?.email ?? "").toLowerCase()}`,
    handler: (_req, res) => sendProblem(res, 429, "too_many_attempts", "Too many sign-in attempts; wait a few minutes and try again."),
  });
  const resetLimiter = rateLimit({
    windowMs: 60 * 60 * 1000,
    limit: 5,
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? "")}|${String(req.body?.email ?? "").toLowerCase()}`,
    handler: (_req, res) => sendProblem(res, 429, "too_many_attempts", "Too many reset requests; wait an hour and try again."),
  });

  r.get("/csrf", (req, res) => {
    res.json({ token: csrfToken(req) });
  });

  const login: RequestHandler = (req, res, next) => {
    passport.authenticate("local", (err: unknown, user: Express.User | false) => {
      if (err) return next(err);
      if (!user) return next(new Unauthenticated("E-mail or password is not right."));
      // keepSessionInfo keeps the CSRF token across the session id change made at sign-in.
      req.login(user, { keepSessionInfo: true } as import("passport").LogInOptions, (e) => (e ? next(e) : res.json({ user })));
    })(req, res, next);
  };
  r.post("/login", loginLimiter, validate({ body: loginInput }), login);

  r.post("/logout", requireAuth, (req, res, next) => {
    req.logout({ keepSessionInfo: true }, (err) => (err ? next(err) : res.status(204).end()));
  });

  r.get("/me", requireAuth, (req, res) => {
    res.json({ user: currentUser(req) });
  });

  r.post("/password", requireAuth, validate({ body: changePasswordInput }), async (req, res) => {
    const input = body<ChangePasswordInput>(req);
    await ctx.services.users.changePassword(currentUser(req).id, input.currentPassword, input.newPassword, req.sessionID);
    res.status(204).end();
  });

  r.post("/password-reset/request", resetLimiter, validate({ body: resetRequestInput }), async (req, res) => {
    await ctx.services.users.requestReset(body<ResetRequestInput>(req).email);
    res.status(202).json({ detail: "If that address has an account, a reset link is on its way." });
  });

  r.post("/password-reset/confirm", validate({ body: resetConfirmInput }), async (req, res) => {
    const input = body<ResetConfirmInput>(req);
    await ctx.services.users.confirmReset(input.token, input.newPassword);
    res.status(204).end();
  });

  return r;
}
