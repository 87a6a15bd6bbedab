/**
 * The manager's form for an instrument's status and booking rules. Bookable hours are edited per
 * weekday as "08:00-12:00, 13:00-18:00" in the facility's local time; the server checks them
 * with the same rules as the Schedule and names the failing day.
 */
import { useState } from "react";
import { INSTRUMENT_STATUSES, INSTRUMENT_STATUS_LABELS, WEEKDAYS, type BookableHours, type InstrumentDto } from "@shared/schemas/instruments";
import { ApiError } from "@/lib/api-client";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Checkbox, Input, Select } from "@/components/ui/input";
import { useUpdateInstrument } from "../api/instrument";

const DAY_NAMES = { mon: "Monday", tue: "Tuesday", wed: "Wednesday", thu: "Thursday", fri: "Friday", sat: "Saturday", sun: "Sunday" } as const;

function hoursToText(h: BookableHours): Record<string, string> {
  return Object.fromEntries(WEEKDAYS.map((d) => [d, (h[d] ?? []).map((w) => `${w.from}-${w.to}`).join(", ")]));
}

function textToHours(t: Record<string, string>): BookableHours {
  const out: BookableHours = {};
  for (const d of WEEKDAYS) {
    const parts = (t[d] ?? "").split(",").map((s) => s.trim()).filter(Boolean);
    out[d] = parts.map((p) => {
      const [from = "", to = ""] = p.split(/\s*[-–]\s*/);
      return { from, to };
    });
  }
  return out;
}

export function InstrumentRulesForm({ instrument }: { instrument: InstrumentDto }) {
  const update = useUpdateInstrument(instrument.id);
  const [v, setV] = useState({
    status: instrument.status,
    statusNote: "",
    trainingRequired: instrument.trainingRequired,
    requiresApproval: instrument.requiresApproval,
    afterHoursAllowed: instrument.afterHoursAllowed,
    cleaningBufferMinutes: instrument.cleaningBufferMinutes,
    minLeadMinutes: instrument.minLeadMinutes,
    maxLengthMinutes: instrument.maxLengthMinutes,
    hours: hoursToText(instrument.bookableHours),
  });
  // Interface cells: what run plans compute with (area or radius, each phase's fill volume).
  const [cell, setCell] = useState({
    interfaceAreaCm2: instrument.interfaceAreaCm2?.toString() ?? "",
    interfaceRadiusCm: instrument.interfaceRadiusCm?.toString() ?? "",
    aqueousFillMl: instrument.aqueousFillMl?.toString() ?? "",
    organicFillMl: instrument.organicFillMl?.toString() ?? "",
  });
  const isCell = instrument.kind === "interface_cell";
  const [msg, setMsg] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});

  const save = async () => {
    setMsg(null);
    setFieldErrors({});
    try {
      const { hours, statusNote, ...rest } = v;
      const cellFields = isCell ? Object.fromEntries(Object.entries(cell).map(([k, t]) => [k, t.trim() === "" ? null : Number(t)])) : {};
      await update.mutateAsync({ ...rest, ...cellFields, bookableHours: textToHours(hours), ...(statusNote ? { statusNote } : {}) });
      setMsg({ tone: "ok", text: v.status !== instrument.status && v.status !== "in_service" ? "Saved. People with upcoming bookings have been told by e-mail." : "Saved." });
    } catch (e) {
      if (e instanceof ApiError) setFieldErrors(e.fieldErrors);
      setMsg({ tone: "danger", text: describeError(e) });
    }
  };

  const num = (key: "cleaningBufferMinutes" | "minLeadMinutes" | "maxLengthMinutes", label: string) => (
    <Input label={label} type="number" min={0} value={v[key]} onChange={(e) => setV({ ...v, [key]: Number(e.target.value) })} error={fieldErrors[key]} />
  );

  return (
    <div className="flex flex-col gap-3" data-testid="instrument-rules-form">
      <div className="grid gap-3 sm:grid-cols-2">
        <Select label="Status" value={v.status} onChange={(e) => setV({ ...v, status: e.target.value as InstrumentDto["status"] })}>
          {INSTRUMENT_STATUSES.map((s) => (
            <option key={s} value={s}>
              {INSTRUMENT_STATUS_LABELS[s]}
            </option>
          ))}
        </Select>
        <Input label="Note to people with bookings (on a status change)" value={v.statusNote} onChange={(e) => setV({ ...v, statusNote: e.target.value })} />
        {num("cleaningBufferMinutes", "Cleaning buffer after each session (minutes)")}
        {num("minLeadMinutes", "Minimum lead time (minutes)")}
        {num("maxLengthMinutes", "Longest booking (minutes)")}
      </div>
      {isCell && (
        <fieldset className="grid gap-3 sm:grid-cols-2" data-testid="cell-fields">
          <legend className="mb-1 text-xs font-medium text-grey-700">The cell, for run plans (empty: not recorded)</legend>
          {(
            [
              ["interfaceAreaCm2", "Interface area (cm²)"],
              ["interfaceRadiusCm", "Micro-interface radius (cm), e.g. 0.00125 for 12.5 µm"],
              ["aqueousFillMl", "Aqueous phase fill (mL)"],
              ["organicFillMl", "Organic phase fill (mL)"],
            ] as const
          ).map(([key, label]) => (
            <Input
              key={key}
              label={label}
              inputMode="decimal"
              value={cell[key]}
              onChange={(e) => setCell({ ...cell, [key]: e.target.value })}
              error={fieldErrors[key] ?? (cell[key].trim() !== "" && !(Number(cell[key]) > 0) ? "Enter a number above zero, or leave it empty" : undefined)}
            />
          ))}
        </fieldset>
      )}
      <div className="flex flex-wrap gap-4">
        <Checkbox label="Training required" checked={v.trainingRequired} onChange={(e) => setV({ ...v, trainingRequired: e.target.checked })} />
        <Checkbox label="Manager's approval required" checked={v.requiresApproval} onChange={(e) => setV({ ...v, requiresApproval: e.target.checked })} />
        <Checkbox label="After-hours use for endorsed people" checked={v.afterHoursAllowed} onChange={(e) => setV({ ...v, afterHoursAllowed: e.target.checked })} />
      </div>
      <fieldset className="grid gap-2 sm:grid-cols-2">
        <legend className="mb-1 text-xs font-medium text-grey-700">Bookable hours, facility time (e.g. 08:00-12:00, 13:00-18:00; empty: not bookable)</legend>
        {WEEKDAYS.map((d, i) => (
          <Input
            key={d}
            label={DAY_NAMES[d]}
            value={v.hours[d]}
            onChange={(e) => setV({ ...v, hours: { ...v.hours, [d]: e.target.value } })}
            error={Object.entries(fieldErrors).find(([k]) => k.startsWith(`bookableHours.${d}`))?.[1]}
            data-day={i}
          />
        ))}
      </fieldset>
      {msg && <Alert tone={msg.tone}>{msg.text}</Alert>}
      <div className="flex justify-end">
        <Button variant="primary" loading={update.isPending} onClick={save}>
          Save rules
        </Button>
      </div>
    </div>
  );
}
