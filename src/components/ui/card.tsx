/** A bordered panel for one block of a page, with an optional title row and actions. */
import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

interface CardProps {
  title?: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  className?: string;
  bodyClassName?: string;
  children?: ReactNode;
  /** The heading level of the title within the page outline. */
  as?: "h2" | "h3";
  "data-testid"?: string;
}

export function Card({ title, description, actions, className, bodyClassName, children, as: Heading = "h2", "data-testid": testId }: CardProps) {
  return (
    <section data-testid={testId} className={cn("rounded-lg border border-grey-200 bg-white shadow-xs", className)}>
      {(title || actions) && (
        <header className="flex items-start justify-between gap-3 border-b border-grey-200 px-4 py-2.5">
          <div className="min-w-0">
            {title && <Heading className="text-sm font-semibold text-grey-900">{title}</Heading>}
            {description && <p className="mt-0.5 text-xs text-grey-600">{description}</p>}
          </div>
          {actions && <div className="flex shrink-0 items-center gap-2">{actions}</div>}
        </header>
      )}
      <div className={cn("px-4 py-3", bodyClassName)}>{children}</div>
    </section>
  );
}
