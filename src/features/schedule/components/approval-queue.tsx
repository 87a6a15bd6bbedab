/**
 * The manager's approval queue: requests waiting for a decision, oldest start first, with the
 * decisions the server's booking policy allows on each (a request already over can only be
 * declined). Approving
 * re-checks the Schedule on the server (a 409 is shown in words); declining needs a reason,
 * which the member receives by e-mail. Times are on the facility's clock; the route passes the
 * zone and the instruments' names in.
 */
import { useState } from "react";
import type { BookingDto } from "@shared/schemas/bookings";
import { describeError } from "@/lib/forms";
import { formatSpan } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingLine } from "@/components/ui/spinner";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { useBookings } from "../api/get-bookings";
import { useBookingAction } from "../api/booking-actions";

export function ApprovalQueue({ names, zone }: { names: ReadonlyMap<number, string>; zone: string }) {
  const [from] = useState(() => new Date(Date.now() - 86_400_000).toISOString());
  const [to] = useState(() => new Date(Date.now() + 400 * 86_400_000).toISOString());
  const queue = useBookings({ status: "requested", from, to });
  const action = useBookingAction();
  const [declining, setDeclining] = useState<number | null>(null);
  const [reason, setReason] = useState("");
  const [message, setMessage] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);

  const items = (queue.data?.items ?? []).filter((b): b is BookingDto => !b.busy);

  const act = async (b: BookingDto, kind: "approve" | "decline") => {
    setMessage(null);
    try {
      await action.mutateAsync({ id: b.id, action: kind, reason: kind === "decline" ? reason : undefined });
      setMessage({ tone: "ok", text: `${kind === "approve" ? "Approved" : "Declined"}: ${b.userName}, ${formatSpan(b.start, b.end, zone)}. They have been told by e-mail.` });
      setDeclining(null);
      setReason("");
    } catch (e) {
      setMessage({ tone: "danger", text: describeError(e) });
    }
  };

  if (queue.isPending) return <LoadingLine label="Loading the approval queue" />;
  if (queue.isError) return <Alert tone="danger">{describeError(queue.error)}</Alert>;

  return (
    <div className="flex flex-col gap-3" data-testid="approval-queue">
      {message && <Alert tone={message.tone}>{message.text}</Alert>}
      {items.length === 0 ? (
        <EmptyState title="Nothing waits for approval">Requests on instruments that need your approval appear here.</EmptyState>
      ) : (
        <Table caption="Booking requests waiting for approval">
          <THead>
            <tr>
              <Th>When</Th>
              <Th>Instruments</Th>
              <Th>Who</Th>
              <Th>Account</Th>
              <Th>Purpose</Th>
              <Th className="text-right">Decision</Th>
            </tr>
          </THead>
          <TBody>
            {items.map((b) => (
              <Tr key={b.id} data-testid={`request-${b.id}`}>
                <Td>{formatSpan(b.start, b.end, zone)}</Td>
                <Td>{b.instrumentIds.map((id) => names.get(id) ?? `#${id}`).join(" + ")}</Td>
                <Td>{b.userName}</Td>
                <Td className="font-mono text-xs">{b.accountCode}</Td>
                <Td>{b.purpose || "—"}</Td>
                <Td className="text-right">
                  {declining === b.id ? (
                    <div className="flex items-end justify-end gap-2">
                      <Input label="Reason, sent to the member" value={reason} onChange={(e) => setReason(e.target.value)} data-testid="decline-reason" />
                      <Button variant="danger" size="sm" disabled={!reason.trim()} loading={action.isPending} onClick={() => act(b, "decline")}>
                        Decline
                      </Button>
                      <Button size="sm" onClick={() => setDeclining(null)}>
                        Back
                      </Button>
                    </div>
                  ) : (
                    <div className="flex justify-end gap-2">
                      {b.abilities.approve && (
                        <Button variant="primary" size="sm" loading={action.isPending} onClick={() => act(b, "approve")} data-testid={`approve-${b.id}`}>
                          Approve
                        </Button>
                      )}
                      {b.abilities.decline && (
                        <Button size="sm" onClick={() => setDeclining(b.id)}>
                          Decline…
                        </Button>
                      )}
                    </div>
                  )}
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      )}
    </div>
  );
}
