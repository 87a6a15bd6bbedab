/**
 * The hazard panel on chemical and container pages: GHS pictograms with their names in words,
 * the signal word, each H-statement with its text, and the cautions the brief asks for where a
 * person handles the chemical (flammable, toxic, carcinogen, fume hood, and the precedence of
 * the fire code, safety office and safety data sheet over Phasebook's figures). The cautions
 * themselves are computed in shared/domain/cautions.ts; HandlingCautions is the compact form
 * for the receive and prepare forms.
 */
import { hazardStatementText } from "@shared/domain/ghs-statements";
import { handlingCautions, PRECEDENCE_CAUTION } from "@shared/domain/cautions";
import { PICTOGRAM_NAMES, type GhsPictogram } from "@shared/domain/hazards";
import type { ChemicalDto } from "@shared/schemas/stock";
import { Card } from "@/components/ui/card";

/** The hazards of one chemical where a person is about to handle it (receiving, preparing a solution): pictograms, statements, cautions. */
export function HandlingCautions({ chemical, title }: { chemical: ChemicalDto; title?: string }) {
  const cautions = handlingCautions(chemical);
  if (chemical.pictograms.length === 0 && chemical.hazardStatements.length === 0 && cautions.length === 0) return null;
  return (
    <div role="note" className="rounded-md border border-organic-200 bg-organic-50 px-3 py-2 text-sm text-organic-900" data-testid={`cautions-${chemical.id}`}>
      <p className="font-medium">
        {title ?? chemical.name}
        {chemical.signalWord && <span className="ml-2 uppercase tracking-wide">{chemical.signalWord}</span>}
      </p>
      {chemical.pictograms.length > 0 && (
        <p className="text-xs">{chemical.pictograms.map((p) => `${PICTOGRAM_NAMES[p as GhsPictogram] ?? p} (${p})`).join(" · ")}</p>
      )}
      {chemical.hazardStatements.length > 0 && (
        <ul className="mt-1 text-xs">
          {chemical.hazardStatements.map((h) => (
            <li key={h}>
              <span className="mr-1 font-mono font-medium">{h}</span>
              {hazardStatementText(h) ?? "(text not on file)"}
            </li>
          ))}
        </ul>
      )}
      {cautions.length > 0 && (
        <ul className="mt-1 list-disc pl-5">
          {cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      )}
    </div>
  );
}

export function HazardPanel({ chemical }: { chemical: ChemicalDto }) {
  const cautions = handlingCautions(chemical);
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
