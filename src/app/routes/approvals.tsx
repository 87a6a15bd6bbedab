/** The manager's approval queue for booking requests. */
import { PageHeader } from "@/components/ui/page-header";
import { ApprovalQueue } from "@/features/schedule/components/approval-queue";

export function ApprovalsRoute() {
  return (
    <>
      <PageHeader title="Approval queue" description="Requests on instruments that need your approval. Approving checks the Schedule again." />
      <ApprovalQueue />
    </>
  );
}
