/** Home: each person's start page, composed from the dashboard sections their roles receive. */
import { useUser } from "@/lib/auth";
import { describeError } from "@/lib/forms";
import { useDashboard } from "@/features/dashboard/api/get-dashboard";
import { ManagerSection, MemberSection, SafetySection } from "@/features/dashboard/components/dashboard-sections";
import { PageHeader } from "@/components/ui/page-header";
import { Alert } from "@/components/ui/alert";
import { LoadingLine } from "@/components/ui/spinner";

function greeting(now: Date): string {
  const h = now.getHours();
  if (h < 5) return "Working late";
  if (h < 12) return "Good morning";
  if (h < 18) return "Good afternoon";
  return "Good evening";
}

export function HomeRoute() {
  const { data: user } = useUser();
  const dashboard = useDashboard();
  // Skip an honorific so "Dr. Callum Ferreira" is greeted as Callum.
  const firstName = (user?.name ?? "").split(/\s+/).find((w) => !/^(dr|prof|mr|mrs|ms|mx)\.?$/i.test(w)) ?? "";

  return (
    <>
      <PageHeader title={`${greeting(new Date())}, ${firstName}`} description="What needs you today." />
      {dashboard.isPending && <LoadingLine label="Loading your start page" />}
      {dashboard.isError && <Alert tone="danger">{describeError(dashboard.error)}</Alert>}
      {dashboard.data && (
        <div className="flex flex-col gap-5">
          {dashboard.data.manager && <ManagerSection manager={dashboard.data.manager} />}
          {dashboard.data.safety && <SafetySection safety={dashboard.data.safety} />}
          <MemberSection member={dashboard.data.member} />
        </div>
      )}
    </>
  );
}
