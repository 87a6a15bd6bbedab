/** Safety review (safety officer, manager): totals against limits, the review lists, the printable report; and the locations' limits. */
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { buttonClasses } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { LocationTotals } from "@/features/safety/components/location-totals";
import { ReviewLists } from "@/features/safety/components/review-lists";
import { LocationsAdmin } from "@/features/safety/components/locations-admin";

const PRECEDENCE =
  "Storage limits and handling rules are those set by the local fire code, the institution's safety office and the safety data sheet, which take precedence over anything Phasebook computes.";

export function SafetyRoute() {
  return (
    <>
      <PageHeader
        title="Safety review"
        description={PRECEDENCE}
        actions={
          <>
            <a href="/api/safety/report.pdf" className={buttonClasses("secondary")} target="_blank" rel="noreferrer">Printable report (PDF)</a>
            <Link to={paths.safetyLocations.getHref()} className={buttonClasses("secondary")}>Locations and limits</Link>
          </>
        }
      />
      <section className="mb-6" aria-labelledby="totals-heading">
        <h2 id="totals-heading" className="mb-2 text-sm font-semibold">Flammable liquids per location</h2>
        <LocationTotals />
      </section>
      <ReviewLists />
    </>
  );
}

export function SafetyLocationsRoute() {
  return (
    <>
      <PageHeader title="Locations and limits" description="Buildings, rooms, cabinets and shelves, with the flammable-liquid limits the safety office sets." />
      <LocationsAdmin />
    </>
  );
}
