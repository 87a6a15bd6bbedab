/** What a list shows when it has nothing yet: what would be here and, when there is one, the next step. */
import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

interface EmptyStateProps {
  title: string;
  children?: ReactNode;
  action?: ReactNode;
  className?: string;
}

export function EmptyState({ title, children, action, className }: EmptyStateProps) {
  return (
    <div className={cn("flex flex-col items-center gap-1.5 rounded-md border border-dashed border-grey-300 px-4 py-8 text-center", className)}>
      <svg viewBox="0 0 24 24" className="size-6 text-grey-400" fill="none" stroke="currentColor" strokeWidth="1.5" aria-hidden="true">
        <path d="M5 4h14v16H5z" />
        <path d="M5 13c2.5-1.4 4.5-1.4 7 0s4.5 1.4 7 0" />
      </svg>
      <p className="font-medium text-grey-800">{title}</p>
      {children && <div className="max-w-md text-grey-600">{children}</div>}
      {action && <div className="mt-2">{action}</div>}
    </div>
  );
}
