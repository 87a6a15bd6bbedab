/**
 * Session routes of the HTTP contract (csrf, login, logout, me) and the password change and
 * reset. Sign-in goes through passport and the app's rate limits (ctx.signIn, sign-in.ts); `me`
 * answers the person the session already carries, adding no work to the signed-in path. The
 * rules these follow (OWASP, NIST SP 800-63B) are named in sign-in.ts, password.commands.ts,
 * password-rules.ts and server/http/csrf.ts.
 */
import { changePasswordInput, csrfTokenDto, loginInput, resetConfirmInput, resetRequestedDto, resetRequestInput, sessionDto } from "@shared/schemas/auth";
import { route } from "../../http/route-table";
import { Unauthenticated } from "../../errors";
import { changePassword, checkNewPasswordOf, confirmReset, requestReset } from "./password.commands";

export const sessionRoutes = [
  route({
    method: "get",
    path: "/auth/csrf",
    summary: "The CSRF token, to send back in the x-csrf-token header of every change (with the cookie this sets)",
    description: "A signed double-submit cookie: the answer's token and the httpOnly cookie set with it belong together. Stores nothing on the server; the same token keeps working across sign-in, and sign-out drops it.",
    access: "public",
    output: csrfTokenDto,
    handler: ({ ctx, req, res }) => {
      // A token belongs with the cookie set beside it: no cache may hand out a copy of an old one.
      res.set("Cache-Control", "no-store");
      return { token: ctx.signIn.csrfToken(req, res) };
    },
  }),
  route({
    method: "post",
    path: "/auth/login",
    summary: "Sign in with e-mail and password (a session cookie)",
    description:
      "401 for an unknown e-mail, a wrong password and a deactivated account alike, after the same bcrypt work. 429 `too_many_attempts` after ten attempts for one e-mail (trimmed, any letter case) from one address, twenty failed ones for one e-mail from any address, or a hundred failed ones from one address, each in fifteen minutes.",
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
    handler: ({ ctx, req, res }) => ctx.signIn.logOut(req, res),
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
    summary: "Change one's own password; one's other sessions and reset links end",
    description:
      "The new password must have 12 characters or more and not be a common one (422 `password_too_common`, `password_repetitive` or `password_guessable` on `newPassword`); a wrong current password is 422 `current_password_wrong`. 429 `too_many_attempts` after five tries in fifteen minutes. This session stays signed in, on a new session id.",
    access: "signed_in",
    body: changePasswordInput,
    status: 204,
    handler: async ({ ctx, actor, body, req, res }) => {
      // The new password's own rules first: a refused choice is not a guess at the current one.
      checkNewPasswordOf(ctx, actor.email, body.newPassword);
      await ctx.signIn.limit("passwordChange", req, res);
      await changePassword(ctx, actor, body, req.sessionID);
      await ctx.signIn.logIn(req, actor);
    },
  }),
  route({
    method: "post",
    path: "/auth/password-reset/request",
    summary: "Mail a single-use link to choose a new password",
    description: "Always 202, so the answer never tells whether the address has an account; 429 after five requests for one e-mail from one address, or ten from any, in an hour.",
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
    summary: "Choose a new password with the mailed link's token; every session and every other reset link of the person ends",
    description: "422 `reset_link_invalid` for a used, expired or unknown link; the new password's rules as for a change.",
    access: "public",
    body: resetConfirmInput,
    status: 204,
    handler: ({ ctx, body }) => confirmReset(ctx, body),
  }),
];
