/**
 * Administration › System: whether mail goes out, whether card invoices reach the payment
 * service, and how the last nightly backup went, each in words an administrator can act on.
 */
import type { ReactNode } from "react";
import { describeError } from "@/lib/forms";
import { formatDateTime } from "@/lib/format";
import { useFacilityZone } from "@/lib/facility";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Card } from "@/components/ui/card";
import { LoadingLine } from "@/components/ui/spinner";
import { useSystemStatus, type SystemStatus } from "../api/get-system-status";

type Tone = "ok" | "warning" | "danger";

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[8rem_1fr] gap-2 py-1 text-sm">
      <dt className="text-grey-600">{label}</dt>
      <dd className="text-grey-900">{children}</dd>
    </div>
  );
}

/** A status card: its rows as a definition list, and a note under the list (a <dl> holds only its rows). */
function StatusCard({ title, tone, summary, testId, note, children }: { title: string; tone: Tone; summary: string; testId: string; note?: ReactNode; children: ReactNode }) {
  return (
    <Card title={title} actions={<Badge tone={tone}>{summary}</Badge>}>
      <dl data-testid={testId}>{children}</dl>
      {note}
    </Card>
  );
}

function megabytes(bytes: number | null): string {
  return bytes === null ? "—" : `${(bytes / 1e6).toFixed(1)} MB`;
}

function MailCard({ mail }: { mail: SystemStatus["mail"] }) {
  const zone = useFacilityZone();
  const tone: Tone = mail.via === "none" ? "warning" : mail.failed > 0 ? "danger" : "ok";
  const via = { smtp: "the mail server in SMTP_URL", fake: "the local fake mailbox (development; nothing reaches a real inbox)", none: "nothing: SMTP_URL is not set" }[mail.via];
  return (
    <StatusCard
      title="Mail"
      tone={tone}
      summary={mail.via === "none" ? "Not configured" : mail.failed > 0 ? "Failures" : "Sending"}
      testId="status-mail"
      note={
        mail.via === "none" ? (
          <p className="mt-2 text-sm text-grey-700">
            Mail waits in the outbox and nothing is lost: set <code>SMTP_URL</code> and restart, and the waiting messages go out.
          </p>
        ) : undefined
      }
    >
      <Row label="Sent through">{via}</Row>
      <Row label="Waiting">
        {mail.pending} in the outbox
        {mail.oldestPendingAt && <span className="text-grey-600"> (oldest from {formatDateTime(mail.oldestPendingAt, zone)})</span>}
      </Row>
      <Row label="Given up">{mail.failed} after every retry</Row>
    </StatusCard>
  );
}

function PaymentsCard({ payments }: { payments: SystemStatus["payments"] }) {
  const tone: Tone = payments.via === "none" ? "warning" : "ok";
  const via = { service: "the payment service (STRIPE_SECRET_KEY)", test: "a test endpoint (the local fake; no card is charged)", none: "nothing: STRIPE_SECRET_KEY is not set" }[payments.via];
  return (
    <StatusCard title="Card payments" tone={tone} summary={payments.via === "none" ? "Not configured" : "Connected"} testId="status-payments"
      note={
        payments.via === "none" ? (
          <p className="mt-2 text-sm text-grey-700">
            Statements for external customers are kept and their invoices wait; set <code>STRIPE_SECRET_KEY</code> and restart to send them.
          </p>
        ) : undefined
      }
    >
      <Row label="Invoices through">{via}</Row>
      <Row label="Waiting">{payments.invoicesWaiting} external invoice(s) not yet with the payment service</Row>
    </StatusCard>
  );
}

function BackupCard({ backup }: { backup: SystemStatus["backup"] }) {
  const zone = useFacilityZone();
  const last = backup.last;
  const tone: Tone = !backup.scheduled ? "warning" : last && !last.ok ? "danger" : last ? "ok" : "warning";
  const summary = !backup.scheduled ? "Not scheduled" : !last ? "None yet" : last.ok ? "Last one good" : "Last one failed";
  return (
    <StatusCard title="Nightly backup" tone={tone} summary={summary} testId="status-backup"
      note={
        !backup.scheduled ? (
          <p className="mt-2 text-sm text-grey-700">
            Nightly backups run in production when <code>BACKUP_DIR</code> is set. <code>npm run backup -- DIR</code> takes one at any time; the README says how to
            restore.
          </p>
        ) : undefined
      }
    >
      <Row label="Folder">{backup.dir ?? "not set (BACKUP_DIR)"}</Row>
      <Row label="Kept">{backup.keepDays} days</Row>
      <Row label="Last backup">
        {last ? (
          <>
            {formatDateTime(last.at, zone)}: {last.ok ? `${megabytes(last.bytes)} in ${last.folder}` : `failed: ${last.error ?? "no reason recorded"}`}
          </>
        ) : (
          "none recorded"
        )}
      </Row>
    </StatusCard>
  );
}

export function SystemStatusView() {
  const status = useSystemStatus();
  if (status.isPending) return <LoadingLine label="Loading the system status" />;
  if (status.isError) return <Alert tone="danger">{describeError(status.error)}</Alert>;
  const s = status.data;
  return (
    <div className="flex flex-col gap-3">
      {s.mode === "public_demo" && (
        <Alert tone="warning">
          This server runs the public demo (<code>DEMO_SEED</code> in production): its data is invented and the demo accounts sign in with the published
          password.
        </Alert>
      )}
      <div className="grid gap-3 lg:grid-cols-3">
        <MailCard mail={s.mail} />
        <PaymentsCard payments={s.payments} />
        <BackupCard backup={s.backup} />
      </div>
    </div>
  );
}
