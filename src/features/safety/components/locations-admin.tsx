/** Locations and their storage limits by liquid class, kept by the safety office: add a place, set its limits (L or US gal), remove an empty one. */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { LOCATION_LEVELS, LOCATION_TYPES, LOCATION_TYPE_LABELS, type LocationDto, type LocationLimitDto } from "@shared/schemas/stock";
import { NFPA_CLASSES } from "@shared/domain/storage";
import { storageLimitInput } from "@shared/schemas/storage";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { humanize } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { TBody, THead, Table, TableMessage, Td, Th, Tr } from "@/components/ui/table";
import { useAddLimit, useCreateLocation, useDeleteLocation, useLocationList, useRemoveLimit, useReplaceLimit, useUpdateLocation } from "../api/locations";

const schema = z.object({
  parentId: z.union([z.literal(""), z.coerce.number().int().positive()]),
  level: z.enum(LOCATION_LEVELS),
  name: z.string().trim().min(1, "Enter the name").max(200),
  type: z.enum(LOCATION_TYPES),
  limitNote: z.string().max(1000),
});
type In = z.input<typeof schema>;
type Out = z.output<typeof schema>;

/** The limit form's own view of storageLimitInput: the volume is typed text until it parses. */
const limitForm = storageLimitInput.extend({ maxVolume: z.coerce.number({ message: "Enter the largest volume as a number" }).positive("The largest volume must be above zero").max(1e6) });
type LimitIn = z.input<typeof limitForm>;
type LimitOut = z.output<typeof limitForm>;

function LimitEditor({ location, limit, onDone }: { location: LocationDto; limit?: LocationLimitDto; onDone?: () => void }) {
  const add = useAddLimit();
  const replace = useReplaceLimit();
  const form = useForm<LimitIn, unknown, LimitOut>({
    resolver: zodResolver(limitForm),
    mode: "onChange",
    defaultValues: limit
      ? { classes: limit.classes, maxVolume: limit.enteredVolume, unit: limit.enteredUnit, includesCabinets: limit.includesCabinets, note: limit.note }
      : { classes: ["IA", "IB", "IC"], maxVolume: "" as unknown as number, unit: "L", includesCabinets: true, note: "" },
  });
  const err = form.formState.errors;
  const submit = form.handleSubmit(async (v) => {
    try {
      if (limit) await replace.mutateAsync({ locationId: location.id, limitId: limit.id, ...v });
      else await add.mutateAsync({ locationId: location.id, ...v });
      if (!limit) form.reset();
      onDone?.();
    } catch (e) {
      applyServerFieldErrors(e, form.setError, ["classes", "maxVolume", "unit", "includesCabinets", "note"]);
    }
  });
  const failure = add.error ?? replace.error;
  return (
    <form onSubmit={submit} noValidate className="flex flex-wrap items-end gap-2 rounded border border-grey-200 p-2" aria-label={limit ? `Change the limit of ${location.name}` : `Add a limit to ${location.name}`}>
      <fieldset className="flex flex-wrap gap-2 text-xs">
        <legend className="mb-1 text-xs font-medium">Liquid classes counted together</legend>
        {NFPA_CLASSES.map((c) => (
          <label key={c} className="flex items-center gap-1">
            <input type="checkbox" value={c} {...form.register("classes")} /> {c}
          </label>
        ))}
        {err.classes && <p className="w-full text-danger-700">{err.classes.message}</p>}
      </fieldset>
      <Input label="Largest volume" inputMode="decimal" fieldClassName="w-28" {...form.register("maxVolume")} error={err.maxVolume?.message} />
      <Select label="Unit" fieldClassName="w-24" {...form.register("unit")}>
        <option value="L">L</option>
        <option value="US gal">US gal</option>
      </Select>
      <label className="flex items-center gap-1 text-xs">
        <input type="checkbox" {...form.register("includesCabinets")} /> Approved cabinets inside count
      </label>
      <Input label="Source of the limit" fieldClassName="min-w-56 flex-1" {...form.register("note")} error={err.note?.message} />
      <Button type="submit" size="sm" variant="primary" loading={form.formState.isSubmitting}>
        {limit ? "Save limit" : "Add limit"}
      </Button>
      {failure && !Object.keys(err).length && <p className="w-full text-xs text-danger-700">{describeError(failure)}</p>}
    </form>
  );
}

