/** Password hashing, shared by sign-in (People) and the demo seed. */
import bcrypt from "bcryptjs";

/** bcrypt cost; 10 or more as the foundation asks, 12 is common practice for interactive sign-in. */
export const BCRYPT_COST = 12;

export function hashPassword(password: string, cost = BCRYPT_COST): Promise<string> {
  return bcrypt.hash(password, cost);
}
