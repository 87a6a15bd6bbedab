/**
 * The errorElement of each section: a failure while loading or rendering one screen stays inside
 * that screen's frame, with the navigation still there to go elsewhere.
 */
import { isRouteErrorResponse, Link, useRouteError } from "react-router-dom";
import { paths } from "@/config/paths";
import { ApiError } from "@/lib/api-client";
import { describeError } from "@/lib/forms";
import { Button, buttonClasses } from "@/components/ui/button";
import { ForbiddenNotice } from "@/components/errors/forbidden-notice";
import { NotFoundRoute } from "./not-found";

/** A lazy screen whose file vanished because Phasebook was redeployed while this tab stayed open. */
function isStaleChunk(error: unknown): boolean {
  return error instanceof Error && /dynamically imported module|Importing a module script failed|error loading dynamically/i.test(error.message);
}

export function SectionError() {
  const error = useRouteError();

  if (isRouteErrorResponse(error) && error.status === 404) return <NotFoundRoute />;
  if (error instanceof ApiError && error.status === 404) return <NotFoundRoute />;
  if (error instanceof ApiError && error.status === 403) return <ForbiddenNotice />;

  const stale = isStaleChunk(error);
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : describeError(error);

  return (
    <div role="alert" className="mx-auto max-w-lg py-12 text-center" data-testid="section-error">
      <title>Something went wrong · Phasebook</title>
      <h1 className="text-lg font-semibold text-grey-900">
        {stale ? "Phasebook has been updated" : "This page ran into a problem"}
      </h1>
      <p className="mt-2 text-grey-600">
        {stale
          ? "Reload to get the new version; nothing you saved is lost."
          : "The rest of Phasebook still works. Reloading often helps; if it keeps happening, tell the facility staff what you were doing."}
      </p>
      {!stale && <pre className="mt-4 overflow-x-auto rounded-md bg-grey-100 p-3 text-left font-mono text-xs text-grey-700">{message}</pre>}
      <div className="mt-4 flex justify-center gap-2">
        <Button variant="primary" onClick={() => window.location.reload()}>
          Reload
        </Button>
        <Link to={paths.home.getHref()} className={buttonClasses("secondary")}>
          Start page
        </Link>
      </div>
    </div>
  );
}
