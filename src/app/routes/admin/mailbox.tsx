/**
 * Administration › System: the status of mail, card payments and the nightly backup and, in
 * development, the local fake mailbox for following the mail Phasebook sends. (The path stays
 * /admin/mailbox, where the development mailbox has always been.)
 */
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { MailboxView } from "@/features/admin/components/mailbox-view";
import { SystemStatusView } from "@/features/admin/components/system-status";

export function MailboxRoute() {
  return (
    <>
      <PageHeader {...SCREEN_HEADS.system} />
      <SystemStatusView />
      <h2 className="mb-2 mt-6 text-base font-semibold text-grey-900">Development mailbox</h2>
      <MailboxView />
    </>
  );
}
