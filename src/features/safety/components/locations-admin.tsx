/** Locations and their storage limits, kept by the safety office: add a place, change its limits, remove an empty one. */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { LOCATION_LEVELS, LOCATION_TYPES, LOCATION_TYPE_LABELS, type LocationDto } from "@shared/schemas/stock";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { humanize } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { TBody, THead, Table, TableMessage, Td, Th, Tr } from "@/components/ui/table";
import { useCreateLocation, useDeleteLocation, useLocationList, useUpdateLocation } from "../api/locations";

const litres = z.union([z.literal(""), z.coerce.number({ message: "Enter litres as a number" }).min(0, "A limit cannot be negative").max(1e6)]);
const schema = z.object({
  parentId: z.union([z.literal(""), z.coerce.number().int().positive()]),
  level: z.enum(LOCATION_LEVELS),
  name: z.string().trim().min(1, "Enter the name").max(200),
  type: z.enum(LOCATION_TYPES),
  flammableLimitLitres: litres,
  combustibleLimitLitres: litres,
  limitNote: z.string().max(1000),
});
type In = z.input<typeof schema>;
type Out = z.output<typeof schema>;
const orNull = (v: number | "") => (v === "" ? null : v);

function LimitRow({ l }: { l: LocationDto }) {
  const update = useUpdateLocation();
  const remove = useDeleteLocation();
  const [flam, setFlam] = useState(l.flammableLimitLitres?.toString() ?? "");
  const [comb, setComb] = useState(l.combustibleLimitLitres?.toString() ?? "");
  const [note, setNote] = useState(l.limitNote);
  const num = (s: string) => (s.trim() === "" ? null : Number(s));
  const bad = [flam, comb].some((s) => s.trim() !== "" && !(Number(s) >= 0));
  return (
    <Tr>
      <Td>{l.path}<span className="block text-xs text-grey-600">{humanize(l.level)} · {LOCATION_TYPE_LABELS[l.type]}</span></Td>
      <Td><input aria-label={`Flammable limit of ${l.name} in litres`} className="h-7 w-20 rounded border border-grey-300 px-1 text-right font-mono text-xs" value={flam} onChange={(e) => setFlam(e.target.value)} /></Td>
      <Td><input aria-label={`Combustible limit of ${l.name} in litres`} className="h-7 w-20 rounded border border-grey-300 px-1 text-right font-mono text-xs" value={comb} onChange={(e) => setComb(e.target.value)} /></Td>
      <Td><input aria-label={`Where the limit of ${l.name} comes from`} className="h-7 w-full min-w-48 rounded border border-grey-300 px-1 text-xs" value={note} onChange={(e) => setNote(e.target.value)} /></Td>
      <Td className="whitespace-nowrap">
        <Button size="sm" disabled={bad} loading={update.isPending} onClick={() => update.mutate({ id: l.id, flammableLimitLitres: num(flam), combustibleLimitLitres: num(comb), limitNote: note })}>Save</Button>{" "}
        <Button size="sm" variant="ghost" loading={remove.isPending} onClick={() => remove.mutate(l.id)}>Remove</Button>
        {bad && <p className="text-xs text-danger-700">Limits are litres, zero or more.</p>}
        {(update.error || remove.error) && <p className="text-xs text-danger-700">{describeError(update.error ?? remove.error)}</p>}
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
    defaultValues: { parentId: "", level: "cabinet", name: "", type: "flammable_cabinet", flammableLimitLitres: "", combustibleLimitLitres: "", limitNote: "" },
  });
  const err = form.formState.errors;
  const onSubmit = form.handleSubmit(async (v) => {
    try {
      await create.mutateAsync({ ...v, parentId: v.parentId === "" ? null : v.parentId, flammableLimitLitres: orNull(v.flammableLimitLitres), combustibleLimitLitres: orNull(v.combustibleLimitLitres) });
      form.reset();
    } catch (e) {
      applyServerFieldErrors(e, form.setError, ["parentId", "level", "name", "type", "flammableLimitLitres", "combustibleLimitLitres"]);
    }
  });
  return (
    <div className="flex flex-col gap-4">
      <Alert tone="warning">
        Enter the limits your local fire code and safety office set. The demo's limits are examples only (OSHA 29 CFR 1910.106 cabinet quantities, an NFPA 45-style laboratory limit).
      </Alert>
      <Table caption="Locations and their limits">
        <THead>
          <tr><Th>Location</Th><Th>Flammable limit (L, cat. 1–3)</Th><Th>Combustible limit (L, cat. 4)</Th><Th>Source of the limit</Th><Th /></tr>
        </THead>
        <TBody>
          {list.isPending && <TableMessage colSpan={5}>Loading…</TableMessage>}
          {list.data?.map((l) => <LimitRow key={`${l.id}-${l.flammableLimitLitres}-${l.combustibleLimitLitres}-${l.limitNote}`} l={l} />)}
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
          <Input label="Flammable limit (L)" inputMode="decimal" {...form.register("flammableLimitLitres")} error={err.flammableLimitLitres?.message} />
          <Input label="Combustible limit (L)" inputMode="decimal" {...form.register("combustibleLimitLitres")} error={err.combustibleLimitLitres?.message} />
          <Input label="Source of the limit" {...form.register("limitNote")} fieldClassName="col-span-2" />
          {create.isError && !Object.keys(err).length && <Alert tone="danger" className="col-span-2">{describeError(create.error)}</Alert>}
          <div><Button type="submit" variant="primary" loading={form.formState.isSubmitting}>Add</Button></div>
        </form>
      </Card>
    </div>
  );
}
