/**
 * A new run plan: the organic solvent, the interface cell (its area or radius and fill volumes),
 * the supporting electrolyte of each phase — bottles on the shelf first (chemicals that say which
 * ions they give), then salts of the ion table — and the analytes. The picture and numbers follow
 * as you type (POST /api/run-plans/preview); saving keeps the plan (POST /api/run-plans).
 */
import { useMemo, useState } from "react";
import { saltIons, type SolventEntry } from "@shared/domain/ion-transfer";
import { formatChemicalIons } from "@shared/domain/ion-transfer/chemical-ions";
import type { ChemicalDto } from "@shared/schemas/stock";
import type { InstrumentDto } from "@shared/schemas/instruments";
import type { RunPlanPreviewInput } from "@shared/schemas/run-plans";
import type { RunPlanDto, RunPlanInput } from "@shared/schemas/run-plan-records";
import { ApiError } from "@/lib/api-client";
import { describeError } from "@/lib/forms";
import { useDebouncedValue } from "@/hooks/use-debounced-value";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { LoadingLine } from "@/components/ui/spinner";
import { useIons, useSolvents } from "../api/ion-table";
import { useInstrumentChoices, useStockElectrolytes } from "../api/stock-choices";
import { useCreateRunPlan, usePreview } from "../api/run-plans";
import { PotentialPicture } from "./potential-picture";
import { PlanNumbers } from "./plan-numbers";
import { prettyIon } from "./format";

type Phase = "aqueous" | "organic";
interface ElectrolyteRow {
  /** "stock:<chemicalId>" or "salt:<name>". */
  choice: string;
  mM: string;
  purity: string;
}
interface AnalyteRow {
  ion: string;
  mM: string;
  phase: Phase;
}

/** Salts the trade uses, offered where the solvent's table knows both ions. */
const TABLE_SALTS: Record<Phase, string[]> = {
  aqueous: ["LiCl", "NaCl", "KCl", "HCl", "LiBr", "NaBr", "KBr", "LiClO4", "NaClO4"],
  organic: ["BTPPA TB(C6F5)4", "BTPPA TPBCl", "TPAs TB(C6F5)4", "TPAs TPBCl", "TBA TB(C6F5)4", "TBA TPBCl", "TBA TPB", "TPAs TPB"],
};

const number = (s: string) => (s.trim() === "" ? NaN : Number(s));
const positiveError = (s: string, what: string) => (Number.isFinite(number(s)) && number(s) > 0 ? undefined : `Enter the ${what} as a number above zero`);

function stockIonsOf(c: ChemicalDto, mM: number) {
  return (c.ions ?? []).map((i) => ({ ion: i.ion, molPerL: (i.count * mM) / 1000 }));
}

/** A bottle on the shelf that gives exactly these ions, or the table's salt of that name. */
function defaultChoice(stock: ChemicalDto[], ions: [string, string], salt: string): string {
  const found = stock.find((c) => c.ions?.length === 2 && ions.every((ion) => c.ions?.some((i) => i.ion === ion && i.count === 1)));
  return found ? `stock:${found.id}` : `salt:${salt}`;
}

export function RunPlanForm({ onSaved }: { onSaved: (plan: RunPlanDto) => void }) {
  const solvents = useSolvents();
  const stock = useStockElectrolytes();
  const instruments = useInstrumentChoices();
  if (solvents.isPending || instruments.isPending || stock.isPending) return <LoadingLine label="Loading the ion table and the Stockroom" />;
  const failed = solvents.error ?? instruments.error ?? stock.error;
  if (failed) return <Alert tone="danger">{describeError(failed)}</Alert>;
  return <PlanForm onSaved={onSaved} stockChoices={stock.data ?? []} instruments={instruments.data ?? []} solventChoices={solvents.data?.items ?? []} />;
}

