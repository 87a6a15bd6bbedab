/**
 * A short status word on a tinted ground. The word always carries the meaning; the tint only
 * helps scanning, so colour-blind readers and printouts lose nothing.
 */
import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

export type BadgeTone = "neutral" | "aqueous" | "organic" | "ok" | "warning" | "danger";

const TONES: Record<BadgeTone, string> = {
  neutral: "bg-grey-100 text-grey-700 ring-grey-300",
  aqueous: "bg-aqueous-50 text-aqueous-800 ring-aqueous-200",
  organic: "bg-organic-50 text-organic-800 ring-organic-200",
  ok: "bg-ok-50 text-ok-800 ring-ok-200",
  warning: "bg-warning-50 text-warning-800 ring-warning-300",
  danger: "bg-danger-50 text-danger-800 ring-danger-200",
};

interface BadgeProps {
  tone?: BadgeTone;
  /** The status in words; required so a badge is never colour alone. */
  children: ReactNode;
  className?: string;
}

export function Badge({ tone = "neutral", children, className }: BadgeProps) {
  return (
    <span
      className={cn(
        "inline-flex items-center whitespace-nowrap rounded px-1.5 py-px text-xs font-medium ring-1 ring-inset",
        TONES[tone],
        className,
      )}
    >
      {children}
    </span>
  );
}
