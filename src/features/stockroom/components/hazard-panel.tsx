/**
 * The hazard panel on chemical and container pages: GHS pictograms with their names in words,
 * the signal word, each H-statement with its text, and the cautions the brief asks for where a
 * person handles the chemical (flammable, toxic, carcinogen, fume hood, and the precedence of
 * the fire code, safety office and safety data sheet over Phasebook's figures).
 */
import { hazardStatementText } from "@shared/domain/ghs-statements";
import { PICTOGRAM_NAMES, type GhsPictogram } from "@shared/domain/hazards";
import type { ChemicalDto } from "@shared/schemas/stock";
import { Card } from "@/components/ui/card";

export const PRECEDENCE_CAUTION =
  "Storage limits and handling rules are those set by the local fire code, the institution's safety office and the safety data sheet, which take precedence over anything Phasebook computes.";

const INHALATION_CODES = ["H330", "H331", "H332", "H335", "H336", "H350", "H351", "H340", "H341", "H370", "H372"];

/** The cautions for a chemical, as sentences; exported for the solution form. */
export function cautionsFor(c: ChemicalDto): string[] {
  const out: string[] = [];
  const codes = c.hazardStatements;
  const flammable = c.ghsFlammableCategory !== null && c.ghsFlammableCategory <= 3;
  if (flammable) out.push(`Flammable liquid (GHS category ${c.ghsFlammableCategory}, NFPA class ${c.nfpaClass}): keep away from ignition sources and store it in a flammable-liquids cabinet.`);
  else if (c.ghsFlammableCategory === 4) out.push("Combustible liquid (GHS category 4): keep away from heat.");
  if (c.acuteToxic) out.push("Toxic: avoid skin contact and inhalation; wear the gloves the safety data sheet names.");
  else if (codes.some((h) => ["H302", "H312", "H332"].includes(h))) out.push("Harmful if swallowed, in contact with skin or inhaled, as its statements say.");
  if (c.carcinogen) out.push(codes.some((h) => h.startsWith("H350")) ? "May cause cancer (known or presumed carcinogen): keep exposure as low as possible." : "Suspected of causing cancer: keep exposure as low as possible.");
  const volatile = c.flashPointC !== null || (c.boilingPointC !== null && c.boilingPointC < 150);
  if (volatile || codes.some((h) => INHALATION_CODES.includes(h))) out.push("Work in a fume hood: its vapour is hazardous to breathe.");
  if (c.halogenated) out.push("Halogenated: collect its waste in the halogenated solvent waste.");
  return out;
}

export function HazardPanel({ chemical }: { chemical: ChemicalDto }) {
  const cautions = cautionsFor(chemical);
  return (
    <Card title="Hazards" description="GHS label elements as entered for this chemical" as="h2">
      <div className="flex flex-col gap-3 text-sm" data-testid="hazard-panel">
        <p>
          <span className="text-grey-600">Signal word: </span>
          <strong className={chemical.signalWord === "Danger" ? "text-danger-800" : "text-grey-900"}>{chemical.signalWord ?? "none"}</strong>
        </p>
        {chemical.pictograms.length > 0 && (
          <ul className="flex flex-wrap gap-2" aria-label="Pictograms">
            {chemical.pictograms.map((p) => (
              <li key={p} className="flex items-center gap-1.5 rounded border border-danger-200 px-2 py-1">
                <span aria-hidden="true" className="inline-block size-4 rotate-45 border-2 border-danger-600" />
                <span>{PICTOGRAM_NAMES[p as GhsPictogram] ?? p}</span>
                <span className="font-mono text-xs text-grey-500">{p}</span>
              </li>
            ))}
          </ul>
        )}
        {chemical.hazardStatements.length > 0 ? (
          <ul className="flex flex-col gap-0.5">
            {chemical.hazardStatements.map((h) => (
              <li key={h}>
                <span className="mr-2 font-mono text-xs font-medium">{h}</span>
                {hazardStatementText(h) ?? "(text not on file)"}
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-grey-600">No hazard statements on record.</p>
        )}
        {cautions.length > 0 && (
          <div role="note" className="rounded-md border border-organic-200 bg-organic-50 px-3 py-2 text-organic-900">
            <p className="font-medium">Caution</p>
            <ul className="list-disc pl-5">
              {cautions.map((c) => (
                <li key={c}>{c}</li>
              ))}
            </ul>
          </div>
        )}
        {chemical.precautions && <p className="text-grey-700">{chemical.precautions}</p>}
        <p className="text-xs text-grey-600">{PRECEDENCE_CAUTION}</p>
      </div>
    </Card>
  );
}