function LocationRow({ l }: { l: LocationDto }) {
  const update = useUpdateLocation();
  const remove = useDeleteLocation();
  const removeLimit = useRemoveLimit();
  const [note, setNote] = useState(l.limitNote);
  const [editing, setEditing] = useState<number | "new" | null>(null);
  return (
    <Tr>
      <Td>
        {l.path}
        <span className="block text-xs text-grey-600">
          {humanize(l.level)} · {LOCATION_TYPE_LABELS[l.type]}
        </span>
      </Td>
      <Td>
        <ul className="flex flex-col gap-1 text-xs">
          {l.limits.map((x) =>
            editing === x.id ? (
              <li key={x.id}>
                <LimitEditor location={l} limit={x} onDone={() => setEditing(null)} />
              </li>
            ) : (
              <li key={x.id}>
                Class {x.classes.join(" + ")}: {x.enteredVolume} {x.enteredUnit}
                {x.enteredUnit === "US gal" && ` (${x.maxLitres.toFixed(2)} L)`}
                {x.includesCabinets ? "" : ", outside approved cabinets"}
                {x.note && <span className="text-grey-600"> · {x.note}</span>}{" "}
                <Button size="sm" variant="ghost" onClick={() => setEditing(x.id)}>
                  Change
                </Button>
                <Button size="sm" variant="ghost" loading={removeLimit.isPending} onClick={() => removeLimit.mutate({ locationId: l.id, limitId: x.id })}>
                  Remove
                </Button>
              </li>
            ),
          )}
          {editing === "new" ? (
            <li>
              <LimitEditor location={l} onDone={() => setEditing(null)} />
            </li>
          ) : (
            <li>
              <Button size="sm" onClick={() => setEditing("new")}>
                Add a limit
              </Button>
            </li>
          )}
        </ul>
      </Td>
      <Td>
        <input aria-label={`Where the limits of ${l.name} come from`} className="h-7 w-full min-w-48 rounded border border-grey-300 px-1 text-xs" value={note} onChange={(e) => setNote(e.target.value)} />
      </Td>
      <Td className="whitespace-nowrap">
        <Button size="sm" loading={update.isPending} onClick={() => update.mutate({ id: l.id, limitNote: note })}>
          Save note
        </Button>{" "}
        <Button size="sm" variant="ghost" loading={remove.isPending} onClick={() => remove.mutate(l.id)}>
          Remove place
        </Button>
        {(update.error || remove.error || removeLimit.error) && <p className="text-xs text-danger-700">{describeError(update.error ?? remove.error ?? removeLimit.error)}</p>}
      </Td>
    </Tr>
  );
}

export function LocationsAdmin() {
  const list = useLocationList();
  const create = useCreateLocation();
  const form = useForm<In, unknown, Out>({
    resolver: zodResolver(schema),
    mode: "onChange",
    defaultValues: { parentId: "", level: "cabinet", name: "", type: "flammable_cabinet", limitNote: "" },
  });
  const err = form.formState.errors;
  const onSubmit = form.handleSubmit(async (v) => {
    try {
      await create.mutateAsync({ ...v, parentId: v.parentId === "" ? null : v.parentId });
      form.reset();
    } catch (e) {
      applyServerFieldErrors(e, form.setError, ["parentId", "level", "name", "type"]);
    }
  });
  return (
    <div className="flex flex-col gap-4">
      <Alert tone="warning">
        Enter the limits your local fire code and safety office set, by liquid class (NFPA 30: IA, IB, IC, II, IIIA, IIIB) or groups of classes, in litres or US gallons. The demo's limits are examples only (OSHA 29 CFR 1910.106 cabinet quantities, an NFPA 45-style laboratory limit, a class IA limit).
      </Alert>
      <Table caption="Locations and their limits">
        <THead>
          <tr><Th>Location</Th><Th>Limits by liquid class</Th><Th>Source of the limits</Th><Th /></tr>
        </THead>
        <TBody>
          {list.isPending && <TableMessage colSpan={4}>Loading…</TableMessage>}
          {list.data?.map((l) => <LocationRow key={`${l.id}-${l.limitNote}`} l={l} />)}
        </TBody>
      </Table>
      <Card title="Add a location">
        <form onSubmit={onSubmit} noValidate className="grid max-w-3xl grid-cols-2 gap-2">
          <Select label="Inside" {...form.register("parentId")} error={err.parentId?.message}>
            <option value="">(top level: a building)</option>
            {list.data?.map((l) => <option key={l.id} value={l.id}>{l.path}</option>)}
          </Select>
          <Input label="Name" required {...form.register("name")} error={err.name?.message} />
          <Select label="Level" {...form.register("level")}>{LOCATION_LEVELS.map((l) => <option key={l} value={l}>{humanize(l)}</option>)}</Select>
          <Select label="Type" {...form.register("type")}>{LOCATION_TYPES.map((t) => <option key={t} value={t}>{LOCATION_TYPE_LABELS[t]}</option>)}</Select>
          <Input label="Source of its limits" {...form.register("limitNote")} fieldClassName="col-span-2" />
          {create.isError && !Object.keys(err).length && <Alert tone="danger" className="col-span-2">{describeError(create.error)}</Alert>}
          <div><Button type="submit" variant="primary" loading={form.formState.isSubmitting}>Add</Button></div>
        </form>
      </Card>
    </div>
  );
}
