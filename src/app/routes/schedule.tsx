/** Schedule: the calendar of bookings where people pick a free slot; managers reach the approval queue from here. */
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { hasRole, useUser } from "@/lib/auth";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { buttonClasses } from "@/components/ui/button";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { LoadingLine } from "@/components/ui/spinner";
import { ScheduleCalendar } from "@/features/schedule/components/schedule-calendar";
import { useScheduleContext } from "@/app/use-schedule-context";

export function ScheduleRoute() {
  const { data: user } = useUser();
  const manager = hasRole(user, "manager");
  const ctx = useScheduleContext();
  return (
    <>
      <PageHeader
        {...SCREEN_HEADS.schedule}
        actions={
          manager ? (
            <div className="flex gap-2">
              <Link to={paths.approvals.getHref()} className={buttonClasses("secondary")} data-testid="open-approvals">
                Approval queue
              </Link>
              <Link to={paths.utilisation.getHref()} className={buttonClasses("secondary")}>
                Utilisation
              </Link>
              <Link to={paths.scheduleSettings.getHref()} className={buttonClasses("secondary")} data-testid="open-schedule-settings">
                Setups and policy
              </Link>
            </div>
          ) : undefined
        }
      />
      {ctx.error ? (
        <Alert tone="danger">{describeError(ctx.error)}</Alert>
      ) : ctx.loading || !ctx.zone ? (
        <LoadingLine label="Loading the Schedule" />
      ) : (
        <ScheduleCalendar instruments={ctx.instruments} zone={ctx.zone} />
      )}
    </>
  );
}
