/** Locations and limits (safety officer, manager): buildings, rooms, cabinets and shelves, with the flammable-liquid limits. */
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { LocationsAdmin } from "@/features/safety/components/locations-admin";

export function SafetyLocationsRoute() {
  return (
    <>
      <PageHeader {...SCREEN_HEADS.safetyLocations} />
      <LocationsAdmin />
    </>
  );
}
