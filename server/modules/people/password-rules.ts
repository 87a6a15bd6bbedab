/**
 * What a new password must not be, checked on the server wherever one is chosen (a change, a
 * reset link, an administrator's first password). NIST SP 800-63B §5.1.1.2 (memorized secret
 * verifiers): a minimum length (8 there; Phasebook asks 12, checked by the shared schema so the
 * form says it as you type), no composition rules, and a comparison against "passwords obtained
 * from previous breach corpuses", "dictionary words", "repetitive or sequential characters" and
 * "context-specific words, such as the name of the service, the username, and derivatives
 * thereof"; a refusal says why, next to the field. The list of common passwords is the one the
 * zxcvbn-ts project keeps (@zxcvbn-ts/language-common, about 49,000 passwords drawn from
 * breach corpora), never one typed here.
 */
import { dictionary } from "@zxcvbn-ts/language-common";
import { DEMO_PASSWORD } from "../../db/seed/demo-people";
import { RuleBroken } from "../../errors";

let common: Set<string> | null = null;

/** The common-password list as a set, built once on first use (the package unpacks its list when loaded, in milliseconds). */
function commonPasswords(): Set<string> {
  common ??= new Set(dictionary["passwords-common"].map((p) => p.toLowerCase()));
  return common;
}

/** Whether the list of common passwords holds this one (letter case ignored, as the list is lower case). */
export function isCommonPassword(password: string): boolean {
  return commonPasswords().has(password.toLowerCase());
}

/** Letters only, lower case: "Phasebook-2026!" and "phasebook" are the same word with decorations. */
function letters(s: string): string {
  return s.toLowerCase().replace(/[^\p{L}]/gu, "");
}

export interface PasswordContext {
  /** The person's e-mail address: neither it nor its local part may be the password. */
  email?: string;
  /** The facility's name, a word anyone near the lab would try. */
  facilityName?: string;
}

/** Why a new password is refused (code and words for the field), or null when it is fine. */
export function passwordRefusal(password: string, context: PasswordContext = {}): { code: string; message: string } | null {
  const lower = password.toLowerCase();
  if (lower === DEMO_PASSWORD || isCommonPassword(password)) {
    return { code: "password_too_common", message: "This password is on a list of commonly used passwords; choose another (a short sentence works well)." };
  }
  // One character or one short group over and over: "aaaaaaaaaaaa", "abcabcabcabc", "121212121212".
  if (/^(.{1,4})\1+$/su.test(password)) {
    return { code: "password_repetitive", message: "This password repeats the same few characters; choose one that does not." };
  }
  const word = letters(password);
  const local = context.email?.split("@")[0] ?? "";
  const contextWords = ["phasebook", "phasebookdemo", letters(local), letters(context.facilityName ?? "")].filter((w) => w.length >= 4);
  if (lower === context.email?.toLowerCase() || contextWords.includes(word)) {
    return { code: "password_guessable", message: "This password is made of your e-mail address or the name of this site or facility; choose another." };
  }
  return null;
}

/** Throws 422 with the refusal on the named field (newPassword, or password in the administrator's form). */
export function checkNewPassword(password: string, context: PasswordContext, field = "newPassword"): void {
  const refusal = passwordRefusal(password, context);
  if (refusal) throw new RuleBroken(refusal.message, [{ path: field, message: refusal.message }], refusal.code);
}
