/** Utilisation report for managers. */
import { PageHeader } from "@/components/ui/page-header";
import { UtilisationReport } from "@/features/schedule/components/utilisation-report";

export function UtilisationRoute() {
  return (
    <>
      <PageHeader title="Utilisation" description="Booked and used hours against bookable hours, per instrument and month." />
      <UtilisationReport />
    </>
  );
}
