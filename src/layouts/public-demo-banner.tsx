/**
 * The public demo's banner: a production server started with DEMO_SEED holds invented data and
 * demo accounts whose password is published, so every page, signed in or not, says so.
 */
import { useFacility } from "@/lib/facility";

export function PublicDemoBanner() {
  const { data } = useFacility();
  if (!data?.publicDemo) return null;
  return (
    <div role="note" data-testid="public-demo-banner" className="border-b border-organic-300 bg-organic-100 px-3 py-1.5 text-center text-sm text-organic-900">
      <strong className="font-semibold">Public demo.</strong> Everything here is invented, and anyone may sign in with the demo accounts: enter no real
      names, data or passwords.
    </div>
  );
}
