/**
 * Per-location liquid totals by fire-code class against the limits the safety office set. Each
 * finding is said in words ("Over limit by 1.75 L", "Cannot confirm: 1 container of unknown
 * volume"), not only by colour; limits carry their note (e.g. "Example only").
 */
import { useDeferredValue } from "react";
import { NFPA_CLASSES } from "@shared/domain/storage";
import { LIMIT_FINDING_LABELS } from "@shared/schemas/storage";
import type { LocationTotalsDto } from "@shared/schemas/stock";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { LoadingLine } from "@/components/ui/spinner";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { useLocationTotals } from "../api/get-location-totals";

const L = (n: number) => `${n.toFixed(2)} L`;

function Findings({ t }: { t: LocationTotalsDto }) {
  if (!t.limits.length) return <span className="text-grey-600">No limit set</span>;
  return (
    <ul className="flex flex-col gap-1">
      {t.limits.map((l) => (
        <li key={l.id} className="text-xs">
          <span className="font-medium">Class {l.classes.join(" + ")}</span>: {L(l.totalLitres)} of {L(l.maxLitres)}
          {l.enteredUnit === "US gal" && ` (${l.enteredVolume} US gal)`}
          {!l.includesCabinets && " outside approved cabinets"}{" "}
          {l.finding === "over" ? (
            <Badge tone="danger">Over limit by {L(l.totalLitres - l.maxLitres)}</Badge>
          ) : l.finding === "cannot_confirm" ? (
            <Badge tone="warning">Cannot confirm: {l.unknownVolumeContainers} container{l.unknownVolumeContainers > 1 ? "s" : ""} of unknown volume</Badge>
          ) : (
            <span>{LIMIT_FINDING_LABELS.within}</span>
          )}
          {l.note && <span className="block text-grey-600">{l.note}</span>}
        </li>
      ))}
    </ul>
  );
}

/**
 * The totals as the page shows them: the answer through useDeferredValue, so an arriving answer
 * renders as a transition, in slices, not in one long task. The Safety review gives the same value
 * to the lists below (ReviewLists), so they never show before the totals above them and the totals
 * arriving never push them down the page.
 */
export function useShownTotals(): { data: LocationTotalsDto[] | undefined; error: unknown; drawn: boolean } {
  const totals = useLocationTotals();
  const data = useDeferredValue(totals.data);
  const error = totals.isError ? totals.error : null;
  // What LocationTotals draws in place of its loading line: the totals, or the error.
  return { data, error, drawn: data !== undefined || error !== null };
}

/** The totals with their findings, drawn whole when they are there (findings above the table never move it). */
export function LocationTotals({ shown: { data, error } }: { shown: ReturnType<typeof useShownTotals> }) {
  if (error) return <Alert tone="danger">{describeError(error)}</Alert>;
  if (data === undefined) return <LoadingLine label="Adding up the totals" />;
  const rows = data.filter((t) => t.containerCount > 0 || t.limits.length > 0);
  const over = rows.filter((t) => t.overLimit);
  const unsure = rows.filter((t) => t.cannotConfirm);
  return (
    <div className="flex flex-col gap-2">
      {over.length > 0 ? (
        <Alert tone="danger" srLabel="Finding">
          {over.length} location{over.length > 1 ? "s are" : " is"} over a limit: {over.map((t) => t.path).join("; ")}.
        </Alert>
      ) : (
        !unsure.length && <Alert tone="ok">No location is over its limits.</Alert>
      )}
      {unsure.length > 0 && (
        <Alert tone="warning" srLabel="Finding">
          Cannot confirm {unsure.length} location{unsure.length > 1 ? "s" : ""} ({unsure.map((t) => t.path).join("; ")}): some flammable or combustible liquids there are kept by mass
          without a density, so their volume is unknown. Enter the chemical's density to count them.
        </Alert>
      )}
      <Table caption="Flammable and combustible liquid per location, by NFPA 30 class, against its limits">
        <THead>
          <tr>
            <Th>Location</Th>
            {NFPA_CLASSES.map((c) => (
              <Th key={c} className="text-right">
                Class {c}
              </Th>
            ))}
            <Th className="text-right">Unknown volume</Th>
            <Th>Limits and findings</Th>
          </tr>
        </THead>
        <TBody>
          {rows.map((t) => (
            <Tr key={t.id} data-testid={`location-total-${t.id}`} className={t.overLimit ? "bg-danger-50/60" : undefined}>
              <Td>
                <span style={{ paddingLeft: `${(t.path.split(" › ").length - 1) * 0.75}rem` }} className="block">
                  {t.name}
                  {t.limitNote && <span className="block text-xs text-grey-600">{t.limitNote}</span>}
                </span>
              </Td>
              {NFPA_CLASSES.map((c) => (
                <Td key={c} className="text-right font-mono text-xs whitespace-nowrap">
                  {L(t.litresByClass[c])}
                </Td>
              ))}
              <Td className="text-right text-xs">{t.unknownVolumeContainers ? `${t.unknownVolumeContainers} container${t.unknownVolumeContainers > 1 ? "s" : ""}` : "–"}</Td>
              <Td>
                <Findings t={t} />
              </Td>
            </Tr>
          ))}
        </TBody>
      </Table>
    </div>
  );
}
