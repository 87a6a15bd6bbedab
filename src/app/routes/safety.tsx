/** Safety review (safety officer, manager): totals against limits, the review lists, the printable report. The locations' limits are safety-locations.tsx (their forms stay off this page). */
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { buttonClasses } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { LocationTotals, useShownTotals } from "@/features/safety/components/location-totals";
import { ReviewLists } from "@/features/safety/components/review-lists";

export function SafetyRoute() {
  const totals = useShownTotals();
  return (
    <>
      <PageHeader
        {...SCREEN_HEADS.safety}
        actions={
          <>
            <a href="/api/safety/report.pdf" className={buttonClasses("secondary")} target="_blank" rel="noreferrer">Printable report (PDF)</a>
            <Link to={paths.safetyLocations.getHref()} className={buttonClasses("secondary")}>Locations and limits</Link>
          </>
        }
      />
      <section className="mb-6" aria-labelledby="totals-heading">
        <h2 id="totals-heading" className="mb-2 text-sm font-semibold">Flammable liquids per location</h2>
        <LocationTotals shown={totals} />
      </section>
      <ReviewLists afterTotals={totals.drawn} />
    </>
  );
}
