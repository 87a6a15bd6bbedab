/** A quiet progress indicator; the label is read by screen readers and shown on full-page waits. */
import { cn } from "@/lib/cn";

interface SpinnerProps {
  size?: "sm" | "md" | "lg";
  /** Spoken to screen readers; leave empty when the surrounding text already says what is loading. */
  label?: string;
  className?: string;
}

const SIZE = { sm: "size-3.5", md: "size-5", lg: "size-7" } as const;

export function Spinner({ size = "md", label, className }: SpinnerProps) {
  return (
    <span role={label ? "status" : undefined} className={cn("inline-flex items-center", className)}>
      <svg className={cn("animate-spin", SIZE[size])} viewBox="0 0 24 24" fill="none" aria-hidden="true">
        <circle cx="12" cy="12" r="9" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
        <path d="M21 12a9 9 0 0 0-9-9" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
      </svg>
      {label && <span className="sr-only">{label}</span>}
    </span>
  );
}

export function FullPageSpinner({ label = "Loading" }: { label?: string }) {
  return (
    <div className="flex min-h-[50vh] items-center justify-center gap-2 text-grey-600">
      <Spinner size="lg" className="text-aqueous-600" />
      <span>{label}…</span>
    </div>
  );
}

/** A block-level waiting line for a section of a page. */
export function LoadingLine({ label }: { label: string }) {
  return (
    <div className="flex items-center gap-2 py-6 text-grey-600">
      <Spinner size="sm" className="text-aqueous-600" />
      <span>{label}…</span>
    </div>
  );
}
