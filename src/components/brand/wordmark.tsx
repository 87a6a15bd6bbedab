/**
 * Phasebook's mark: a cell with two liquid layers meeting at one interface line. The aqueous
 * layer sits on top because the usual organic phase (1,2-dichloroethane, about 1.26 g/mL) is
 * denser than water.
 */
import { useId } from "react";
import { cn } from "@/lib/cn";

export function PhasebookMark({ className }: { className?: string }) {
  const clipId = useId();
  return (
    <svg viewBox="0 0 24 24" className={cn("size-6", className)} aria-hidden="true" focusable="false">
      <defs>
        <clipPath id={clipId}>
          <rect x="3.5" y="2.5" width="17" height="19" rx="3.5" />
        </clipPath>
      </defs>
      <g clipPath={`url(#${clipId})`}>
        <path d="M3 6.5h18v6.1q-9-2.6-18 0Z" className="fill-aqueous-300" />
        <path d="M3 12.6q9-2.6 18 0V22H3Z" className="fill-organic-400" />
        <path d="M3 12.6q9-2.6 18 0" fill="none" className="stroke-grey-900" strokeWidth="1.3" />
      </g>
      <rect x="3.5" y="2.5" width="17" height="19" rx="3.5" fill="none" className="stroke-grey-800" strokeWidth="1.5" />
    </svg>
  );
}

export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={cn("inline-flex items-center gap-1.5 text-grey-900", className)}>
      <PhasebookMark />
      <span className="text-[15px] font-semibold tracking-tight">Phasebook</span>
    </span>
  );
}
