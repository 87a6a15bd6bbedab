/** Utilisation report for managers. */
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { UtilisationReport } from "@/features/schedule/components/utilisation-report";

export function UtilisationRoute() {
  return (
    <>
      <PageHeader {...SCREEN_HEADS.utilisation} />
      <UtilisationReport />
    </>
  );
}
