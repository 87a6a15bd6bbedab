/** The page for an address Phasebook does not have. */
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { buttonClasses } from "@/components/ui/button";

export function NotFoundRoute() {
  return (
    <div className="mx-auto max-w-lg py-12 text-center" data-testid="not-found">
      <title>Page not found · Phasebook</title>
      <p className="text-xs font-medium uppercase tracking-wide text-grey-500">404 · not found</p>
      <h1 className="mt-1 text-lg font-semibold text-grey-900">There is no page at this address</h1>
      <p className="mt-2 text-grey-600">The link may be old or mistyped.</p>
      <Link to={paths.home.getHref()} className={buttonClasses("secondary", "md", "mt-4")}>
        Back to your start page
      </Link>
    </div>
  );
}
