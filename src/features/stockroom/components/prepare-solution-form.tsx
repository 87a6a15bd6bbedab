/**
 * Solution preparation: choose the solute and solvent containers, the target concentration
 * and volume (and purity); Phasebook shows the mass to weigh and the solvent volume, then the
 * concentration the weighed mass really gives. Saving creates the solution with its lineage and
 * deducts both parents in one transaction on the server.
 */
import { useEffect, useState } from "react";
import { useNavigate } from "react-router-dom";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { actualConcentration } from "@shared/domain/solutions";
import { paths } from "@/config/paths";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { useContainers } from "../api/get-containers";
import { useChemical } from "../api/get-chemical";
import { planSolution, usePrepareSolution } from "../api/solutions";
import { PRECEDENCE_CAUTION } from "@shared/domain/cautions";
import { HandlingCautions } from "./hazard-panel";
import { formatConcentration, formatQuantity } from "./stock-format";

const num = (what: string) => z.coerce.number({ message: `Enter the ${what} as a number` });
const formSchema = z.object({
  soluteContainerId: z.coerce.number({ message: "Choose the solute container" }).int().positive("Choose the solute container"),
  solventContainerId: z.coerce.number({ message: "Choose the solvent container" }).int().positive("Choose the solvent container"),
  concentrationMmolPerL: num("concentration").positive("The concentration must be above zero").max(100_000, "At most 100 000 mmol/L"),
  volumeMl: num("volume").positive("The volume must be above zero").max(1e6, "At most 1 000 000 mL"),
  purityPercent: num("purity").gt(0, "The purity must be above 0 %").max(100, "The purity is at most 100 %"),
  massWeighedMg: z.union([z.literal(""), num("weighed mass").positive("The weighed mass must be above zero")]).optional(),
}).refine((v) => v.soluteContainerId !== v.solventContainerId, { path: ["solventContainerId"], message: "Choose a different container for the solvent" });
type FormIn = z.input<typeof formSchema>;
type FormOut = z.output<typeof formSchema>;

