/** One chemical: identity, computed classes, hazard panel, its containers, its safety data sheets and (for the safety office) a hold. */
import { useState, type ReactNode } from "react";
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { hasRole, useUser } from "@/lib/auth";
import { describeError } from "@/lib/forms";
import { formatDate } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button, buttonClasses } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input } from "@/components/ui/input";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingLine } from "@/components/ui/spinner";
import { useChemical, useSheets } from "../api/get-chemical";
import { useHoldChemical } from "../api/chemical-actions";
import { ContainersTable } from "./containers-table";
import { HazardPanel } from "./hazard-panel";
import { ChemicalIons } from "./chemical-ions";
import { SdsUploadForm } from "./sds-upload-form";

interface ChemicalDetailProps {
  id: number;
  /** Passed on to the containers table (the route composes label printing). */
  containerSelectionActions?: (ids: number[]) => ReactNode;
}

export function ChemicalDetail({ id, containerSelectionActions }: ChemicalDetailProps) {
  const q = useChemical(id);
  const sheets = useSheets(id);
  const { data: user } = useUser();
  const keeper = hasRole(user, "manager", "safety_officer");
  const hold = useHoldChemical(id);
  const [reason, setReason] = useState("");
  if (q.isPending) return <LoadingLine label="Loading the chemical" />;
  if (q.isError) return <Alert tone="danger">{describeError(q.error)}</Alert>;
  const c = q.data;
  return (
    <>
      <PageHeader
        title={c.name}
        description={[c.casNumber, c.formula, c.synonyms.join(", ")].filter(Boolean).join(" · ")}
        actions={keeper && <Link className={buttonClasses("secondary")} to={paths.receive.getHref(c.id)}>Receive a delivery</Link>}
      />
      {c.onHoldReason && <Alert tone="warning" className="mb-3">On hold: {c.onHoldReason}. No container of it may be used.</Alert>}
      <div className="grid gap-4 lg:grid-cols-2">
        <div className="flex flex-col gap-4">
          <Card title="Properties">
            <dl className="grid grid-cols-2 gap-3 text-sm sm:grid-cols-3">
              <div><dt className="text-xs text-grey-600">Molar mass</dt><dd>{c.molarMass ? `${c.molarMass.toFixed(2)} g/mol${c.molarMassOverridden ? " (bottle form, entered)" : " (from formula)"}` : "–"}</dd></div>
              <div><dt className="text-xs text-grey-600">Flash point (closed cup)</dt><dd>{c.flashPointC === null ? "–" : `${c.flashPointC} °C`}</dd></div>
              <div><dt className="text-xs text-grey-600">Boiling point</dt><dd>{c.boilingPointC === null ? "–" : `${c.boilingPointC} °C`}</dd></div>
              <div><dt className="text-xs text-grey-600">Density</dt><dd>{c.densityGPerMl === null ? "–" : `${c.densityGPerMl} g/mL`}</dd></div>
              <div><dt className="text-xs text-grey-600">GHS flammable liquid</dt><dd>{c.ghsFlammableCategory ? `Category ${c.ghsFlammableCategory}` : "Not classified"}</dd></div>
              <div><dt className="text-xs text-grey-600">NFPA 30 class</dt><dd>{c.nfpaClass ?? "–"}</dd></div>
              <div><dt className="text-xs text-grey-600">Storage group</dt><dd>{c.storageGroup || "–"}</dd></div>
              <div><dt className="text-xs text-grey-600">Reorder point</dt><dd>{c.reorderPoint === null ? "–" : `${c.reorderPoint} ${c.reorderUnit ?? ""}`}</dd></div>
              <div><dt className="text-xs text-grey-600">Unit cost</dt><dd>{c.unitCostCents === null ? "–" : `${(c.unitCostCents / 100).toFixed(2)} per ${c.costUnit}`}</dd></div>
            </dl>
          </Card>
          <ChemicalIons key={JSON.stringify(c.ions)} chemical={c} canEdit={keeper} />
          <Card title="Safety data sheets">
            {sheets.data?.length ? (
              <ul className="text-sm" data-testid="sds-list">
                {sheets.data.map((s) => (
                  <li key={s.id}>
                    <a href={`/api/sds/${s.id}/file`}>{s.originalName}</a> — reviewed {formatDate(s.reviewedOn)}{s.supplier && `, ${s.supplier}`} {s.due && <strong className="text-warning-800">(due for review)</strong>}
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-grey-600">No safety data sheet on file.</p>
            )}
            {keeper && <SdsUploadForm chemicalId={c.id} />}
          </Card>
          {keeper && (
            <Card title="Hold">
              <div className="flex flex-wrap items-end gap-2">
                {c.onHoldReason ? (
                  <Button loading={hold.isPending} onClick={() => hold.mutate(null)}>Release the hold</Button>
                ) : (
                  <>
                    <Input label="Reason" value={reason} onChange={(e) => setReason(e.target.value)} fieldClassName="w-80" />
                    <Button variant="danger" disabled={reason.trim().length < 3} loading={hold.isPending} onClick={() => hold.mutate({ reason })}>Put the chemical on hold</Button>
                  </>
                )}
              </div>
              {hold.error && <Alert tone="danger" className="mt-2">{describeError(hold.error)}</Alert>}
            </Card>
          )}
        </div>
        <HazardPanel chemical={c} />
      </div>
      <h2 className="mb-2 mt-6 text-sm font-semibold">Containers</h2>
      <ContainersTable chemicalId={c.id} selectionActions={containerSelectionActions} />
    </>
  );
}
