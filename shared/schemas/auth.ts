import { z } from "zod";

export const ROLES = ["member", "group_lead", "manager", "safety_officer", "admin"] as const;
export const role = z.enum(ROLES);
export type Role = z.infer<typeof role>;

/**
 * Who takes from the stock and weighs out solutions: members (API.md's "member" for usage and the
 * solution plan), and the manager and safety officer, who also work at the bench. An
 * administrator or a group lead without the member role does not.
 */
export const BENCH_ROLES = ["member", "manager", "safety_officer"] as const satisfies readonly Role[];

export const ROLE_LABELS: Record<Role, string> = {
  member: "Member",
  group_lead: "Group lead",
  manager: "Facility manager",
  safety_officer: "Safety officer",
  admin: "Administrator",
};

/**
 * New passwords: at least 12 characters (NIST SP 800-63B §5.1.1.2 asks at least 8; Phasebook
 * asks 12), counted as a person counts them (Unicode code points, so "é" is one), no rules on
 * which kinds of character. The server also refuses common and guessable ones
 * (server/modules/people/password-rules.ts): that list is too large to ship to the browser.
 */
export const PASSWORD_MIN = 12;
const password = z
  .string({ message: "Enter a password" })
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters`)
  .max(200, "Use at most 200 characters")
  // .min counts UTF-16 units; an emoji is two of them but one character.
  .refine((s) => s.length < PASSWORD_MIN || [...s].length >= PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters`);

export const loginInput = z.object({
  email: z.string({ message: "Enter your e-mail address" }).trim().min(1, "Enter your e-mail address").max(254),
  password: z.string({ message: "Enter your password" }).min(1, "Enter your password").max(200),
});
export type LoginInput = z.infer<typeof loginInput>;

export const changePasswordInput = z.object({
  currentPassword: z.string({ message: "Enter your current password" }).min(1, "Enter your current password"),
  newPassword: password,
});
export type ChangePasswordInput = z.infer<typeof changePasswordInput>;

export const resetRequestInput = z.object({
  email: z.email({ message: "Enter a valid e-mail address" }).max(254),
});
export type ResetRequestInput = z.infer<typeof resetRequestInput>;

export const resetConfirmInput = z.object({
  token: z.string().min(20, "This reset link is incomplete").max(200),
  newPassword: password,
});
export type ResetConfirmInput = z.infer<typeof resetConfirmInput>;

export const userDto = z.object({
  id: z.number(),
  email: z.string(),
  name: z.string(),
  roles: z.array(role),
  /** Research group; null when in none. */
  groupId: z.number().nullable(),
  /** Research groups the person leads. */
  leadOf: z.array(z.number()).default([]),
  /** The external customer's organisation the person works for; null for the host institution's own people. */
  organisation: z.string().nullable(),
});
export type UserDto = z.infer<typeof userDto>;

/** GET /api/auth/me and POST /api/auth/login answer the signed-in person. */
export const sessionDto = z.object({ user: userDto });

/** GET /api/auth/csrf: the session's token, sent back in the x-csrf-token header. */
export const csrfTokenDto = z.object({ token: z.string() });

/** POST /api/auth/password-reset/request answers the same words whether or not the address has an account. */
export const resetRequestedDto = z.object({ detail: z.string() });

export { password as passwordSchema };