export function PrepareSolutionForm() {
  const navigate = useNavigate();
  const stock = useContainers({ status: "sealed,in_use", limit: 500, sort: "chemical", dir: "asc" });
  const prepare = usePrepareSolution();
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(formSchema),
    mode: "onChange",
    defaultValues: { soluteContainerId: "", solventContainerId: "", concentrationMmolPerL: 10, volumeMl: 100, purityPercent: 100, massWeighedMg: "" } as unknown as FormIn,
  });
  const v = useWatch({ control: form.control });
  const items = stock.data?.items ?? [];
  const solute = items.find((c) => c.id === Number(v.soluteContainerId));
  const solvent = items.find((c) => c.id === Number(v.solventContainerId));
  const solventChem = useChemical(solvent?.chemicalId ?? 0);
  const soluteChem = useChemical(solute?.chemicalId ?? 0);

  const planInput = solute && Number(v.concentrationMmolPerL) > 0 && Number(v.volumeMl) > 0 && Number(v.purityPercent) > 0 && Number(v.purityPercent) <= 100
    ? { soluteChemicalId: solute.chemicalId, concentrationMolPerL: Number(v.concentrationMmolPerL) / 1000, volumeMl: Number(v.volumeMl), purityPercent: Number(v.purityPercent) }
    : null;
  const plan = useQuery({ queryKey: ["stock", "plan", planInput], queryFn: () => planSolution(planInput!), enabled: planInput !== null });
  const [actual, setActual] = useState<number | null>(null);
  useEffect(() => {
    const mg = Number(v.massWeighedMg);
    if (!plan.data || !(mg > 0)) return setActual(null);
    try {
      setActual(actualConcentration({ massWeighedG: mg / 1000, volumeMl: Number(v.volumeMl), molarMassGPerMol: plan.data.molarMassGPerMol, purityPercent: Number(v.purityPercent) }));
    } catch {
      setActual(null);
    }
  }, [plan.data, v.massWeighedMg, v.volumeMl, v.purityPercent]);

  const onSubmit = form.handleSubmit(async (f) => {
    try {
      const out = await prepare.mutateAsync({
        soluteContainerId: f.soluteContainerId,
        solventContainerId: f.solventContainerId,
        concentrationMolPerL: f.concentrationMmolPerL / 1000,
        volumeMl: f.volumeMl,
        purityPercent: f.purityPercent,
        massWeighedG: typeof f.massWeighedMg === "number" ? f.massWeighedMg / 1000 : undefined,
      });
      navigate(paths.container.getHref(out.container.id));
    } catch (e) {
      applyServerFieldErrors(e, form.setError, ["soluteContainerId", "solventContainerId", "volumeMl", "purityPercent"]);
      const fe = (e as { fieldErrors?: Record<string, string> }).fieldErrors ?? {};
      if (fe.concentrationMolPerL) form.setError("concentrationMmolPerL", { message: fe.concentrationMolPerL });
      if (fe.massWeighedG) form.setError("massWeighedMg", { message: fe.massWeighedG });
    }
  });
  const err = form.formState.errors;
  const handled = [solute && soluteChem.data, solvent && solventChem.data && solventChem.data.id !== soluteChem.data?.id ? solventChem.data : null].filter((c) => !!c);

  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4 lg:grid-cols-2" data-testid="prepare-form">
      <Card title="What to make">
        <div className="flex flex-col gap-3">
          <Select label="Solute container" required {...form.register("soluteContainerId")} error={err.soluteContainerId?.message} data-testid="solute-select">
            <option value="">Choose the salt or solute…</option>
            {items.filter((c) => c.kind !== "waste").map((c) => (
              <option key={c.id} value={c.id}>{c.chemicalName} #{c.id} — {formatQuantity(c.quantity, c.unit)} left{c.locationName ? `, ${c.locationName}` : ""}</option>
            ))}
          </Select>
          <Select label="Solvent container" required {...form.register("solventContainerId")} error={err.solventContainerId?.message} data-testid="solvent-select">
            <option value="">Choose the solvent…</option>
            {items.filter((c) => c.kind !== "waste" && (c.unit.endsWith("L") || c.kind === "solution")).map((c) => (
              <option key={c.id} value={c.id}>{c.chemicalName} #{c.id} — {formatQuantity(c.quantity, c.unit)} left{c.locationName ? `, ${c.locationName}` : ""}</option>
            ))}
          </Select>
          <div className="grid grid-cols-3 gap-2">
            <Input label="Concentration (mmol/L)" required inputMode="decimal" {...form.register("concentrationMmolPerL")} error={err.concentrationMmolPerL?.message} />
            <Input label="Final volume (mL)" required inputMode="decimal" {...form.register("volumeMl")} error={err.volumeMl?.message} />
            <Input label="Purity (%)" inputMode="decimal" {...form.register("purityPercent")} error={err.purityPercent?.message} />
          </div>
        </div>
      </Card>
      <Card title="Weigh and make up">
        <div className="flex flex-col gap-3 text-sm">
          {plan.data ? (
            <dl className="grid grid-cols-2 gap-2" data-testid="plan">
              <div><dt className="text-xs text-grey-600">Weigh out</dt><dd className="text-lg font-semibold" data-testid="plan-mass">{(plan.data.soluteMassG * 1000).toPrecision(4)} mg</dd></div>
              <div><dt className="text-xs text-grey-600">Make up to</dt><dd className="text-lg font-semibold">{plan.data.finalVolumeMl} mL</dd></div>
              <div className="col-span-2 text-xs text-grey-600">
                {plan.data.soluteAmountMol * 1000} mmol at {plan.data.molarMassGPerMol.toFixed(2)} g/mol (the bottle form's molar mass){plan.data.purityPercent < 100 ? `, corrected for ${plan.data.purityPercent} % purity` : ""}. Solvent taken from the bottle: {plan.data.solventVolumeMl} mL{plan.data.solventVolumeApproximate ? " (approximate: the solute's own volume is no longer negligible)" : ""}.
              </div>
            </dl>
          ) : plan.isError ? (
            <Alert tone="danger">{describeError(plan.error)}</Alert>
          ) : (
            <p className="text-grey-600">Choose the solute and the target to see the mass to weigh.</p>
          )}
          <Input label="Mass actually weighed (mg)" inputMode="decimal" hint="Leave empty to record the planned mass." {...form.register("massWeighedMg")} error={err.massWeighedMg?.message} data-testid="mass-weighed" />
          {actual !== null && <p>That gives <strong>{formatConcentration(actual)}</strong>.</p>}
          {handled.length > 0 && (
            <div className="flex flex-col gap-2" data-testid="prepare-cautions">
              <p className="font-medium text-organic-900">Caution: what you are handling</p>
              {handled.map((c) => <HandlingCautions key={c.id} chemical={c} />)}
            </div>
          )}
          <p className="text-xs text-grey-600" data-testid="precedence-caution">{PRECEDENCE_CAUTION}</p>
          {prepare.isError && !Object.keys(form.formState.errors).length && <Alert tone="danger">{describeError(prepare.error)}</Alert>}
          <div>
            <Button type="submit" variant="primary" loading={form.formState.isSubmitting} data-testid="prepare-submit">Prepare and deduct both containers</Button>
          </div>
        </div>
      </Card>
    </form>
  );
}
