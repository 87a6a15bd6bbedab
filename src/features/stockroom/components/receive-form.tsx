/**
 * Receiving a delivery: n containers of one chemical, size, lot, price and where they go, in one
 * form, with the chosen chemical's hazards and cautions beside it (a person unpacks and shelves it).
 */
import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { PRECEDENCE_CAUTION } from "@shared/domain/cautions";
import { CONTAINER_KIND_LABELS, STOCK_UNITS } from "@shared/schemas/stock";
import { receiptVolumeCheck } from "@shared/domain/storage";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { useChemicals } from "../api/get-chemicals";
import { useLocations } from "../api/get-locations";
import { useReceiveContainers } from "../api/receive-containers";
import { HandlingCautions } from "./hazard-panel";

const RECEIVED_KINDS = ["bottle", "vial", "waste"] as const;

const schema = z.object({
  chemicalId: z.coerce.number({ message: "Choose the chemical" }).int().positive("Choose the chemical"),
  count: z.coerce.number({ message: "Enter a whole number" }).int("Whole containers only").min(1, "At least one").max(100, "At most 100 per delivery"),
  quantity: z.coerce.number({ message: "Enter the size as a number" }).positive("The size must be above zero"),
  unit: z.enum(STOCK_UNITS),
  kind: z.enum(RECEIVED_KINDS),
  locationId: z.coerce.number().int().positive("Choose where they go"),
  supplier: z.string().max(200),
  lot: z.string().max(200),
  price: z.union([z.literal(""), z.coerce.number().min(0, "The price cannot be negative")]),
  expiresAt: z.union([z.literal(""), z.iso.date({ message: "Use a date" })]),
  allowUnknownVolume: z.boolean(),
});
type In = z.input<typeof schema>;
type Out = z.output<typeof schema>;

export function ReceiveForm({ chemicalId }: { chemicalId?: number }) {
  const chemicals = useChemicals({ limit: 500, sort: "name", dir: "asc" });
  const locations = useLocations();
  const receive = useReceiveContainers();
  const [done, setDone] = useState<string | null>(null);
  const form = useForm<In, unknown, Out>({
    resolver: zodResolver(schema),
    mode: "onChange",
    defaultValues: { chemicalId: chemicalId ?? "", count: 1, quantity: "", unit: "mL", kind: "bottle", locationId: "", supplier: "", lot: "", price: "", expiresAt: "", allowUnknownVolume: false } as unknown as In,
  });
  const err = form.formState.errors;
  const chosenId = Number(useWatch({ control: form.control, name: "chemicalId" }));
  const chosen = chemicals.data?.items.find((c) => c.id === chosenId);
  const unit = useWatch({ control: form.control, name: "unit" });
  const kind = useWatch({ control: form.control, name: "kind" });
  // A flammable liquid received by mass without a density cannot be counted by volume in the storage totals.
  const volume = chosen && kind !== "waste" ? receiptVolumeCheck(unit, chosen) : null;
  const onSubmit = form.handleSubmit(async (v) => {
    setDone(null);
    try {
      const made = await receive.mutateAsync({
        chemicalId: v.chemicalId,
        count: v.count,
        quantity: v.quantity,
        unit: v.unit,
        kind: v.kind,
        locationId: v.locationId,
        supplier: v.supplier,
        lot: v.lot,
        priceCents: v.price === "" ? null : Math.round(v.price * 100),
        expiresAt: v.expiresAt === "" ? null : v.expiresAt,
        allowUnknownVolume: v.allowUnknownVolume,
      });
      setDone(`Received ${made.length} container(s): ${made.map((c) => `#${c.id}`).join(", ")}. Print their labels from the label sheet.`);
    } catch (e) {
      applyServerFieldErrors(e, form.setError, ["chemicalId", "count", "quantity", "unit", "locationId", "expiresAt"]);
    }
  });
  return (
    <Card title="Delivery">
      <form onSubmit={onSubmit} noValidate className="flex max-w-2xl flex-col gap-3">
        <Select label="Chemical" required {...form.register("chemicalId")} error={err.chemicalId?.message}>
          <option value="">Choose…</option>
          {chemicals.data?.items.map((c) => <option key={c.id} value={c.id}>{c.name} ({c.casNumber})</option>)}
        </Select>
        <div className="grid grid-cols-3 gap-2">
          <Input label="Containers" required inputMode="numeric" {...form.register("count")} error={err.count?.message} />
          <Input label="Size of each" required inputMode="decimal" {...form.register("quantity")} error={err.quantity?.message} />
          <Select label="Unit" {...form.register("unit")} error={err.unit?.message}>{STOCK_UNITS.map((u) => <option key={u}>{u}</option>)}</Select>
        </div>
        {volume?.volumeUnknown && (
          <Alert tone="warning" srLabel="Volume unknown" data-testid="density-needed">
            <p>{volume.message}</p>
            <p className="mt-1">Enter its density on the chemical's record, or receive it by volume (mL or L).</p>
            <label className="mt-1 flex items-center gap-2 text-sm">
              <input type="checkbox" {...form.register("allowUnknownVolume")} data-testid="allow-unknown-volume" /> Receive it anyway: the storage totals will say its volume is unknown
            </label>
          </Alert>
        )}
        <Select label="Kind" {...form.register("kind")} hint="A waste container's size is its capacity; it starts empty." fieldClassName="w-60">
          {RECEIVED_KINDS.map((k) => <option key={k} value={k}>{CONTAINER_KIND_LABELS[k]}</option>)}
        </Select>
        {chosen && <HandlingCautions chemical={chosen} title={`Caution: ${chosen.name}`} />}
        <p className="text-xs text-grey-600">{PRECEDENCE_CAUTION}</p>
        <Select label="Location" required {...form.register("locationId")} error={err.locationId?.message}>
          <option value="">Choose…</option>
          {locations.data?.map((l) => <option key={l.id} value={l.id}>{l.path}</option>)}
        </Select>
        <div className="grid grid-cols-2 gap-2">
          <Input label="Supplier" {...form.register("supplier")} />
          <Input label="Supplier lot" {...form.register("lot")} />
          <Input label="Price per container" inputMode="decimal" {...form.register("price")} error={err.price?.message} />
          <Input label="Expiry date" type="date" {...form.register("expiresAt")} error={err.expiresAt?.message} />
        </div>
        {done && <Alert tone="ok">{done}</Alert>}
        {receive.isError && !Object.keys(err).length && <Alert tone="danger">{describeError(receive.error)}</Alert>}
        <div><Button type="submit" variant="primary" loading={form.formState.isSubmitting}>Receive</Button></div>
      </form>
    </Card>
  );
}
