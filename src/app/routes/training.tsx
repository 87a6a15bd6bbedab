/** Training: the manager's records, expiries and members' requests. */
import { PageHeader } from "@/components/ui/page-header";
import { TrainingPage } from "@/features/training/components/training-page";
import { useInstruments } from "@/features/instruments/api/get-instruments";

export function TrainingRoute() {
  const instruments = useInstruments({ limit: 500 });
  return (
    <>
      <PageHeader title="Training" description="Who may use which instrument, until when, and who may work after hours." />
      <TrainingPage instruments={instruments.data?.items ?? []} />
    </>
  );
}
