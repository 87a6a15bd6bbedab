/** Solution preparation. */
import { PageHeader } from "@/components/ui/page-header";
import { PrepareSolutionForm } from "@/features/stockroom/components/prepare-solution-form";

export function PrepareSolutionRoute() {
  return (
    <>
      <PageHeader title="Prepare a solution" description="Phasebook computes the mass to weigh, records the concentration you actually made, and deducts both containers." />
      <PrepareSolutionForm />
    </>
  );
}
