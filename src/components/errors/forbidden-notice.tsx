/** Shown in place of a screen the signed-in person's roles do not cover. */
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { buttonClasses } from "@/components/ui/button";

export function ForbiddenNotice() {
  return (
    <div className="mx-auto max-w-lg py-12 text-center">
      <title>Not available · Phasebook</title>
      <p className="text-xs font-medium uppercase tracking-wide text-grey-500">403 · not allowed</p>
      <h1 className="mt-1 text-lg font-semibold text-grey-900">This page is not part of your roles</h1>
      <p className="mt-2 text-grey-600">
        Your account does not include the role this page needs. If your work requires it, ask a Phasebook administrator to add the role.
      </p>
      <Link to={paths.home.getHref()} className={buttonClasses("secondary", "md", "mt-4")}>
        Back to your start page
      </Link>
    </div>
  );
}
