/** A screen whose work has not landed yet: its title and one line on what it will hold, so nobody mistakes it for broken. */
import type { ReactNode } from "react";
import { PageHeader } from "@/components/ui/page-header";
import { Badge } from "@/components/ui/badge";

export function PlannedScreen({ title, children }: { title: string; children: ReactNode }) {
  return (
    <>
      <PageHeader title={title} />
      <div className="flex items-start gap-3 rounded-lg border border-dashed border-grey-300 bg-white px-4 py-5" data-testid="planned-screen">
        <Badge tone="neutral">Not built yet</Badge>
        <p className="text-grey-700">{children}</p>
      </div>
    </>
  );
}
