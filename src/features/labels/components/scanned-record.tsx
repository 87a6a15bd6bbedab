/**
 * The record a label opens, for the bench and a phone: what it is, its hazards, and the one or
 * two actions that make sense there. Containers: log usage, move, mark empty or dispose,
 * report a problem. Instruments: the current and next booking, check in or out of one's own
 * booking, record that a cell was cleaned, report a fault. The server decides who may do what;
 * this page only hides what the person could not do anyway.
 */
import { useState } from "react";
import { Link } from "react-router-dom";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { hazardStatementText } from "@shared/domain/ghs-statements";
import { PRECEDENCE_CAUTION } from "@shared/domain/cautions";
import { PICTOGRAM_NAMES, type GhsPictogram } from "@shared/domain/hazards";
import { INSTRUMENT_KIND_LABELS, type InstrumentKind } from "@shared/schemas/instruments";
import { cleanedInput, disposeInput, markEmptyInput, reportFaultInput, reportProblemInput, type ScanBookingDto, type ScanResultDto } from "@shared/schemas/scan";
import type { UserDto } from "@shared/schemas/auth";
import { paths } from "@/config/paths";
import { hasRole, useUser } from "@/lib/auth";
import { isApiError } from "@/lib/api-client";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { formatDate, formatDateTime, formatSpan, humanize } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { useScanAction } from "../api/scan-actions";
import { useLocationChoices } from "../api/get-locations";
import { NoteActionForm } from "./note-action-form";
import { Section } from "./scan-section";
import { LabelTools } from "./scan-label-tools";
import { BENCH_ROLES } from "@shared/schemas/auth";

type ContainerScan = Extract<ScanResultDto, { type: "container" }>;
type InstrumentScan = Extract<ScanResultDto, { type: "instrument" }>;

const STATUS_TONE: Record<string, BadgeTone> = {
  sealed: "aqueous",
  in_use: "ok",
  on_hold: "warning",
  empty: "neutral",
  disposed: "neutral",
  in_service: "ok",
  under_maintenance: "warning",
  retired: "neutral",
};

/** A missing contract route (another part of Phasebook not installed yet) reads as a plain sentence. */
function actionError(e: unknown, what: string): string {
  if (isApiError(e, 404) && e.code === "no_such_route") return `${what} is not available on this server yet.`;
  return describeError(e);
}

export function ScannedRecord({ scan, token, user }: { scan: ScanResultDto; token: string; user: UserDto }) {
  return (
    <div className="mx-auto flex w-full max-w-md flex-col gap-3">
      {scan.type === "container" ? <ContainerView scan={scan} /> : <InstrumentView scan={scan} />}
      {hasRole(user, "manager", "safety_officer") && <LabelTools scan={scan} token={token} />}
    </div>
  );
}

// --- containers --------------------------------------------------------------------------------

const UNITS = ["mg", "g", "kg", "µL", "mL", "L", "mmol", "mol"];

