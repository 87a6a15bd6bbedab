/** Training: the manager's records, expiries and members' requests. */
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { TrainingPage } from "@/features/training/components/training-page";
import { useInstruments } from "@/features/instruments/api/get-instruments";

export function TrainingRoute() {
  const instruments = useInstruments({ limit: 500 });
  return (
    <>
      <PageHeader {...SCREEN_HEADS.training} />
      <TrainingPage instruments={instruments.data?.items ?? []} />
    </>
  );
}
