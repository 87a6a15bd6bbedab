/**
 * Session routes of the HTTP contract (csrf, login, logout, me) and the password change and
 * reset. Sign-in goes through passport and the app's rate limits (ctx.signIn); `me` answers the
 * person the session already carries, adding no work to the signed-in path.
 */
import { changePasswordInput, csrfTokenDto, loginInput, resetConfirmInput, resetRequestedDto, resetRequestInput, sessionDto } from "@shared/schemas/auth";
import { route } from "../../http/route-table";
import { Unauthenticated } from "../../errors";
import { changePassword, confirmReset, requestReset } from "./password.commands";

export const sessionRoutes = [
  route({
    method: "get",
    path: "/auth/csrf",
    summary: "The session's CSRF token, to send back in the x-csrf-token header of every change",
    access: "public",
    output: csrfTokenDto,
    handler: ({ ctx, req }) => ({ token: ctx.signIn.csrfToken(req) }),
  }),
  route({
    method: "post",
    path: "/auth/login",
    summary: "Sign in with e-mail and password (a session cookie)",
    description: "401 for an unknown e-mail, a wrong password and a deactivated account alike; 429 after ten attempts for one address and e-mail in fifteen minutes.",
    access: "public",
    body: loginInput,
    output: sessionDto,
    handler: async ({ ctx, req, res }) => {
      await ctx.signIn.limit("login", req, res);
      const user = await ctx.signIn.authenticate(req, res);
      if (!user) throw new Unauthenticated("E-mail or password is not right.");
      await ctx.signIn.logIn(req, user);
      return { user };
    },
  }),
  route({
    method: "post",
    path: "/auth/logout",
    summary: "Sign out",
    access: "signed_in",
    status: 204,
    handler: ({ ctx, req }) => ctx.signIn.logOut(req),
  }),
  route({
    method: "get",
    path: "/auth/me",
    summary: "The signed-in person",
    access: "signed_in",
    output: sessionDto,
    handler: ({ actor }) => ({ user: actor }),
  }),
  route({
    method: "post",
    path: "/auth/password",
    summary: "Change one's own password; one's other sessions end",
    access: "signed_in",
    body: changePasswordInput,
    status: 204,
    handler: ({ ctx, actor, body, req }) => changePassword(ctx, actor, body, req.sessionID),
  }),
  route({
    method: "post",
    path: "/auth/password-reset/request",
    summary: "Mail a single-use link to choose a new password",
    description: "Always 202, so the answer never tells whether the address has an account; 429 after five requests an hour.",
    access: "public",
    body: resetRequestInput,
    status: 202,
    output: resetRequestedDto,
    handler: async ({ ctx, body, req, res }) => {
      await ctx.signIn.limit("reset", req, res);
      await requestReset(ctx, body.email);
      return { detail: "If that address has an account, a reset link is on its way." };
    },
  }),
  route({
    method: "post",
    path: "/auth/password-reset/confirm",
    summary: "Choose a new password with the mailed link's token; every session of the person ends",
    access: "public",
    body: resetConfirmInput,
    status: 204,
    handler: ({ ctx, body }) => confirmReset(ctx, body),
  }),
];
