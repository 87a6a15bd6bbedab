/** The frame of every signed-in screen: the session gate around the app shell (its own chunk, not on the sign-in page). */
import { RequireAuth } from "@/lib/auth";
import { AppShell } from "@/layouts/app-shell";

export function SignedInFrame() {
  return (
    <RequireAuth>
      <AppShell />
    </RequireAuth>
  );
}