function ContainerView({ scan }: { scan: ContainerScan }) {
  const r = scan.record;
  const { data: user } = useUser();
  const atBench = hasRole(user, ...BENCH_ROLES);
  const action = useScanAction();
  return (
    <>
      <Card
        title={<span data-testid="scan-record-name">{r.name}</span>}
        description={`CAS ${r.casNumber} · ${humanize(r.kind)} · container ${scan.id}`}
        actions={<Badge tone={STATUS_TONE[r.status] ?? "neutral"}>{humanize(r.status)}</Badge>}
      >
        <p className="text-2xl font-semibold tabular-nums text-grey-900" data-testid="scan-quantity">
          {r.quantity} {r.unit}
        </p>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
          <dt className="text-grey-600">Location</dt>
          <dd data-testid="scan-location">{r.location ?? "Not recorded"}</dd>
          {r.expiresAt && (
            <>
              <dt className="text-grey-600">Expires</dt>
              <dd>{formatDate(r.expiresAt)}</dd>
            </>
          )}
        </dl>
        {r.holdReason && <Alert tone="warning" className="mt-2">On hold: {r.holdReason}</Alert>}
        {(r.hazardStatements.length > 0 || r.pictograms.length > 0 || r.cautions.length > 0) && (
          <div className="mt-3 rounded-md border border-danger-200 bg-danger-50 p-2 text-sm text-danger-900" data-testid="scan-cautions">
            {r.signalWord && <p className="font-semibold uppercase tracking-wide">{r.signalWord}</p>}
            {r.pictograms.length > 0 && (
              <p className="text-xs">{r.pictograms.map((p) => `${PICTOGRAM_NAMES[p as GhsPictogram] ?? p} (${p})`).join(" · ")}</p>
            )}
            <ul className="mt-1 list-none text-xs">
              {r.hazardStatements.map((h) => (
                <li key={h}>
                  <span className="font-mono">{h}</span> {hazardStatementText(h) ?? ""}
                </li>
              ))}
            </ul>
            {r.cautions.length > 0 && (
              <ul className="mt-1 list-disc pl-4 text-xs font-medium">
                {r.cautions.map((c) => (
                  <li key={c}>{c}</li>
                ))}
              </ul>
            )}
            <p className="mt-1 text-[11px] text-danger-800">{PRECEDENCE_CAUTION}</p>
          </div>
        )}
      </Card>
      {(r.kind === "waste" ? r.abilities.pourWaste : atBench && r.abilities.draw) && <UsageForm containerId={scan.id} defaultUnit={r.unit} waste={r.kind === "waste"} />}
      {r.abilities.move && (
        <Section title="Move to another place" testId="scan-move">
          <MoveForm containerId={scan.id} currentLocationId={r.locationId} />
        </Section>
      )}
      {(r.abilities.markEmpty || r.abilities.dispose) && (
        <Section title={r.abilities.markEmpty && r.abilities.dispose ? "Mark empty or dispose" : r.abilities.markEmpty ? "Mark empty" : "Dispose"} testId="scan-finish">
          <div className="flex flex-col gap-4">
            {r.abilities.markEmpty && (
            <NoteActionForm
              schema={markEmptyInput}
              field="wasteNote"
              label="Waste note (optional)"
              hint="Where the rinsate or the last of it went."
              submitLabel="Mark empty"
              testId="scan-empty-form"
              onSubmit={(wasteNote) => action.mutateAsync({ kind: "empty", containerId: scan.id, wasteNote })}
            />
            )}
            {r.abilities.dispose && (
            <NoteActionForm
              schema={disposeInput}
              field="wasteNote"
              label="Waste note"
              hint="Which waste container or stream it went to; chlorinated solvents go to halogenated waste."
              submitLabel="Dispose of it"
              variant="danger"
              testId="scan-dispose-form"
              onSubmit={(wasteNote) => action.mutateAsync({ kind: "dispose", containerId: scan.id, wasteNote })}
            />
            )}
          </div>
        </Section>
      )}
      {r.abilities.reportProblem && (
      <Section title="Report a problem" testId="scan-problem">
        <NoteActionForm
          schema={reportProblemInput}
          field="note"
          label="What is wrong?"
          hint="A cracked cap, a leak, a missing or unreadable label… The safety officer is told."
          submitLabel="Send the report"
          testId="scan-problem-form"
          done="Reported. The safety officer has been told."
          onSubmit={(note) => action.mutateAsync({ kind: "problem", containerId: scan.id, note })}
        />
      </Section>
      )}
    </>
  );
}

const usageForm = z.object({
  amount: z.coerce.number({ message: "Give the amount you took" }).positive("Give an amount above zero"),
  unit: z.string().min(1, "Choose a unit"),
});

