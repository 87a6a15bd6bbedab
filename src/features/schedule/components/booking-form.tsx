/**
 * The booking form, opened by selecting a free range on the Schedule: instruments or a setup,
 * the account, the purpose and an optional weekly repeat. It validates with the shared schema;
 * the server re-checks everything and its field errors land on the fields, and a series that
 * fails lists each failing session. Start and end are typed on the facility's clock and sent
 * with that zone's offset for the chosen day, whatever the browser's own zone. On the night the
 * clocks go back the repeated hour happens twice, and the person says which; a time in the hour
 * skipped when they go forward is refused next to the field.
 */
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { InstrumentDto } from "@shared/schemas/instruments";
import type { OccurrenceProblem } from "@shared/schemas/bookings";
import { resolveWallClock, toZonedInput, zoneShortName } from "@shared/domain/facility-time";
import { ApiError } from "@/lib/api-client";
import { describeError } from "@/lib/forms";
import { formatSpan } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/input";
import { FieldSet } from "@/components/ui/field";
import { useCreateBooking } from "../api/booking-actions";
import { useAccounts, useSetups } from "../api/get-schedule-data";

type TimeField = "start" | "end";

/** The choice matching a known instant when its wall-clock time is ambiguous (a range picked on the calendar). */
function pickFor(value: string, zone: string, at: Date): string | null {
  const r = resolveWallClock(value, zone);
  return r.kind === "ambiguous" ? (r.choices.find((c) => new Date(c.iso).getTime() === at.getTime())?.iso ?? null) : null;
}

/** A wall-clock input on the facility's clock; in the repeated hour, a radio pair says which of the two. */
function WallClockInput({
  label,
  value,
  zone,
  picked,
  error,
  testId,
  onChange,
  onPick,
}: {
  label: string;
  value: string;
  zone: string;
  picked: string | null;
  error?: string;
  testId: string;
  onChange: (value: string) => void;
  onPick: (iso: string) => void;
}) {
  const r = value ? resolveWallClock(value, zone) : null;
  return (
    <div className="flex flex-col gap-2">
      <Input label={label} type="datetime-local" value={value} onChange={(e) => onChange(e.target.value)} required error={r?.kind === "skipped" ? r.message : r?.kind === "ambiguous" ? undefined : error} data-testid={testId} />
      {r?.kind === "ambiguous" && (
        <FieldSet legend={r.message} id={`${testId}-which`} error={error}>
          <div className="flex flex-col gap-1 text-sm">
            {r.choices.map((c) => (
              <label key={c.iso} className="flex items-center gap-1.5">
                <input type="radio" name={`${testId}-which`} value={c.iso} checked={picked === c.iso} onChange={() => onPick(c.iso)} data-testid={`${testId}-choice`} /> {c.label}
              </label>
            ))}
          </div>
        </FieldSet>
      )}
    </div>
  );
}

interface Values {
  mode: "instruments" | "setup";
  instrumentIds: string[];
  setupId: string;
  accountId: string;
  purpose: string;
  repeatWeeks: number;
}

