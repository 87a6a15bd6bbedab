/** One part of a scanned record's page, folded until opened (a `<details>` with its title). */
import type { ReactNode } from "react";

export function Section({ title, children, testId }: { title: string; children: ReactNode; testId?: string }) {
  return (
    <details className="group rounded-md border border-grey-200 bg-white" data-testid={testId}>
      <summary className="cursor-pointer select-none px-3 py-2.5 text-sm font-medium text-grey-900">{title}</summary>
      <div className="border-t border-grey-200 p-3">{children}</div>
    </details>
  );
}