/** Log what was taken, or for a waste container what was poured in (the stockroom's /usage and /waste routes). */
function UsageForm({ containerId, defaultUnit, waste = false }: { containerId: number; defaultUnit: string; waste?: boolean }) {
  const action = useScanAction();
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const form = useForm({ resolver: zodResolver(usageForm), mode: "onTouched", defaultValues: { amount: "" as unknown as number, unit: defaultUnit } });
  const units = UNITS.includes(defaultUnit) ? UNITS : [defaultUnit, ...UNITS];
  const submit = form.handleSubmit(async (v) => {
    setError(null);
    setDone(null);
    try {
      await action.mutateAsync({ kind: waste ? "waste" : "usage", containerId, amount: v.amount, unit: v.unit });
      setDone(waste ? `Added ${v.amount} ${v.unit} to the waste.` : `Logged ${v.amount} ${v.unit}.`);
      form.reset({ amount: "" as unknown as number, unit: v.unit });
    } catch (e) {
      if (!applyServerFieldErrors(e, form.setError, ["amount", "unit"])) setError(actionError(e, waste ? "Adding to the waste" : "Logging a usage"));
    }
  });
  return (
    <Card title={waste ? "Add to this waste container" : "Log what you used"} bodyClassName="p-3">
      <form onSubmit={submit} noValidate className="flex flex-col gap-2" data-testid="scan-usage-form">
        {error && <Alert tone="danger">{error}</Alert>}
        {done && <Alert tone="ok">{done}</Alert>}
        <div className="flex items-start gap-2">
          <Input
            label="Amount"
            inputMode="decimal"
            fieldClassName="flex-1"
            error={form.formState.errors.amount?.message}
            data-testid="scan-usage-amount"
            {...form.register("amount")}
          />
          <Select label="Unit" fieldClassName="w-28" error={form.formState.errors.unit?.message} data-testid="scan-usage-unit" {...form.register("unit")}>
            {units.map((u) => (
              <option key={u} value={u}>
                {u}
              </option>
            ))}
          </Select>
        </div>
        <div>
          <Button type="submit" variant="primary" loading={form.formState.isSubmitting} data-testid="scan-usage-submit">
            {waste ? "Add to the waste" : "Log usage"}
          </Button>
        </div>
      </form>
    </Card>
  );
}

function MoveForm({ containerId, currentLocationId }: { containerId: number; currentLocationId: number | null }) {
  const locations = useLocationChoices();
  const action = useScanAction();
  const [to, setTo] = useState<string>("");
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  if (locations.isPending) return <p className="text-sm text-grey-600">Loading places…</p>;
  if (locations.isError) return <Alert tone="danger">{describeError(locations.error)}</Alert>;
  const move = async () => {
    setError(null);
    setDone(false);
    if (!to) {
      setError("Choose where it goes.");
      return;
    }
    try {
      await action.mutateAsync({ kind: "move", containerId, locationId: Number(to) });
      setDone(true);
    } catch (e) {
      setError(describeError(e));
    }
  };
  return (
    <div className="flex flex-col gap-2">
      {error && <Alert tone="danger">{error}</Alert>}
      {done && <Alert tone="ok">Moved.</Alert>}
      <Select label="New place" value={to} onChange={(e) => setTo(e.target.value)} data-testid="scan-move-select">
        <option value="">Choose…</option>
        {locations.data.map((l) => (
          <option key={l.id} value={l.id} disabled={l.id === currentLocationId}>
            {l.path}
          </option>
        ))}
      </Select>
      <div>
        <Button onClick={move} loading={action.isPending}>
          Move it here
        </Button>
      </div>
    </div>
  );
}

// --- instruments -------------------------------------------------------------------------------

function BookingLine({ label, booking }: { label: string; booking: ScanBookingDto | null }) {
  const action = useScanAction();
  const [error, setError] = useState<string | null>(null);
  if (!booking) {
    return (
      <p className="text-sm text-grey-700">
        <span className="text-grey-600">{label}:</span> none
      </p>
    );
  }
  const run = async (kind: "check-in" | "check-out") => {
    setError(null);
    try {
      await action.mutateAsync({ kind, bookingId: booking.id! });
    } catch (e) {
      setError(actionError(e, kind === "check-in" ? "Checking in" : "Checking out"));
    }
  };
  // What the server's booking policy lets this person do to it now.
  const canCheckIn = booking.id !== null && booking.abilities.checkIn;
  const canCheckOut = booking.id !== null && booking.abilities.checkOut;
  return (
    <div className="flex flex-col gap-1 text-sm">
      <p>
        <span className="text-grey-600">{label}:</span> {formatSpan(booking.start, booking.end)} ·{" "}
        {booking.mine ? "your booking" : (booking.who ?? "booked")} · {humanize(booking.status)}
      </p>
      {booking.checkedInAt && <p className="text-xs text-grey-600">Checked in {formatDateTime(booking.checkedInAt)}</p>}
      {error && <Alert tone="danger">{error}</Alert>}
      {(canCheckIn || canCheckOut) && (
        <div>
          <Button variant="primary" loading={action.isPending} onClick={() => run(canCheckIn ? "check-in" : "check-out")}>
            {canCheckIn ? "Check in" : "Check out"}
          </Button>
        </div>
      )}
    </div>
  );
}

