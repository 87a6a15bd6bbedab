/**
 * Quick actions on a container at the bench: log what was used (any compatible unit; the
 * server converts through density and molar mass and refuses over-draws) or, for a waste
 * container, what was poured in (refused beyond its capacity), move it, hold or
 * release it (safety office, manager), mark it empty. Server errors land beside their field.
 */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { STOCK_UNITS, type ContainerDto } from "@shared/schemas/stock";
import { hasRole, useUser } from "@/lib/auth";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { useAddWaste, useEmptyContainer, useHoldContainer, useLogUsage, useMoveContainer, useReleaseContainer } from "../api/container-actions";
import { useLocations } from "../api/get-locations";
import { formatQuantity } from "./stock-format";
import { BENCH_ROLES } from "@shared/schemas/auth";

const usageForm = z.object({
  amount: z.coerce.number({ message: "Enter the amount as a number" }).positive("Enter an amount above zero").max(1e9, "That amount is too large"),
  unit: z.string().min(1, "Choose a unit"),
  note: z.string().max(500).optional(),
});

function UsageForm({ container, waste = false }: { container: ContainerDto; waste?: boolean }) {
  const used = useLogUsage(container.id);
  const poured = useAddWaste(container.id);
  const logUsage = waste ? poured : used;
  const [done, setDone] = useState<string | null>(null);
  const form = useForm<z.input<typeof usageForm>, unknown, z.output<typeof usageForm>>({
    resolver: zodResolver(usageForm),
    mode: "onChange",
    defaultValues: { amount: "" as unknown as number, unit: container.unit, note: "" },
  });
  const onSubmit = form.handleSubmit(async (v) => {
    setDone(null);
    try {
      const after = await logUsage.mutateAsync(v);
      setDone(
        waste
          ? `Added ${v.amount} ${v.unit}; it now holds ${formatQuantity(after.quantity, after.unit)} of ${formatQuantity(after.initialQuantity, after.unit)}.`
          : `Logged ${v.amount} ${v.unit}; ${formatQuantity(after.quantity, after.unit)} left.`,
      );
      form.reset({ amount: "" as unknown as number, unit: v.unit, note: "" });
    } catch (e) {
      applyServerFieldErrors(e, form.setError, ["amount", "unit"]);
    }
  });
  const general = logUsage.error && !Object.keys((logUsage.error as { fieldErrors?: object }).fieldErrors ?? {}).length ? describeError(logUsage.error) : null;
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-2" noValidate data-testid={waste ? "waste-form" : "usage-form"}>
      <div className="flex flex-wrap items-start gap-2">
        <Input label={waste ? "Amount poured in" : "Amount used"} inputMode="decimal" {...form.register("amount")} error={form.formState.errors.amount?.message} fieldClassName="w-32" />
        <Select label="Unit" {...form.register("unit")} error={form.formState.errors.unit?.message} fieldClassName="w-24">
          {STOCK_UNITS.map((u) => (
            <option key={u} value={u}>{u}</option>
          ))}
        </Select>
        <Input label="Note" {...form.register("note")} fieldClassName="min-w-40 flex-1" />
      </div>
      <div className="flex items-center gap-2">
        <Button type="submit" variant="primary" loading={form.formState.isSubmitting}>{waste ? "Add to the waste" : "Log usage"}</Button>
        <span className="text-xs text-grey-600">Mass, volume or amount of substance; Phasebook converts to {container.unit}.</span>
      </div>
      {done && <Alert tone="ok">{done}</Alert>}
      {general && <Alert tone="danger">{general}</Alert>}
    </form>
  );
}

export function ContainerActions({ container }: { container: ContainerDto }) {
  const { data: user } = useUser();
  const may = container.abilities;
  const locations = useLocations();
  const move = useMoveContainer(container.id);
  const hold = useHoldContainer(container.id);
  const release = useReleaseContainer(container.id);
  const empty = useEmptyContainer(container.id);
  const [target, setTarget] = useState("");
  const [reason, setReason] = useState("");
  const atBench = hasRole(user, ...BENCH_ROLES);
  const error = move.error ?? hold.error ?? release.error ?? empty.error;

  return (
    <Card title="Actions">
      <div className="flex flex-col gap-4">
        {may.draw && !atBench ? (
          <p className="text-sm text-grey-600">Usage is logged by the people who work at the bench (members, the manager, the safety officer).</p>
        ) : may.draw ? (
          <UsageForm container={container} />
        ) : may.pourWaste ? (
          <UsageForm container={container} waste />
        ) : (
          <Alert tone="warning">
            {container.chemicalHoldReason
              ? `The chemical is on hold: ${container.chemicalHoldReason}`
              : container.status === "on_hold"
                ? `On hold: ${container.holdReason ?? "no reason given"}. Nothing may be taken until the safety office releases it.`
                : container.status === "empty" || container.status === "disposed"
                  ? `This container is ${container.status === "empty" ? "empty" : "disposed of"}.`
                  : container.kind === "waste"
                    ? "A waste container: only its owners pour into it."
                    : "This container belongs to another research group or organisation: its owners, the manager and the safety officer use it."}
          </Alert>
        )}
        {(may.move || may.markEmpty) && (
          <div className="flex flex-wrap items-end gap-2">
            {may.move && (
            <>
            <Select label="Move to" value={target} onChange={(e) => setTarget(e.target.value)} fieldClassName="w-80">
              <option value="">Choose a location…</option>
              {locations.data?.filter((l) => l.id !== container.locationId).map((l) => (
                <option key={l.id} value={l.id}>{l.path}</option>
              ))}
            </Select>
            <Button disabled={!target} loading={move.isPending} onClick={() => move.mutate({ locationId: Number(target) }, { onSuccess: () => setTarget("") })}>
              Move
            </Button>
            </>
            )}
            {may.markEmpty && (
              <Button variant="ghost" loading={empty.isPending} onClick={() => empty.mutate(undefined)}>Mark empty</Button>
            )}
          </div>
        )}
        {(may.hold || may.release) && (
          <div className="flex flex-wrap items-end gap-2">
            {may.release ? (
              <Button loading={release.isPending} onClick={() => release.mutate(undefined)}>Release hold</Button>
            ) : (
              <>
                <Input label="Reason for the hold" value={reason} onChange={(e) => setReason(e.target.value)} fieldClassName="w-80" />
                <Button variant="danger" disabled={reason.trim().length < 3} loading={hold.isPending} onClick={() => hold.mutate({ reason }, { onSuccess: () => setReason("") })}>
                  Put on hold
                </Button>
              </>
            )}
          </div>
        )}
        {error && <Alert tone="danger">{describeError(error)}</Alert>}
      </div>
    </Card>
  );
}
