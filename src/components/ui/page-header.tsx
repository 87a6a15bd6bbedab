/** The title row of every screen; it also sets the browser tab's title (React 19 hoists <title>). */
import type { ReactNode } from "react";

interface PageHeaderProps {
  title: string;
  description?: ReactNode;
  actions?: ReactNode;
}

export function PageHeader({ title, description, actions }: PageHeaderProps) {
  return (
    <div className="mb-4 flex flex-wrap items-end justify-between gap-3 border-b border-grey-200 pb-3">
      <title>{`${title} · Phasebook`}</title>
      <div className="min-w-0">
        <h1 className="text-lg font-semibold tracking-tight text-grey-900">{title}</h1>
        {description && <p className="mt-0.5 max-w-3xl text-grey-600">{description}</p>}
      </div>
      {actions && <div className="flex flex-wrap items-center gap-2">{actions}</div>}
    </div>
  );
}
