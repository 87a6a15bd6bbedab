/**
 * The shape of every record policy: for each action, a check that answers null (allowed) or a
 * denial with its status, a stable code and a sentence saying why. Routes and commands call
 * `authorize` (which throws the denial as problem JSON); presenters send `abilities`, the same
 * checks as true/false, so the client shows only what the server would allow.
 */
import { AppError } from "../errors";

export interface Denial {
  /** 403: this person may not touch this record; 409: nobody may, in its present state; 422: the action does not apply to it. */
  status: 403 | 404 | 409 | 422;
  code: string;
  reason: string;
}

export type Check<Actor, R> = (actor: Actor, record: R) => Denial | null;

export class PolicyDenied extends AppError {
  constructor(d: Denial) {
    super(d.status, d.code, d.reason);
  }
}

export interface Policy<Act extends string, Actor, R> {
  actions: readonly Act[];
  /** The denial, or null when the actor may. */
  check(actor: Actor, action: Act, record: R): Denial | null;
  can(actor: Actor, action: Act, record: R): boolean;
  /** Throws the denial as a problem (403/404/409 with its code). */
  authorize(actor: Actor, action: Act, record: R): void;
  /** Every action as true/false, for the record's DTO. */
  abilities(actor: Actor, record: R): Record<Act, boolean>;
}

export function definePolicy<Act extends string, Actor, R>(checks: Record<Act, Check<Actor, R>>): Policy<Act, Actor, R> {
  const actions = Object.keys(checks) as Act[];
  const check = (actor: Actor, action: Act, record: R) => checks[action](actor, record);
  return {
    actions,
    check,
    can: (actor, action, record) => check(actor, action, record) === null,
    authorize(actor, action, record) {
      const d = check(actor, action, record);
      if (d) throw new PolicyDenied(d);
    },
    abilities(actor, record) {
      return Object.fromEntries(actions.map((a) => [a, check(actor, a, record) === null])) as Record<Act, boolean>;
    },
  };
}

export const deny = (status: Denial["status"], code: string, reason: string): Denial => ({ status, code, reason });
