/**
 * Which ions an electrolyte gives when it dissolves (LiCl → Li⁺ + Cl⁻), so run plans can start
 * from its bottles. The manager and the safety officer write them as "Li+, Cl-" ("2 Na+, SO4 2-"
 * for other stoichiometries); the formula unit must come out neutral.
 */
import { useState } from "react";
import { ChemicalIonsError, formatChemicalIons, parseChemicalIons } from "@shared/domain/ion-transfer/chemical-ions";
import type { ChemicalDto } from "@shared/schemas/stock";
import { ApiError } from "@/lib/api-client";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input } from "@/components/ui/input";
import { useSetChemicalIons } from "../api/chemical-actions";

export function ChemicalIons({ chemical, canEdit }: { chemical: ChemicalDto; canEdit: boolean }) {
  const save = useSetChemicalIons(chemical.id);
  const [text, setText] = useState(chemical.ions ? chemical.ions.map((i) => `${i.count > 1 ? `${i.count} ` : ""}${i.ion}`).join(", ") : "");
  const [message, setMessage] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);
  let parsed: ReturnType<typeof parseChemicalIons> = null;
  let error: string | undefined;
  try {
    parsed = parseChemicalIons(text);
  } catch (e) {
    if (!(e instanceof ChemicalIonsError)) throw e;
    error = e.message;
  }
  const submit = async () => {
    setMessage(null);
    try {
      await save.mutateAsync(parsed);
      setMessage({ tone: "ok", text: parsed ? `Saved: ${formatChemicalIons(parsed)}.` : "Saved: not an electrolyte." });
    } catch (e) {
      setMessage({ tone: "danger", text: e instanceof ApiError ? (Object.values(e.fieldErrors)[0] ?? describeError(e)) : describeError(e) });
    }
  };
  return (
    <Card title="Ions it gives (run plans)" data-testid="chemical-ions">
      <p className="text-sm" data-testid="chemical-ions-text">
        {chemical.ions ? formatChemicalIons(chemical.ions) : "Not recorded as an electrolyte: run plans cannot start from its bottles."}
      </p>
      {canEdit && (
        <div className="mt-2 flex flex-wrap items-end gap-2">
          <Input label="Ions per formula unit" hint="e.g. Li+, Cl-  ·  BTPPA+, TB(C6F5)4-  ·  2 Na+, SO4 2-  (empty: not an electrolyte)" value={text} onChange={(e) => setText(e.target.value)} error={error} fieldClassName="w-80" />
          <Button disabled={Boolean(error)} loading={save.isPending} onClick={submit}>
            Save the ions
          </Button>
        </div>
      )}
      {message && (
        <Alert tone={message.tone} className="mt-2">
          {message.text}
        </Alert>
      )}
    </Card>
  );
}
