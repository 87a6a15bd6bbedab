/**
 * The numbers behind the picture: every supporting ion's edge (the innermost on each side sets
 * the window), each analyte's half-wave potential, currents and suggested range, the notes the
 * computation made, the sources (with the "from memory" marks kept) and the conventions.
 */
import type { RunPlanPreviewDto } from "@shared/schemas/run-plans";
import { Badge } from "@/components/ui/badge";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { formatCurrent, formatRange, formatVolts, molar, prettyIon } from "./format";

export function PlanNumbers({ preview }: { preview: RunPlanPreviewDto }) {
  const w = preview.window;
  const fromMemory = [...w.edges.map((e) => e.source), ...preview.analytes.map((a) => a.source)].some((s) => /from memory/i.test(s));
  return (
    <div className="flex flex-col gap-4">
      <Table caption="Supporting ions and the edge each would set (threshold concentration in the receiving phase)">
        <THead>
          <tr>
            <Th>Ion</Th>
            <Th>Phase</Th>
            <Th className="text-right">c</Th>
            <Th className="text-right">Δφ°</Th>
            <Th className="text-right">Edge</Th>
            <Th>Side</Th>
          </tr>
        </THead>
        <TBody>
          {w.edges.map((e, i) => (
            <Tr key={`${e.ion}-${i}`} data-testid={`edge-row-${e.ion}`}>
              <Td className="font-medium">{prettyIon(e.ion)}</Td>
              <Td>{e.phase}</Td>
              <Td className="text-right tabular-nums">{molar(e.molPerL)}</Td>
              <Td className="text-right tabular-nums" title={e.source}>
                {formatVolts(e.standardPotentialV)}
              </Td>
              <Td className="text-right tabular-nums">{formatVolts(e.edgeV)}</Td>
              <Td>
                {e.side}
                {e.limiting && (
                  <Badge tone={e.phase === "aqueous" ? "aqueous" : "organic"} className="ml-2">
                    sets the limit
                  </Badge>
                )}
              </Td>
            </Tr>
          ))}
        </TBody>
      </Table>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="window-numbers">
        <dt className="text-grey-600">Negative limit</dt>
        <dd className="tabular-nums">{w.negativeLimitV === null ? "open (no ion sets it)" : `${formatVolts(w.negativeLimitV)}, ${prettyIon(w.limitingNegative ?? "")}`}</dd>
        <dt className="text-grey-600">Positive limit</dt>
        <dd className="tabular-nums">{w.positiveLimitV === null ? "open (no ion sets it)" : `${formatVolts(w.positiveLimitV)}, ${prettyIon(w.limitingPositive ?? "")}`}</dd>
        <dt className="text-grey-600">Width</dt>
        <dd className="tabular-nums" data-testid="window-width">
          {w.widthV === null ? "—" : `${(w.widthV * 1000).toFixed(0)} mV`}
        </dd>
        <dt className="text-grey-600">Temperature, threshold</dt>
        <dd>
          {preview.temperatureC} °C, {preview.thresholdMolPerL} mol/L
        </dd>
        {preview.suggestedCurrentRangeA !== null && (
          <>
            <dt className="text-grey-600">Current range</dt>
            <dd>{formatRange(preview.suggestedCurrentRangeA)} full scale</dd>
          </>
        )}
      </dl>
      {preview.analytes.length > 0 && (
        <Table caption="Analytes">
          <THead>
            <tr>
              <Th>Ion</Th>
              <Th>From</Th>
              <Th className="text-right">Δφ½</Th>
              <Th>In the window</Th>
              <Th className="text-right">Peak (large interface)</Th>
              <Th className="text-right">Steady state (micro)</Th>
              <Th className="text-right">Range</Th>
            </tr>
          </THead>
          <TBody>
            {preview.analytes.map((a, i) => (
              <Tr key={`${a.ion}-${i}`}>
                <Td className="font-medium">{prettyIon(a.ion)}</Td>
                <Td>{a.phase}</Td>
                <Td className="text-right tabular-nums">{formatVolts(a.halfWavePotentialV)}</Td>
                <Td>{a.insideWindow === null ? "cannot say" : a.insideWindow ? "yes" : <span className="font-medium text-danger-700">no</span>}</Td>
                <Td className="text-right tabular-nums">{formatCurrent(a.peakCurrentA)}</Td>
                <Td className="text-right tabular-nums">{formatCurrent(a.steadyStateCurrentA)}</Td>
                <Td className="text-right">{formatRange(a.suggestedCurrentRangeA)}</Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      )}
      {[...w.notes, ...preview.analytes.flatMap((a) => a.notes.map((n) => `${prettyIon(a.ion)}: ${n}`)), ...preview.notes].length > 0 && (
        <ul className="list-disc pl-5 text-sm text-grey-700">
          {[...w.notes, ...preview.analytes.flatMap((a) => a.notes.map((n) => `${prettyIon(a.ion)}: ${n}`)), ...preview.notes].map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      )}
      {fromMemory && (
        <p className="text-xs text-warning-800">
          Some standard potentials carry the mark “from memory” in their source (hover a value to read it): check them against the original before relying on the result.
        </p>
      )}
      <details className="text-xs text-grey-700">
        <summary className="cursor-pointer font-medium text-grey-800">Conventions</summary>
        <ul className="mt-1 list-disc pl-5">
          {preview.conventions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </details>
    </div>
  );
}