export function BookingForm({
  start,
  end,
  instruments,
  zone,
  preselected,
  onDone,
  onCancel,
}: {
  start: Date;
  end: Date;
  instruments: InstrumentDto[];
  zone: string;
  preselected: number[];
  onDone: (message: string) => void;
  onCancel: () => void;
}) {
  const accounts = useAccounts();
  const setups = useSetups();
  const create = useCreateBooking();
  const [times, setTimes] = useState({ start: toZonedInput(start, zone), end: toZonedInput(end, zone) });
  const [picked, setPicked] = useState<Record<TimeField, string | null>>(() => ({
    start: pickFor(toZonedInput(start, zone), zone, start),
    end: pickFor(toZonedInput(end, zone), zone, end),
  }));
  const [timeErrors, setTimeErrors] = useState<Partial<Record<TimeField, string>>>({});
  const [problems, setProblems] = useState<OccurrenceProblem[]>([]);
  const [general, setGeneral] = useState<string | null>(null);
  const chargeable = (accounts.data ?? []).filter((a) => a.chargeable);
  const form = useForm<Values>({
    defaultValues: { mode: "instruments", instrumentIds: preselected.map(String), setupId: "", accountId: "", purpose: "", repeatWeeks: 1 },
  });
  const { register, handleSubmit, watch, formState, setError } = form;
  const mode = watch("mode");
  const bookable = instruments.filter((i) => i.status === "in_service");

  const submit = handleSubmit(async (v) => {
    setProblems([]);
    setGeneral(null);
    const accountId = Number(v.accountId || chargeable[0]?.id);
    if (!accountId) {
      setError("accountId", { message: "Choose an account to charge" });
      return;
    }
    // Each time as one instant: exact, or the reading the person picked in the repeated hour.
    const errors: Partial<Record<TimeField, string>> = {};
    const isoOf = (field: TimeField): string | null => {
      const r = resolveWallClock(times[field], zone);
      if (r.kind === "exact") return r.iso;
      if (r.kind === "ambiguous") {
        if (r.choices.some((c) => c.iso === picked[field])) return picked[field];
        errors[field] = `Choose which ${times[field].slice(11, 16)} you mean.`;
      } else if (r.kind === "invalid") errors[field] = times[field] ? r.message : "Give a date and a time.";
      return null; // a skipped time already shows its sentence under the field
    };
    const startIso = isoOf("start");
    const endIso = isoOf("end");
    setTimeErrors(errors);
    if (!startIso || !endIso) {
      setGeneral("Give a start and an end date and time that exist on the facility's clock.");
      return;
    }
    try {
      const r = await create.mutateAsync({
        ...(v.mode === "setup" ? { setupId: Number(v.setupId) } : { instrumentIds: v.instrumentIds.map(Number) }),
        start: startIso,
        end: endIso,
        accountId,
        purpose: v.purpose,
        repeatWeeks: Number(v.repeatWeeks) || 1,
      });
      const n = r.bookings.length;
      onDone(
        r.booking.status === "requested"
          ? `Request sent${n > 1 ? ` for ${n} weekly sessions` : ""}: it waits for the facility manager's approval.`
          : `Booked${n > 1 ? ` ${n} weekly sessions` : ""}: confirmed.`,
      );
    } catch (e) {
      if (e instanceof ApiError) {
        const occ = (e.problem as { occurrences?: OccurrenceProblem[] }).occurrences;
        if (occ) setProblems(occ);
        for (const [path, message] of Object.entries(e.fieldErrors)) {
          if (path === "accountId" || path === "purpose") setError(path, { message });
        }
      }
      setGeneral(describeError(e));
    }
  });

  return (
    <form onSubmit={submit} className="flex flex-col gap-3" data-testid="booking-form" noValidate>
      <div className="grid gap-3 sm:grid-cols-2">
        {(["start", "end"] as const).map((field) => (
          <WallClockInput
            key={field}
            label={field === "start" ? "Start" : "End"}
            value={times[field]}
            zone={zone}
            picked={picked[field]}
            error={timeErrors[field]}
            testId={`booking-${field}`}
            onChange={(value) => {
              setTimes((t) => ({ ...t, [field]: value }));
              setPicked((p) => ({ ...p, [field]: null }));
              setTimeErrors((e) => ({ ...e, [field]: undefined }));
            }}
            onPick={(iso) => {
              setPicked((p) => ({ ...p, [field]: iso }));
              setTimeErrors((e) => ({ ...e, [field]: undefined }));
            }}
          />
        ))}
      </div>
      <p className="text-xs text-grey-600" data-testid="booking-zone">
        Times are the facility's local time ({zone.replace(/_/g, " ")}, {zoneShortName(start, zone)}), the same clock as the instruments' bookable hours.
      </p>

      <FieldSet legend="What to book" id="booking-mode">
        <div className="flex gap-4 text-sm">
          <label className="flex items-center gap-1.5">
            <input type="radio" value="instruments" {...register("mode")} /> Instruments
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" value="setup" {...register("mode")} disabled={(setups.data ?? []).length === 0} /> A setup
          </label>
        </div>
      </FieldSet>

      {mode === "instruments" ? (
        <FieldSet legend="Instruments (booked together or not at all)" id="booking-instruments" error={formState.errors.instrumentIds?.message}>
          <div className="grid max-h-40 gap-1 overflow-y-auto rounded border border-grey-200 p-2 sm:grid-cols-2">
            {bookable.map((i) => (
              <label key={i.id} className="flex items-center gap-1.5 text-sm">
                <input type="checkbox" value={String(i.id)} {...register("instrumentIds", { validate: (v) => v.length > 0 || "Choose at least one instrument" })} />
                {i.name}
              </label>
            ))}
          </div>
        </FieldSet>
      ) : (
        <Select label="Setup" {...register("setupId", { required: "Choose a setup" })} error={formState.errors.setupId?.message} data-testid="booking-setup">
          <option value="">Choose…</option>
          {(setups.data ?? []).map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </Select>
      )}

      <Select label="Account to charge" {...register("accountId")} error={formState.errors.accountId?.message} data-testid="booking-account" required>
        {chargeable.length === 0 && <option value="">You may not charge any account yet: ask your group leader</option>}
        {chargeable.map((a) => (
          <option key={a.id} value={a.id}>
            {a.code} – {a.name}
          </option>
        ))}
      </Select>
      <Input label="Purpose" {...register("purpose", { maxLength: { value: 500, message: "Keep it under 500 characters" } })} error={formState.errors.purpose?.message} placeholder="e.g. TBA⁺ transfer across water | DCE" data-testid="booking-purpose" />
      <Input
        label="Repeat weekly, sessions in all"
        type="number"
        min={1}
        max={104}
        {...register("repeatWeeks", { valueAsNumber: true, min: { value: 1, message: "At least 1" }, max: { value: 104, message: "At most 104 (two years)" } })}
        error={formState.errors.repeatWeeks?.message}
        hint="1 books this session only. A series is booked whole or not at all."
      />

      {general && (
        <Alert tone="danger">
          <p>{general}</p>
          {problems.length > 0 && (
            <ul className="mt-1 list-disc pl-5" data-testid="series-problems">
              {problems.map((p) => (
                <li key={p.index}>
                  Session {p.index + 1}, {formatSpan(p.start, p.end, zone)}: {p.reasons.map((r) => r.message).join("; ")}
                </li>
              ))}
            </ul>
          )}
        </Alert>
      )}
      <div className="flex justify-end gap-2">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" loading={create.isPending} data-testid="booking-submit">
          Book
        </Button>
      </div>
    </form>
  );
}
