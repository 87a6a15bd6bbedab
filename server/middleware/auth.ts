/** Sign-in and role checks that every router puts in front of its handlers. */
import type { RequestHandler } from "express";
import type { Role } from "@shared/schemas/auth";
import { Forbidden, Unauthenticated } from "../errors";

/** The signed-in person, as every route and policy sees them. */
export interface AuthUser {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  /** Research group (own group's containers and accounts); null when in none. */
  groupId: number | null;
  /** Research groups this person leads. */
  leadOf: number[];
  /** External customer's organisation; null for the host institution's own people. */
  organisation: string | null;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends AuthUser {}
  }
}

export const requireAuth: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new Unauthenticated();
  next();
};

/** Allows the request when the signed-in person holds any of the roles. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) throw new Unauthenticated();
    if (!roles.some((r) => req.user!.roles.includes(r))) {
      throw new Forbidden(`This needs one of these roles: ${roles.join(", ")}.`);
    }
    next();
  };
}

export function currentUser(req: Express.Request): AuthUser {
  if (!req.user) throw new Unauthenticated();
  return req.user;
}

export function hasRole(user: AuthUser, ...roles: Role[]): boolean {
  return roles.some((r) => user.roles.includes(r));
}
