/** Training: the manager's records, expiries and members' requests. */
import { PageHeader } from "@/components/ui/page-header";
import { TrainingPage } from "@/features/training/components/training-page";

export function TrainingRoute() {
  return (
    <>
      <PageHeader title="Training" description="Who may use which instrument, until when, and who may work after hours." />
      <TrainingPage />
    </>
  );
}
