/** Administration › Mailbox: the development mailbox, for following the mail Phasebook sends. */
import { PageHeader } from "@/components/ui/page-header";
import { Alert } from "@/components/ui/alert";
import { MailboxView } from "@/features/admin/components/mailbox-view";

export function MailboxRoute() {
  return (
    <>
      <PageHeader title="Mailbox" description="Mail Phasebook has sent, newest first. Refreshes every few seconds." />
      <Alert tone="warning" className="mb-4">
        This is the local fake mailbox used in development: the messages below went to no real inbox.
      </Alert>
      <MailboxView />
    </>
  );
}