function PlanForm({
  onSaved,
  stockChoices,
  instruments,
  solventChoices,
}: {
  onSaved: (plan: RunPlanDto) => void;
  stockChoices: ChemicalDto[];
  instruments: InstrumentDto[];
  solventChoices: { id: string; name: string }[];
}) {
  const [solvent, setSolvent] = useState("dce");
  const ions = useIons(solvent);
  const stock = { data: stockChoices };
  const cells = useMemo(() => instruments.filter((i) => i.kind === "interface_cell" && i.status === "in_service"), [instruments]);
  const [title, setTitle] = useState("");
  const [cellId, setCellId] = useState<number | null>(null);
  // Bottles on the shelf first: LiCl in water and BTPPA TB(C6F5)4 in the organic phase when the Stockroom has them.
  const [rows, setRows] = useState<Record<Phase, ElectrolyteRow[]>>(() => ({
    aqueous: [{ choice: defaultChoice(stockChoices, ["Li+", "Cl-"], "LiCl"), mM: "10", purity: "100" }],
    organic: [{ choice: defaultChoice(stockChoices, ["BTPPA+", "TB(C6F5)4-"], "BTPPA TB(C6F5)4"), mM: "5", purity: "100" }],
  }));
  const [analytes, setAnalytes] = useState<AnalyteRow[]>([{ ion: "TEA+", mM: "0.5", phase: "aqueous" }]);
  const [scanMvPerS, setScanMvPerS] = useState("50");
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [error, setError] = useState<string | null>(null);
  const create = useCreateRunPlan();

  const cell: InstrumentDto | null = cells.find((c) => c.id === cellId) ?? cells[0] ?? null;
  const solventEntry: SolventEntry | null = ions.data
    ? { id: ions.data.solvent.id, name: ions.data.solvent.name, aliases: [], ions: ions.data.items.map((i) => ({ ion: i.ion, name: i.name, charge: i.charge, standardPotential: i.standardPotential })) }
    : null;
  const salts = (phase: Phase) =>
    solventEntry
      ? TABLE_SALTS[phase].filter((s) => {
          try {
            saltIons(solventEntry, s);
            return true;
          } catch {
            return false;
          }
        })
      : [];
  const chemicalOf = (choice: string) => (choice.startsWith("stock:") ? (stock.data ?? []).find((c) => c.id === Number(choice.slice(6))) : undefined);

  // The preview request: every electrolyte as its ions, the same ion of one phase added up.
  const previewBody: RunPlanPreviewInput | null = useMemo(() => {
    if (!solventEntry) return null;
    const phaseIons = (phase: Phase) => {
      const sums = new Map<string, number>();
      for (const r of rows[phase]) {
        const mM = number(r.mM);
        if (!(mM > 0)) return null;
        const chem = chemicalOf(r.choice);
        let list: { ion: string; molPerL: number }[] = [];
        if (chem) list = stockIonsOf(chem, mM);
        else if (r.choice.startsWith("salt:")) {
          try {
            list = saltIons(solventEntry, r.choice.slice(5)).map((i) => ({ ion: i.ion, molPerL: (i.stoichiometry * mM) / 1000 }));
          } catch {
            return null;
          }
        }
        for (const i of list) sums.set(i.ion, (sums.get(i.ion) ?? 0) + i.molPerL);
      }
      return [...sums].map(([ion, molPerL]) => ({ ion, molPerL }));
    };
    const aqueous = phaseIons("aqueous");
    const organic = phaseIons("organic");
    if (!aqueous || !organic) return null;
    const scan = number(scanMvPerS);
    return {
      solvent,
      aqueous,
      organic,
      analytes: analytes.filter((a) => number(a.mM) > 0).map((a) => ({ ion: a.ion, molPerL: number(a.mM) / 1000, phase: a.phase })),
      ...(cell?.interfaceRadiusCm ? { interfaceRadiusCm: cell.interfaceRadiusCm } : cell?.interfaceAreaCm2 ? { interfaceAreaCm2: cell.interfaceAreaCm2 } : {}),
      ...(scan > 0 ? { scanRateVPerS: scan / 1000 } : {}),
    };
    // chemicalOf reads stock.data, which is in the dependencies.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [solventEntry?.id, ions.data, rows, analytes, scanMvPerS, cell?.id, stockChoices, solvent]);
  const debounced = useDebouncedValue(previewBody, 300);
  const preview = usePreview(debounced);

  const setRow = (phase: Phase, i: number, change: Partial<ElectrolyteRow>) => setRows({ ...rows, [phase]: rows[phase].map((r, k) => (k === i ? { ...r, ...change } : r)) });

  const save = async () => {
    setError(null);
    setFieldErrors({});
    const toInput = (r: ElectrolyteRow) => {
      const base = { molPerL: number(r.mM) / 1000, ...(number(r.purity) > 0 && number(r.purity) < 100 ? { purityPercent: number(r.purity) } : {}) };
      return r.choice.startsWith("stock:") ? { chemicalId: Number(r.choice.slice(6)), ...base } : { salt: r.choice.slice(5), ...base };
    };
    const input: RunPlanInput = {
      title: title.trim() || "Untitled run plan",
      solvent,
      cellId: cell?.id ?? null,
      ...(number(scanMvPerS) > 0 ? { scanRateVPerS: number(scanMvPerS) / 1000 } : {}),
      aqueous: rows.aqueous.map(toInput),
      organic: rows.organic.map(toInput),
      analytes: analytes.filter((a) => number(a.mM) > 0).map((a) => ({ ion: a.ion, molPerL: number(a.mM) / 1000, phase: a.phase })),
    };
    try {
      onSaved(await create.mutateAsync(input));
    } catch (e) {
      if (e instanceof ApiError) setFieldErrors(e.fieldErrors);
      setError(describeError(e));
    }
  };

  const electrolyteRows = (phase: Phase) => (
    <fieldset className="flex flex-col gap-2" data-testid={`electrolytes-${phase}`}>
      <legend className="mb-1 text-sm font-medium text-grey-900">{phase === "aqueous" ? "Aqueous phase (water)" : `Organic phase (${ions.data?.solvent.name ?? solvent})`}</legend>
      {rows[phase].map((r, i) => {
        const chem = chemicalOf(r.choice);
        const serverError = fieldErrors[`${phase}.${i}.chemicalId`] ?? fieldErrors[`${phase}.${i}.salt`];
        return (
          <div key={i} className="grid gap-2 sm:grid-cols-[1fr_8rem_7rem_auto] sm:items-end">
            <Select label="Supporting electrolyte" value={r.choice} onChange={(e) => setRow(phase, i, { choice: e.target.value })} error={serverError} data-testid={`electrolyte-${phase}-${i}`}>
              <optgroup label="In the Stockroom">
                {(stock.data ?? []).map((c) => (
                  <option key={c.id} value={`stock:${c.id}`}>
                    {c.name} ({formatChemicalIons(c.ions ?? [])})
                  </option>
                ))}
              </optgroup>
              <optgroup label="From the ion table (not in stock)">
                {salts(phase).map((s) => (
                  <option key={s} value={`salt:${s}`}>
                    {s}
                  </option>
                ))}
              </optgroup>
            </Select>
            <Input label="mmol/L" inputMode="decimal" value={r.mM} onChange={(e) => setRow(phase, i, { mM: e.target.value })} error={positiveError(r.mM, "concentration") ?? fieldErrors[`${phase}.${i}.molPerL`]} />
            <Input label="Purity %" inputMode="decimal" value={r.purity} disabled={!chem} onChange={(e) => setRow(phase, i, { purity: e.target.value })} error={chem ? positiveError(r.purity, "purity") : undefined} />
            {rows[phase].length > 1 && (
              <Button size="sm" variant="ghost" onClick={() => setRows({ ...rows, [phase]: rows[phase].filter((_, k) => k !== i) })}>
                Remove
              </Button>
            )}
          </div>
        );
      })}
      <div>
        <Button size="sm" onClick={() => setRows({ ...rows, [phase]: [...rows[phase], { choice: rows[phase][0]?.choice ?? "", mM: "10", purity: "100" }] })}>
          Add an electrolyte
        </Button>
      </div>
    </fieldset>
  );

  // The picture first: above the form on a phone, beside it (and staying in view) on a wide screen.
  return (
    <div className="grid grid-cols-1 items-start gap-4 xl:grid-cols-2">
      <div className="order-first min-w-0 xl:sticky xl:top-4 xl:order-last">
        <Card title="The plan">
          {preview.isError && <Alert tone="danger">{describeError(preview.error)}</Alert>}
          {!previewBody && <p className="text-sm text-grey-600">Give every concentration as a number above zero to see the window.</p>}
          {preview.data && (
            <div className="flex flex-col gap-4">
              <PotentialPicture preview={preview.data} solventName={preview.data.solvent.name} />
              <PlanNumbers preview={preview.data} />
            </div>
          )}
        </Card>
      </div>
      <div className="flex min-w-0 flex-col gap-4">
        <Card title="What you will run">
          <div className="grid gap-3 sm:grid-cols-2">
            <Input label="Title" value={title} placeholder="e.g. TEA⁺ transfer, LiCl | BTPPA TB(C6F5)4" onChange={(e) => setTitle(e.target.value)} error={fieldErrors.title} />
            <Select label="Organic solvent" value={solvent} onChange={(e) => setSolvent(e.target.value)}>
              {solventChoices.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </Select>
            <Select label="Interface cell" value={cell?.id ?? ""} onChange={(e) => setCellId(Number(e.target.value))} error={fieldErrors.cellId}>
              {cells.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name}
                </option>
              ))}
            </Select>
            <Input label="Scan rate (mV/s)" inputMode="decimal" value={scanMvPerS} onChange={(e) => setScanMvPerS(e.target.value)} error={positiveError(scanMvPerS, "scan rate")} />
          </div>
          {cell && (
            <p className="mt-2 text-xs text-grey-600" data-testid="cell-facts">
              {cell.interfaceRadiusCm ? `Micro-interface of radius ${cell.interfaceRadiusCm * 1e4} µm` : `Interface ${cell.interfaceAreaCm2 ?? "?"} cm²`}; fills {cell.aqueousFillMl ?? "?"} mL of water and {cell.organicFillMl ?? "?"} mL of
              organic phase{cell.aqueousFillMl === null || cell.organicFillMl === null ? " (the manager has not recorded the volumes; the plan cannot say what to weigh)" : ""}.
            </p>
          )}
        </Card>
        <Card title="Electrolytes" description="Bottles on the shelf first (chemicals that say which ions they give), then salts of the ion table.">
          <div className="grid gap-4 lg:grid-cols-2">
            {electrolyteRows("aqueous")}
            {electrolyteRows("organic")}
          </div>
        </Card>
        <Card title="Analytes" description="The ions you want to see transfer.">
          <div className="flex flex-col gap-2">
            {analytes.map((a, i) => (
              <div key={i} className="grid gap-2 sm:grid-cols-[1fr_8rem_10rem_auto] sm:items-end">
                <Select label="Ion" value={a.ion} onChange={(e) => setAnalytes(analytes.map((x, k) => (k === i ? { ...x, ion: e.target.value } : x)))} error={fieldErrors[`analytes.${i}.ion`]}>
                  {(ions.data?.items ?? []).map((ion) => (
                    <option key={ion.ion} value={ion.ion}>
                      {prettyIon(ion.ion)} ({ion.name})
                    </option>
                  ))}
                </Select>
                <Input label="mmol/L" inputMode="decimal" value={a.mM} onChange={(e) => setAnalytes(analytes.map((x, k) => (k === i ? { ...x, mM: e.target.value } : x)))} error={positiveError(a.mM, "concentration")} />
                <Select label="Starts in" value={a.phase} onChange={(e) => setAnalytes(analytes.map((x, k) => (k === i ? { ...x, phase: e.target.value as Phase } : x)))}>
                  <option value="aqueous">water</option>
                  <option value="organic">organic phase</option>
                </Select>
                <Button size="sm" variant="ghost" onClick={() => setAnalytes(analytes.filter((_, k) => k !== i))}>
                  Remove
                </Button>
              </div>
            ))}
            <div>
              <Button size="sm" onClick={() => setAnalytes([...analytes, { ion: "TMA+", mM: "0.5", phase: "aqueous" }])}>
                Add an analyte
              </Button>
            </div>
          </div>
        </Card>
        {error && <Alert tone="danger">{error}</Alert>}
        <div className="flex justify-end">
          <Button variant="primary" loading={create.isPending} onClick={save}>
            Save the plan
          </Button>
        </div>
      </div>
    </div>
  );
}
