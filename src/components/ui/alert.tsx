/** A one-line message about the whole form or page (errors that belong to no single field, confirmations). */
import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

type AlertTone = "danger" | "ok" | "info" | "warning";

const TONES: Record<AlertTone, string> = {
  danger: "border-danger-200 bg-danger-50 text-danger-800",
  ok: "border-ok-200 bg-ok-50 text-ok-800",
  info: "border-aqueous-200 bg-aqueous-50 text-aqueous-900",
  warning: "border-organic-200 bg-organic-50 text-organic-900",
};

const WORDS: Record<AlertTone, string> = { danger: "Error", ok: "Done", info: "Note", warning: "Caution" };

interface AlertProps {
  tone?: AlertTone;
  children: ReactNode;
  className?: string;
  /** Hidden prefix read before the message, e.g. "Error:", so the tone is not colour alone. */
  srLabel?: string;
  "data-testid"?: string;
}

export function Alert({ tone = "info", children, className, srLabel, "data-testid": testId }: AlertProps) {
  return (
    <div
      data-testid={testId}
      role={tone === "danger" ? "alert" : "status"}
      className={cn("rounded-md border px-3 py-2 text-sm", TONES[tone], className)}
    >
      <span className="sr-only">{srLabel ?? WORDS[tone]}: </span>
      {children}
    </div>
  );
}