function InstrumentView({ scan }: { scan: InstrumentScan }) {
  const r = scan.record;
  const action = useScanAction();
  return (
    <>
      <Card
        title={<span data-testid="scan-record-name">{r.name}</span>}
        description={INSTRUMENT_KIND_LABELS[r.kind as InstrumentKind] ?? humanize(r.kind)}
        actions={<Badge tone={STATUS_TONE[r.status] ?? "neutral"}>{humanize(r.status)}</Badge>}
      >
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
          <dt className="text-grey-600">Location</dt>
          <dd>{r.location ?? "Not recorded"}</dd>
          {r.kind === "interface_cell" && (
            <>
              <dt className="text-grey-600">Last cleaned</dt>
              <dd data-testid="scan-last-cleaned">{r.lastCleanedAt ? formatDateTime(r.lastCleanedAt) : "Not recorded"}</dd>
            </>
          )}
        </dl>
        {r.status === "under_maintenance" && (
          <Alert tone="warning" className="mt-2">Under maintenance: do not start a run until the manager puts it back in service.</Alert>
        )}
      </Card>
      <Card title="Bookings" bodyClassName="flex flex-col gap-2 p-3">
        <BookingLine label="Now" booking={r.currentBooking} />
        <BookingLine label="Next" booking={r.nextBooking} />
        {r.runPlans.length > 0 && (
          <ul className="border-t border-grey-100 pt-2 text-sm" data-testid="scan-run-plans">
            {r.runPlans.map((p) => (
              <li key={p.id}>
                Run plan: <Link to={paths.runPlan.getHref(p.id)}>{p.title}</Link>
                {p.heldReservations > 0 ? <span className="text-grey-600"> · stock reserved</span> : null}
              </li>
            ))}
          </ul>
        )}
      </Card>
      {r.abilities.recordCleaned && (
        <Section title="Record that it was cleaned" testId="scan-cleaned">
          <NoteActionForm
            schema={cleanedInput}
            field="note"
            label="Note (optional)"
            hint="How it was cleaned and dried, if it matters to the next person."
            submitLabel="Cleaned and dried"
            testId="scan-cleaned-form"
            done="Recorded."
            onSubmit={(note) => action.mutateAsync({ kind: "cleaned", instrumentId: scan.id, note })}
          />
        </Section>
      )}
      {r.openFaults.length > 0 && (
        <Card title="Faults reported" bodyClassName="p-3" data-testid="scan-open-faults">
          <ul className="flex flex-col gap-1 text-sm">
            {r.openFaults.map((f) => (
              <li key={f.id}>
                {formatDateTime(f.reportedAt)}
                {f.reportedBy ? ` · ${f.reportedBy}` : ""}: {f.note}
              </li>
            ))}
          </ul>
        </Card>
      )}
      {r.abilities.reportFault && (
        <Section title="Report a fault" testId="scan-fault">
          <NoteActionForm
            schema={reportFaultInput}
            field="note"
            label="What is wrong?"
            hint="The manager is e-mailed and decides whether it leaves service; the report shows here until it is dealt with."
            submitLabel="Report the fault"
            variant="danger"
            testId="scan-fault-form"
            done="Reported. The manager has been told."
            onSubmit={(note) => action.mutateAsync({ kind: "fault", instrumentId: scan.id, note })}
          />
        </Section>
      )}
    </>
  );
}
