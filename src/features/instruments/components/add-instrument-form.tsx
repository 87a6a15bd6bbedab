/**
 * The manager adds an instrument. Rules start on the cautious side (training required) and the
 * bookable hours start as weekday office hours in the facility's zone; both are edited on the
 * instrument's page afterwards. Validated with the shared instrumentInput schema.
 */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { INSTRUMENT_KINDS, INSTRUMENT_KIND_LABELS, instrumentInput, type InstrumentDto } from "@shared/schemas/instruments";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Checkbox, Input, Select } from "@/components/ui/input";
import { useCreateInstrument } from "../api/create-instrument";

const OFFICE = [{ from: "08:00", to: "18:00" }];
const WEEKDAY_OFFICE_HOURS = { mon: OFFICE, tue: OFFICE, wed: OFFICE, thu: OFFICE, fri: OFFICE };

const FIELDS = [
  "name",
  "kind",
  "model",
  "serialNumber",
  "description",
  "interfaceAreaCm2",
  "cleaningBufferMinutes",
  "minLeadMinutes",
  "maxLengthMinutes",
] as const;

export function AddInstrumentForm({ onAdded, onCancel }: { onAdded: (i: InstrumentDto) => void; onCancel: () => void }) {
  const create = useCreateInstrument();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, watch, formState } = useForm({
    resolver: zodResolver(instrumentInput),
    mode: "onTouched",
    defaultValues: {
      name: "",
      kind: "potentiostat" as const,
      model: "",
      serialNumber: "",
      description: "",
      fourElectrode: false,
      interfaceAreaCm2: null,
      trainingRequired: true,
      requiresApproval: false,
      afterHoursAllowed: false,
      cleaningBufferMinutes: 0,
      minLeadMinutes: 0,
      maxLengthMinutes: 480,
      bookableHours: WEEKDAY_OFFICE_HOURS,
    },
  });
  const errors = formState.errors;
  const kind = watch("kind");

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      onAdded(await create.mutateAsync(values));
    } catch (e) {
      if (!applyServerFieldErrors(e, setError, FIELDS)) setFormError(describeError(e));
    }
  });

  const minutes = (name: "cleaningBufferMinutes" | "minLeadMinutes" | "maxLengthMinutes", label: string, hint?: string) => (
    <Input label={label} type="number" min={0} {...register(name, { valueAsNumber: true })} error={errors[name]?.message} hint={hint} />
  );

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3" data-testid="add-instrument-form" noValidate>
      <div className="grid gap-3 sm:grid-cols-2">
        <Input label="Name" {...register("name")} error={errors.name?.message} required data-testid="instrument-name" />
        <Select label="Kind" {...register("kind")} error={errors.kind?.message} data-testid="instrument-kind">
          {INSTRUMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {INSTRUMENT_KIND_LABELS[k]}
            </option>
          ))}
        </Select>
        <Input label="Model" {...register("model")} error={errors.model?.message} />
        <Input label="Serial number" {...register("serialNumber")} error={errors.serialNumber?.message} />
        {kind === "interface_cell" && (
          <Input
            label="Interfacial area (cm²)"
            type="number"
            step="any"
            min={0}
            {...register("interfaceAreaCm2", { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v)) })}
            error={errors.interfaceAreaCm2?.message}
          />
        )}
        {minutes("cleaningBufferMinutes", "Cleaning buffer after each session (minutes)", kind === "interface_cell" ? "Cells are cleaned and dried between users." : undefined)}
        {minutes("minLeadMinutes", "Minimum lead time (minutes)")}
        {minutes("maxLengthMinutes", "Longest booking (minutes)")}
      </div>
      <Input label="Description" {...register("description")} error={errors.description?.message} />
      <div className="flex flex-wrap gap-4">
        {kind === "potentiostat" && <Checkbox label="Four-electrode capable" {...register("fourElectrode")} />}
        <Checkbox label="Training required" {...register("trainingRequired")} />
        <Checkbox label="Manager's approval required" {...register("requiresApproval")} />
        <Checkbox label="After-hours use for endorsed people" {...register("afterHoursAllowed")} />
      </div>
      <p className="text-xs text-grey-600">Bookable Monday to Friday, 08:00–18:00 facility time, to start with; change the hours on the instrument's page.</p>
      {formError && <Alert tone="danger">{formError}</Alert>}
      <div className="flex justify-end gap-2">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" loading={create.isPending} data-testid="instrument-add-submit">
          Add instrument
        </Button>
      </div>
    </form>
  );
}
