/** Small display pieces shared by the Stockroom screens: quantities and container status in words. */
import { CONTAINER_STATUS_LABELS, type ContainerStatusValue } from "@shared/schemas/stock";
import { Badge, type BadgeTone } from "@/components/ui/badge";

const TONES: Record<ContainerStatusValue, BadgeTone> = { sealed: "aqueous", in_use: "ok", on_hold: "warning", empty: "neutral", disposed: "neutral" };

export function StatusBadge({ status, chemicalHold }: { status: ContainerStatusValue; chemicalHold?: string | null }) {
  return (
    <span className="inline-flex flex-wrap gap-1">
      <Badge tone={TONES[status]}>{CONTAINER_STATUS_LABELS[status]}</Badge>
      {chemicalHold && status !== "on_hold" && <Badge tone="warning">Chemical on hold</Badge>}
    </span>
  );
}

/** Four significant figures, trailing zeros dropped: "1850 mL", "0.62 g", "0.04239 g". */
export function formatQuantity(value: number, unit: string): string {
  return `${Number(value.toPrecision(4))} ${unit}`;
}

export function formatConcentration(molPerL: number): string {
  const n = (x: number) => Number(x.toPrecision(4)).toString();
  return molPerL < 0.1 ? `${n(molPerL * 1000)} mmol/L` : `${n(molPerL)} mol/L`;
}
