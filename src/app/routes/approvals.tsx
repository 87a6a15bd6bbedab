/** The manager's approval queue for booking requests. */
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { LoadingLine } from "@/components/ui/spinner";
import { ApprovalQueue } from "@/features/schedule/components/approval-queue";
import { useScheduleContext } from "@/app/use-schedule-context";

export function ApprovalsRoute() {
  const ctx = useScheduleContext();
  return (
    <>
      <PageHeader {...SCREEN_HEADS.approvals} />
      {ctx.error ? (
        <Alert tone="danger">{describeError(ctx.error)}</Alert>
      ) : ctx.loading || !ctx.zone ? (
        <LoadingLine label="Loading the approval queue" />
      ) : (
        <ApprovalQueue names={ctx.names} zone={ctx.zone} />
      )}
    </>
  );
}
