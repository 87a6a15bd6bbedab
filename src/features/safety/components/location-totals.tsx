/**
 * Per-location flammable totals against the limits the safety office set. Over-limit is said
 * in words ("Over limit by 1.75 L"), not only by colour; limits carry their note (e.g. "Example only").
 */
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { TBody, THead, Table, TableMessage, Td, Th, Tr } from "@/components/ui/table";
import { useLocationTotals } from "../api/get-location-totals";

const L = (n: number) => `${n.toFixed(2)} L`;

export function LocationTotals() {
  const totals = useLocationTotals();
  if (totals.isError) return <Alert tone="danger">{describeError(totals.error)}</Alert>;
  const rows = (totals.data ?? []).filter((t) => t.containerCount > 0 || t.flammableLimitLitres !== null || t.combustibleLimitLitres !== null);
  const over = rows.filter((t) => t.overLimit);
  return (
    <div className="flex flex-col gap-2">
      {over.length > 0 ? (
        <Alert tone="danger" srLabel="Finding">
          {over.length} location{over.length > 1 ? "s are" : " is"} over the limit: {over.map((t) => t.path).join("; ")}.
        </Alert>
      ) : (
        totals.data && <Alert tone="ok">No location is over its limit.</Alert>
      )}
      <Table caption="Flammable liquid per location against its limit">
        <THead>
          <tr>
            <Th>Location</Th>
            <Th className="text-right">Cat. 1</Th>
            <Th className="text-right">Cat. 2</Th>
            <Th className="text-right">Cat. 3</Th>
            <Th className="text-right">Flammable (1–3)</Th>
            <Th className="text-right">Limit</Th>
            <Th className="text-right">Combustible (4)</Th>
            <Th>Finding</Th>
          </tr>
        </THead>
        <TBody>
          {totals.isPending && <TableMessage colSpan={8}>Adding up…</TableMessage>}
          {rows.map((t) => (
            <Tr key={t.id} data-testid={`location-total-${t.id}`} className={t.overLimit ? "bg-danger-50/60" : undefined}>
              <Td>
                <span style={{ paddingLeft: `${(t.path.split(" › ").length - 1) * 0.75}rem` }} className="block">
                  {t.name}
                  {t.limitNote && <span className="block text-xs text-grey-600">{t.limitNote}</span>}
                </span>
              </Td>
              <Td className="text-right font-mono text-xs whitespace-nowrap">{L(t.litresByCategory["1"])}</Td>
              <Td className="text-right font-mono text-xs whitespace-nowrap">{L(t.litresByCategory["2"])}</Td>
              <Td className="text-right font-mono text-xs whitespace-nowrap">{L(t.litresByCategory["3"])}</Td>
              <Td className="text-right font-mono text-xs whitespace-nowrap font-semibold">{L(t.flammableLitres)}</Td>
              <Td className="text-right font-mono text-xs whitespace-nowrap">{t.flammableLimitLitres === null ? "none set" : L(t.flammableLimitLitres)}</Td>
              <Td className="text-right font-mono text-xs whitespace-nowrap">{L(t.combustibleLitres)}{t.combustibleLimitLitres !== null && ` / ${L(t.combustibleLimitLitres)}`}</Td>
              <Td>
                {t.flammableOverLimit && <Badge tone="danger">Over limit by {L(t.flammableLitres - t.flammableLimitLitres!)}</Badge>}
                {t.combustibleOverLimit && <Badge tone="danger">Combustible over limit by {L(t.combustibleLitres - t.combustibleLimitLitres!)}</Badge>}
                {!t.overLimit && (t.flammableLimitLitres !== null ? "Within limit" : "")}
              </Td>
            </Tr>
          ))}
        </TBody>
      </Table>
    </div>
  );
}
