/** Solution preparation. */
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { PrepareSolutionForm } from "@/features/stockroom/components/prepare-solution-form";

export function PrepareSolutionRoute() {
  return (
    <>
      <PageHeader {...SCREEN_HEADS.prepare} />
      <PrepareSolutionForm />
    </>
  );
}
