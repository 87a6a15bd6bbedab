/**
 * One instrument's page: its rules, open fault reports (anyone may report one), its upcoming
 * bookings and history; the status and rules controls where the server's instrument policy
 * allows them (`abilities`), who is trained for managers; members can ask for training here.
 */
import { useMemo, useState } from "react";
import { Link, useParams } from "react-router-dom";
import { INSTRUMENT_KIND_LABELS, INSTRUMENT_STATUS_LABELS, WEEKDAYS, type InstrumentDto } from "@shared/schemas/instruments";
import type { BookingListItem } from "@shared/schemas/bookings";
import { paths } from "@/config/paths";
import { hasRole, useUser } from "@/lib/auth";
import { describeError } from "@/lib/forms";
import { useFacilityZone } from "@/lib/facility";
import { formatDate, formatSpan } from "@/lib/format";
import { useInstrument } from "@/features/instruments/api/instrument";
import { InstrumentRulesForm } from "@/features/instruments/components/instrument-rules-form";
import { RetireInstrumentButton } from "@/features/instruments/components/retire-instrument-dialog";
import { InstrumentFaults } from "@/features/instruments/components/instrument-faults";
import { ServiceStatusControls } from "@/features/instruments/components/service-status-controls";
import { useBookings } from "@/features/schedule/api/get-bookings";
import { StatusBadge } from "@/features/schedule/components/booking-status";
import { useRequestTraining, useTrainingRecords } from "@/features/training/api/training";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input } from "@/components/ui/input";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingLine } from "@/components/ui/spinner";

function Rules({ i }: { i: InstrumentDto }) {
  const rows: [string, string][] = [
    ["Kind", INSTRUMENT_KIND_LABELS[i.kind]],
    ["Status", INSTRUMENT_STATUS_LABELS[i.status]],
    ["Training", i.trainingRequired ? "Required" : "Not required"],
    ["Approval", i.requiresApproval ? "The manager approves each booking" : "Confirmed at once"],
    ["Cleaning buffer", i.cleaningBufferMinutes ? `${i.cleaningBufferMinutes} min after each session` : "None"],
    ["Lead time", i.minLeadMinutes ? `${i.minLeadMinutes} min` : "None"],
    ["Longest booking", `${i.maxLengthMinutes} min`],
    ["After hours", i.afterHoursAllowed ? "Allowed for people with an after-hours endorsement" : "Not allowed"],
    ...(i.kind === "interface_cell"
      ? ([
          ["Interface", i.interfaceRadiusCm ? `micro-interface, radius ${i.interfaceRadiusCm * 1e4} µm` : i.interfaceAreaCm2 ? `${i.interfaceAreaCm2} cm²` : "not recorded"],
          ["Fill volumes", `${i.aqueousFillMl ?? "?"} mL water, ${i.organicFillMl ?? "?"} mL organic phase`],
        ] as [string, string][])
      : []),
    ["Bookable hours", WEEKDAYS.map((d) => `${d} ${(i.bookableHours[d] ?? []).map((w) => `${w.from}–${w.to}`).join(", ") || "closed"}`).join(" · ")],
  ];
  return (
    <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-grey-600">{k}</dt>
          <dd>{v}</dd>
        </div>
      ))}
    </dl>
  );
}

function BookingList({ items, zone }: { items: BookingListItem[]; zone: string | undefined }) {
  // Times wait for the facility's zone rather than flash in the browser's.
  if (!zone) return <LoadingLine label="Loading" />;
  if (items.length === 0) return <p className="text-sm text-grey-600">None.</p>;
  return (
    <ul className="divide-y divide-grey-100 text-sm">
      {items.map((b) => (
        <li key={b.id} className="flex items-center justify-between gap-2 py-1.5">
          <span>
            {formatSpan(b.start, b.end, zone)} {b.busy ? <span className="text-grey-600">· booked</span> : <span className="text-grey-600">· {b.userName}</span>}
          </span>
          <StatusBadge status={b.status} />
        </li>
      ))}
    </ul>
  );
}

export function InstrumentRoute() {
  const id = Number(useParams().id);
  const { data: user } = useUser();
  const manager = hasRole(user, "manager");
  const instrument = useInstrument(id);
  const zone = useFacilityZone();
  const [now] = useState(() => Date.now());
  const span = useMemo(
    () => ({ from: new Date(now - 60 * 86_400_000).toISOString(), to: new Date(now + 60 * 86_400_000).toISOString() }),
    [now],
  );
  const bookings = useBookings({ instrumentId: id, ...span });
  const trained = useTrainingRecords({ instrumentId: id });
  const ask = useRequestTraining();
  const [note, setNote] = useState("");
  const [askMsg, setAskMsg] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);

  if (instrument.isPending) return <LoadingLine label="Loading the instrument" />;
  if (instrument.isError) return <Alert tone="danger">{describeError(instrument.error)}</Alert>;
  const i = instrument.data;
  const all = bookings.data?.items ?? [];
  const upcoming = all.filter((b) => new Date(b.end).getTime() > now);
  const history = all.filter((b) => new Date(b.end).getTime() <= now).reverse();
  const mine = (trained.data?.items ?? []).find((r) => r.userId === user?.id);

  return (
    <>
      <PageHeader title={i.name} description={i.description} actions={
          <div className="flex items-center gap-3">
            <Link to={paths.schedule.getHref()}>Open the Schedule</Link>
            {i.abilities.edit && <RetireInstrumentButton instrument={i} />}
          </div>
        }
      />
      <div className="flex flex-col gap-4">
        <Card title="Booking rules">
          <Rules i={i} />
        </Card>
        {(i.abilities.takeOutOfService || i.abilities.returnToService) && (
          <Card title="Service">
            <ServiceStatusControls instrument={i} />
          </Card>
        )}
        <InstrumentFaults instrument={i} zone={zone} />
        {!manager && i.trainingRequired && (
          <Card title="Your training">
            {mine && mine.state !== "none" ? (
              <p className="text-sm">You are trained on this instrument ({mine.state}).</p>
            ) : (
              <div className="flex flex-wrap items-end gap-2">
                <Input label="Ask the facility manager for training (optional note)" value={note} onChange={(e) => setNote(e.target.value)} />
                <Button
                  variant="primary"
                  loading={ask.isPending}
                  onClick={async () => {
                    try {
                      await ask.mutateAsync({ instrumentId: id, note });
                      setAskMsg({ tone: "ok", text: "Asked. The facility manager will arrange a session." });
                    } catch (e) {
                      setAskMsg({ tone: "danger", text: describeError(e) });
                    }
                  }}
                >
                  Ask for training
                </Button>
              </div>
            )}
            {askMsg && <Alert tone={askMsg.tone} className="mt-2">{askMsg.text}</Alert>}
          </Card>
        )}
        {i.abilities.edit && (
          <Card title="Edit status and rules">
            <InstrumentRulesForm key={JSON.stringify(i)} instrument={i} />
          </Card>
        )}
        {manager && (
          <Card title="Trained people">
            <ul className="text-sm">
              {(trained.data?.items ?? []).map((r) => (
                <li key={r.id}>
                  {r.userName} · {r.state}
                  {r.expiresAt ? ` until ${formatDate(r.expiresAt, zone)}` : ""}
                  {r.afterHours ? " · after hours" : ""}
                </li>
              ))}
            </ul>
          </Card>
        )}
        <Card title="Upcoming bookings (60 days)">
          <BookingList items={upcoming} zone={zone} />
        </Card>
        <Card title="History (last 60 days)">
          <BookingList items={history} zone={zone} />
        </Card>
      </div>
    </>
  );
}
