/**
 * A saved run plan: the picture first, then the numbers, what to weigh for each phase, where
 * in the Stockroom it comes from, the reservation for a booking, the halogenated waste and the
 * cautions. Buttons follow the plan's `abilities` (the server's run-plan policy).
 */
import { useState } from "react";
import { Link } from "react-router-dom";
import type { RunPlanDto } from "@shared/schemas/run-plan-records";
import { paths } from "@/config/paths";
import { describeError } from "@/lib/forms";
import { formatSpan } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Select } from "@/components/ui/input";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { useInstrumentChoices, useMyBookingsAhead } from "../api/stock-choices";
import { useRelease, useReserve } from "../api/run-plans";
import { PotentialPicture } from "./potential-picture";
import { PlanNumbers } from "./plan-numbers";
import { formatMass, molar } from "./format";

export function RunPlanView({ plan, zone }: { plan: RunPlanDto; zone: string }) {
  return (
    <div className="flex flex-col gap-4">
      <Card title="Window and transfers" description={`Water | ${plan.preview?.solvent.name ?? plan.input.solvent}${plan.cell ? ` in ${plan.cell.name}` : ""}`}>
        {plan.problem && <Alert tone="danger">{plan.problem}</Alert>}
        {plan.preview && (
          <div className="flex flex-col gap-4">
            <PotentialPicture preview={plan.preview} solventName={plan.preview.solvent.name} />
            <PlanNumbers preview={plan.preview} />
          </div>
        )}
      </Card>
      <Weighing plan={plan} />
      <Reservation plan={plan} zone={zone} />
      <Card title="Cautions" className="border-danger-200">
        <ul className="list-disc pl-5 text-sm text-danger-900" data-testid="run-plan-cautions">
          {plan.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </Card>
    </div>
  );
}

function Weighing({ plan }: { plan: RunPlanDto }) {
  return (
    <Card title="What to weigh" description={`For the cell's ${plan.volumes.aqueousMl ?? "?"} mL of water and ${plan.volumes.organicMl ?? "?"} mL of organic phase (the solution planner: c × V × M ÷ purity).`}>
      <Table caption="Per phase">
        <THead>
          <tr>
            <Th>Phase</Th>
            <Th>What</Th>
            <Th className="text-right">c</Th>
            <Th className="text-right">Amount</Th>
            <Th className="hidden sm:table-cell">Note</Th>
          </tr>
        </THead>
        <TBody>
          {plan.weighing.map((w, i) => (
            <Tr key={i} data-testid="weigh-line">
              <Td>{w.phase}</Td>
              <Td className="font-medium">
                {w.name}
                <span className="block text-xs font-normal text-grey-700 sm:hidden">{w.note}</span>
              </Td>
              <Td className="text-right tabular-nums">{w.molPerL === null ? "—" : molar(w.molPerL)}</Td>
              <Td className="text-right font-semibold tabular-nums">{formatMass(w.amount, w.unit)}</Td>
              <Td className="hidden text-xs text-grey-700 sm:table-cell">{w.note}</Td>
            </Tr>
          ))}
        </TBody>
      </Table>
      <ul className="mt-3 flex flex-col gap-1 text-sm" data-testid="stock-lines">
        {plan.stock.map((s) => (
          <li key={s.chemicalId} className="flex flex-wrap items-center gap-2">
            <Badge tone={s.enough ? "ok" : "warning"}>{s.enough ? "in stock" : "short"}</Badge>
            <span>{s.name}:</span>
            {s.containerId !== null ? <Link to={paths.container.getHref(s.containerId)}>{s.message}</Link> : <span>{s.message}</span>}
          </li>
        ))}
        <li className="flex flex-wrap items-center gap-2" data-testid="waste-line">
          <Badge tone={plan.waste.hasRoom === false ? "warning" : "neutral"}>{plan.waste.halogenated ? "halogenated waste" : "waste"}</Badge>
          <span>{plan.waste.message}</span>
        </li>
      </ul>
    </Card>
  );
}

function Reservation({ plan, zone }: { plan: RunPlanDto; zone: string }) {
  const [now] = useState(() => new Date().toISOString());
  const bookings = useMyBookingsAhead(now);
  const instruments = useInstrumentChoices();
  const reserve = useReserve(plan.id);
  const release = useRelease(plan.id);
  const [bookingId, setBookingId] = useState<string>("");
  const [message, setMessage] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);
  const kindOf = new Map((instruments.data ?? []).map((i) => [i.id, i.kind]));
  const nameOf = new Map((instruments.data ?? []).map((i) => [i.id, i.name]));
  // Only bookings that hold a potentiostat and an interface cell can carry a run.
  const fitting = (bookings.data ?? []).filter(
    (b) => ["requested", "confirmed"].includes(b.status) && b.instrumentIds.some((id) => kindOf.get(id) === "potentiostat") && b.instrumentIds.some((id) => kindOf.get(id) === "interface_cell"),
  );
  const held = plan.reservations.filter((r) => r.state === "held");

  const doReserve = async () => {
    setMessage(null);
    try {
      await reserve.mutateAsync({ bookingId: Number(bookingId || fitting[0]?.id) });
      setMessage({ tone: "ok", text: "Reserved: nobody else can draw these amounts until your booking is checked in or cancelled." });
    } catch (e) {
      setMessage({ tone: "danger", text: describeError(e) });
    }
  };

  return (
    <Card title="Reservation" data-testid="reservation-card">
      {plan.booking && (
        <p className="mb-2 text-sm">
          For the booking of {formatSpan(plan.booking.start, plan.booking.end, zone)} on {plan.booking.instruments.join(" + ")} ({plan.booking.status.replace("_", " ")}).
        </p>
      )}
      {plan.reservations.length > 0 && (
        <Table caption="Held in the Stockroom for the booking">
          <THead>
            <tr>
              <Th>Container</Th>
              <Th>Chemical</Th>
              <Th className="text-right">Amount</Th>
              <Th>State</Th>
            </tr>
          </THead>
          <TBody>
            {plan.reservations.map((r) => (
              <Tr key={r.id} data-testid="reservation-row">
                <Td>
                  <Link to={paths.container.getHref(r.containerId)}>#{r.containerId}</Link>
                </Td>
                <Td>{r.chemicalName}</Td>
                <Td className="text-right tabular-nums">
                  {Number(r.amount.toPrecision(4))} {r.unit}
                  {r.drawn > 0 ? ` (${Number(r.drawn.toPrecision(4))} drawn)` : ""}
                </Td>
                <Td>
                  <Badge tone={r.state === "held" ? "aqueous" : r.state === "used" ? "ok" : "neutral"}>{r.state}</Badge>
                  {r.note && <span className="ml-2 text-xs text-grey-600">{r.note}</span>}
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      )}
      {plan.abilities.attach && (
        <div className="mt-2 flex flex-wrap items-end gap-2">
          {fitting.length === 0 ? (
            <p className="text-sm text-grey-700">
              You have no booking ahead with a potentiostat and an interface cell. <Link to={paths.schedule.getHref()}>Book on the Schedule</Link>, then reserve here.
            </p>
          ) : (
            <>
              <Select label="Reserve for your booking" value={bookingId || String(fitting[0].id)} onChange={(e) => setBookingId(e.target.value)} data-testid="reserve-booking">
                {fitting.map((b) => (
                  <option key={b.id} value={b.id}>
                    {formatSpan(b.start, b.end, zone)} · {b.instrumentIds.map((id) => nameOf.get(id) ?? `#${id}`).join(" + ")}
                  </option>
                ))}
              </Select>
              <Button variant="primary" loading={reserve.isPending} onClick={doReserve}>
                Reserve the stock
              </Button>
            </>
          )}
        </div>
      )}
      {plan.abilities.release && held.length > 0 && (
        <div className="mt-2">
          <Button loading={release.isPending} onClick={() => release.mutate(undefined, { onError: (e) => setMessage({ tone: "danger", text: describeError(e) }) })}>
            Release the reservation
          </Button>
        </div>
      )}
      {message && (
        <Alert tone={message.tone} className="mt-2">
          {message.text}
        </Alert>
      )}
      <p className="mt-2 text-xs text-grey-600">Cancelling the booking releases the reservation; checking in records the reserved amounts as used on the booking.</p>
    </Card>
  );
}
