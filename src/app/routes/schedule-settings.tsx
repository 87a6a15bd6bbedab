/** The manager's Schedule settings: the facility's booking policy and the setups people book. */
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { Card } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { BookingSettingsForm } from "@/features/schedule/components/booking-settings-form";
import { SetupsEditor } from "@/features/schedule/components/setups-editor";
import { useInstruments } from "@/features/instruments/api/get-instruments";
import { LoadingLine } from "@/components/ui/spinner";

export function ScheduleSettingsRoute() {
  const instruments = useInstruments({ limit: 500 });
  return (
    <>
      <PageHeader
        {...SCREEN_HEADS.scheduleSettings}
        actions={<Link to={paths.schedule.getHref()}>Back to the Schedule</Link>}
      />
      <div className="flex flex-col gap-4">
        <Card title="Booking policy">
          <BookingSettingsForm />
        </Card>
        <Card title="Setups" description="Named sets of instruments that are booked together, offered in the booking form and the Schedule's filter.">
          {instruments.isPending ? <LoadingLine label="Loading instruments" /> : <SetupsEditor instruments={instruments.data?.items ?? []} />}
        </Card>
      </div>
    </>
  );
}
