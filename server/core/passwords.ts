/**
 * Password hashing, shared by sign-in (People), the command-line first administrator and the
 * demo seed: one bcrypt cost for every stored hash and for the stand-in an unknown e-mail is
 * compared against, so a sign-in for an address without an account does the same work as a
 * wrong password for one with an account (OWASP Authentication Cheat Sheet, "Authentication
 * and Error Messages": the answer and the time it takes must not tell which).
 */
import crypto from "node:crypto";
import bcrypt from "bcryptjs";

/**
 * bcrypt cost (work factor 2^cost). OWASP's Password Storage Cheat Sheet asks for 10 or more
 * for bcrypt; 12 is common practice for interactive sign-in on current hardware (about a
 * quarter of a second with bcryptjs on a small server). Tests may pass a lower one to the app
 * and the seed together.
 */
export const BCRYPT_COST = 12;

export function hashPassword(password: string, cost = BCRYPT_COST): Promise<string> {
  return bcrypt.hash(password, cost);
}

/** The cost a stored bcrypt hash was made with; null for something that is not a bcrypt hash. */
export function hashCost(hash: string): number | null {
  try {
    return bcrypt.getRounds(hash);
  } catch {
    return null;
  }
}

const dummies = new Map<number, Promise<string>>();

/**
 * The stand-in hash compared when the e-mail has no account: made once per cost (the app's
 * configured one), of a random password nobody knows, so nothing can sign in against it.
 */
export function dummyHash(cost = BCRYPT_COST): Promise<string> {
  let h = dummies.get(cost);
  if (!h) {
    h = bcrypt.hash(crypto.randomBytes(24).toString("base64url"), cost);
    dummies.set(cost, h);
  }
  return h;
}

/** What checking a password did: the verdict, and which hash at which cost it compared. */
export interface PasswordCheck {
  ok: boolean;
  /** "dummy" when there was no stored hash (an unknown e-mail). */
  against: "stored" | "dummy";
  /** The cost of the hash that was compared: the work done. */
  cost: number | null;
  /** The password was right but its hash has another cost than the configured one: hash it again. */
  rehash: boolean;
}

/**
 * Compares a password with a stored hash, or with the dummy at the configured cost when there is
 * none: exactly one bcrypt comparison either way.
 */
export async function checkPassword(password: string, stored: string | null, cost = BCRYPT_COST): Promise<PasswordCheck> {
  const storedCost = stored === null ? null : hashCost(stored);
  if (stored === null || storedCost === null) {
    // No account (or a row without a usable hash): the same one comparison, at the configured cost.
    const dummy = await dummyHash(cost);
    await bcrypt.compare(password, dummy);
    return { ok: false, against: "dummy", cost: hashCost(dummy), rehash: false };
  }
  const ok = await bcrypt.compare(password, stored);
  return { ok, against: "stored", cost: storedCost, rehash: ok && storedCost !== cost };
}
