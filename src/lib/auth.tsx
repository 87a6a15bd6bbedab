/**
 * The session on the client: who is signed in (from GET /api/auth/me through TanStack Query),
 * sign-in and sign-out, role checks, and the <RequireAuth> gate that sends visitors to sign-in.
 * Role checks here only shape what the screens offer; the server enforces every permission.
 */
import type { ReactNode } from "react";
import { Navigate, Outlet, useLocation } from "react-router-dom";
import type { Role, UserDto } from "@shared/schemas/auth";
import { useMe } from "./session/get-me";
import { paths } from "@/config/paths";
import { FullPageSpinner } from "@/components/ui/spinner";
import { ForbiddenNotice } from "@/components/errors/forbidden-notice";

export { useLogin } from "./session/login";
export { useLogout } from "./session/logout";

/** The signed-in person, `null` when nobody is signed in, `undefined` while still asking. */
export function useUser() {
  return useMe();
}

/** True when the person holds any of the roles (the same rule the server applies). */
export function hasRole(user: Pick<UserDto, "roles"> | null | undefined, ...roles: Role[]): boolean {
  if (!user) return false;
  return roles.some((r) => user.roles.includes(r));
}

interface RequireAuthProps {
  /** When given, the person needs at least one of these roles. */
  roles?: readonly Role[];
  children?: ReactNode;
}

export function RequireAuth({ roles, children }: RequireAuthProps) {
  const { data: user, isPending, error } = useUser();
  const location = useLocation();

  if (isPending) return <FullPageSpinner label="Checking your session" />;
  // Not a 401 (that is `null`): the server is down or broken; let the error boundary explain.
  if (error) throw error;
  if (!user) {
    return <Navigate to={paths.signIn.getHref(`${location.pathname}${location.search}`)} replace />;
  }
  if (roles && roles.length > 0 && !hasRole(user, ...roles)) return <ForbiddenNotice />;
  return <>{children ?? <Outlet />}</>;
}
