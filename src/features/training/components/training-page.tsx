/**
 * The manager's training page: open requests from members, records expiring within 30 days,
 * all records with revoke (a dialog asks the reason, kept on the record and in the audit log), and the grant
 * form (which renews a live record). Revoke and dismiss are offered where the record's abilities
 * (the training policy's answer) allow them. The route passes the instruments in.
 */
import { useState } from "react";
import type { InstrumentDto } from "@shared/schemas/instruments";
import { TRAINING_STATE_LABELS, type TrainingDto } from "@shared/schemas/training";
import { describeError } from "@/lib/forms";
import { zonedInputToIso } from "@shared/domain/facility-time";
import { useFacilityZone } from "@/lib/facility";
import { formatDate, formatDateTime } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Dialog } from "@/components/ui/dialog";
import { Checkbox, Input, Select } from "@/components/ui/input";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingLine } from "@/components/ui/spinner";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { useCloseTrainingRequest, useGrantTraining, useRevokeTraining, useTrainablePeople, useTrainingRecords, useTrainingRequests } from "../api/training";

const TONES: Record<TrainingDto["state"], BadgeTone> = { current: "ok", expiring: "warning", expired: "danger", none: "neutral" };

function RecordsTable({ items, onRevoke }: { items: TrainingDto[]; onRevoke?: (r: TrainingDto) => void }) {
  const zone = useFacilityZone();
  return (
    <Table caption="Training records">
      <THead>
        <tr>
          <Th>Person</Th>
          <Th>Instrument</Th>
          <Th>State</Th>
          <Th>Expires</Th>
          <Th>After hours</Th>
          <Th>Notes</Th>
          {onRevoke && <Th className="text-right">Action</Th>}
        </tr>
      </THead>
      <TBody>
        {items.map((r) => (
          <Tr key={r.id}>
            <Td>{r.userName}</Td>
            <Td>{r.instrumentName}</Td>
            <Td>
              <Badge tone={TONES[r.state]}>{TRAINING_STATE_LABELS[r.state]}</Badge>
            </Td>
            <Td>{r.expiresAt ? formatDate(r.expiresAt, zone) : "Never"}</Td>
            <Td>{r.afterHours ? "Endorsed" : "No"}</Td>
            <Td className="text-xs">{r.notes || "—"}</Td>
            {onRevoke && (
              <Td className="text-right">
                {r.abilities.revoke && (
                  <Button size="sm" variant="danger" onClick={() => onRevoke(r)}>
                    Revoke…
                  </Button>
                )}
              </Td>
            )}
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}

function GrantForm({ instruments, initial }: { instruments: InstrumentDto[]; initial?: { userId: number; instrumentId: number } }) {
  const people = useTrainablePeople(true);
  const grant = useGrantTraining();
  const zone = useFacilityZone();
  const oneYear = new Date(Date.now() + 365 * 86_400_000).toISOString().slice(0, 10);
  const [v, setV] = useState({ userId: String(initial?.userId ?? ""), instrumentId: String(initial?.instrumentId ?? ""), expires: oneYear, afterHours: false, notes: "" });
  const [msg, setMsg] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);
  const submit = async () => {
    setMsg(null);
    // The end of that day on the facility's clock, where the bookings it governs are made.
    const expiresAt = v.expires && zone ? zonedInputToIso(`${v.expires}T23:59`, zone) : null;
    if (v.expires && !expiresAt) {
      setMsg({ tone: "danger", text: "Give the expiry as a date, or leave it empty for none." });
      return;
    }
    try {
      await grant.mutateAsync({
        userId: Number(v.userId),
        instrumentId: Number(v.instrumentId),
        expiresAt,
        afterHours: v.afterHours,
        notes: v.notes,
      });
      setMsg({ tone: "ok", text: "Training recorded; the person has been told by e-mail." });
    } catch (e) {
      setMsg({ tone: "danger", text: describeError(e) });
    }
  };
  return (
    <Card title="Record training" description="Granting again renews the person's live record on that instrument.">
      <div className="grid gap-3 sm:grid-cols-2">
        <Select label="Person" value={v.userId} onChange={(e) => setV({ ...v, userId: e.target.value })}>
          <option value="">Choose…</option>
          {(people.data?.items ?? []).map((p) => (
            <option key={p.id} value={p.id}>
              {p.name} ({p.email})
            </option>
          ))}
        </Select>
        <Select label="Instrument" value={v.instrumentId} onChange={(e) => setV({ ...v, instrumentId: e.target.value })}>
          <option value="">Choose…</option>
          {instruments.map((i) => (
            <option key={i.id} value={i.id}>
              {i.name}
            </option>
          ))}
        </Select>
        <Input label="Expires on (empty: never)" type="date" value={v.expires} onChange={(e) => setV({ ...v, expires: e.target.value })} />
        <Input label="Notes" value={v.notes} onChange={(e) => setV({ ...v, notes: e.target.value })} />
        <Checkbox label="After-hours endorsement (lone-working induction done)" checked={v.afterHours} onChange={(e) => setV({ ...v, afterHours: e.target.checked })} />
      </div>
      {msg && <Alert tone={msg.tone} className="mt-3">{msg.text}</Alert>}
      <div className="mt-3 flex justify-end">
        <Button variant="primary" disabled={!v.userId || !v.instrumentId || !zone} loading={grant.isPending} onClick={submit}>
          Record training
        </Button>
      </div>
    </Card>
  );
}

/** Asks why before revoking; the reason is kept on the record and in the audit log. */
function RevokeDialog({ record, onClose }: { record: TrainingDto | null; onClose: () => void }) {
  const revoke = useRevokeTraining();
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const close = () => {
    setReason("");
    setError(null);
    onClose();
  };
  const submit = async () => {
    if (!record) return;
    setError(null);
    try {
      await revoke.mutateAsync({ id: record.id, reason: reason.trim() });
      close();
    } catch (e) {
      setError(describeError(e));
    }
  };
  return (
    <Dialog
      open={record !== null}
      onClose={close}
      title="Revoke training"
      description={record ? `${record.userName} on ${record.instrumentName}. They cannot book this instrument afterwards; bookings already made stay until you cancel them.` : undefined}
    >
      <form
        className="flex flex-col gap-3"
        data-testid="revoke-dialog"
        onSubmit={(e) => {
          e.preventDefault();
          void submit();
        }}
      >
        <Input label="Reason (kept on the record and in the audit log)" value={reason} onChange={(e) => setReason(e.target.value)} required autoFocus data-testid="revoke-reason" maxLength={500} />
        {error && <Alert tone="danger">{error}</Alert>}
          <div className="flex justify-end gap-2">
          <Button onClick={close}>Keep the training</Button>
          <Button type="submit" variant="danger" disabled={!reason.trim()} loading={revoke.isPending} data-testid="revoke-confirm">
            Revoke
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

export function TrainingPage({ instruments }: { instruments: InstrumentDto[] }) {
  const zone = useFacilityZone();
  const expiring = useTrainingRecords({ expiringWithinDays: 30 });
  const all = useTrainingRecords({ includeRevoked: true });
  const requests = useTrainingRequests("open");
  const close = useCloseTrainingRequest();
  const [revoking, setRevoking] = useState<TrainingDto | null>(null);

  return (
    <div className="flex flex-col gap-5">
      <Card title="Requests for training">
        {requests.isPending && <LoadingLine label="Loading requests" />}
        {requests.data?.length === 0 && <EmptyState title="No open requests">Members ask from an instrument's page.</EmptyState>}
        {(requests.data ?? []).length > 0 && (
          <ul className="divide-y divide-grey-100">
            {requests.data!.map((r) => (
              <li key={r.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span>
                  <strong>{r.userName}</strong> asks for training on <strong>{r.instrumentName}</strong>
                  {r.note && <> — “{r.note}”</>} <span className="text-xs text-grey-600">({formatDateTime(r.createdAt, zone)})</span>
                </span>
                {r.abilities.close && (
                  <Button size="sm" onClick={() => close.mutate({ id: r.id, outcome: "dismissed" })}>
                    Dismiss
                  </Button>
                )}
              </li>
            ))}
          </ul>
        )}
      </Card>
      <Card title="Expiring within 30 days">
        {expiring.data && expiring.data.items.length === 0 ? <p className="text-sm text-grey-600">None.</p> : expiring.data && <RecordsTable items={expiring.data.items} />}
      </Card>
      <GrantForm instruments={instruments} />
      <RevokeDialog record={revoking} onClose={() => setRevoking(null)} />
      <Card title="All training records">{all.data ? <RecordsTable items={all.data.items} onRevoke={setRevoking} /> : <LoadingLine label="Loading records" />}</Card>
    </div>
  );
}
