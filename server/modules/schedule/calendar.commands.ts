/** A new secret address for a person's calendar feed: the old one stops working at once. */
import { User } from "../../entities";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import { newToken } from "../../core/tokens";
import type { Deps } from "../../core/deps";
import type { AuthUser } from "../../middleware/auth";

export async function rotateCalendarToken(deps: Deps, actor: AuthUser): Promise<string> {
  const token = newToken(24);
  await serialTransaction(deps.ds, async (em) => {
    await em.update(User, actor.id, { calendarToken: token, updatedAt: deps.now().toISOString() });
    await audit(em, deps.now(), actor.id, "calendar_token.rotated", "user", actor.id, {});
  });
  return token;
}
