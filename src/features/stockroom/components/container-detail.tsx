/** One container: what and where it is, its hazard panel, quick actions, lineage, usage and movement history. */
import { Link } from "react-router-dom";
import type { ReactNode } from "react";
import { CONTAINER_KIND_LABELS, type ContainerDto } from "@shared/schemas/stock";
import { paths } from "@/config/paths";
import { describeError } from "@/lib/forms";
import { formatDate, formatDateTime, humanize } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Card } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingLine } from "@/components/ui/spinner";
import { TBody, THead, Table, TableMessage, Td, Th, Tr } from "@/components/ui/table";
import { useContainer } from "../api/get-container";
import { ContainerActions } from "./container-actions";
import { HazardPanel } from "./hazard-panel";
import { StatusBadge, formatConcentration, formatQuantity } from "./stock-format";

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs text-grey-600">{label}</dt>
      <dd className="text-sm text-grey-900">{children}</dd>
    </div>
  );
}

interface ContainerDetailProps {
  id: number;
  /** The label's print and re-issue tools, composed by the route for those who may print labels. */
  labelTools?: (container: ContainerDto) => ReactNode;
}

export function ContainerDetail({ id, labelTools }: ContainerDetailProps) {
  const q = useContainer(id);
  if (q.isPending) return <LoadingLine label="Loading the container" />;
  if (q.isError) return <Alert tone="danger">{describeError(q.error)}</Alert>;
  const { container: c, chemical, movements, usages, parents, children, locationPath, historyShown, reservations } = q.data;
  const held = reservations.filter((r) => r.state === "held");
  return (
    <>
      <PageHeader
        title={`${chemical.name} · #${c.id}`}
        description={c.kind === "solution" ? c.lot : `${CONTAINER_KIND_LABELS[c.kind]} from ${c.supplier || "an unknown supplier"}${c.lot ? `, lot ${c.lot}` : ""}`}
      />
      <div className="grid gap-4 lg:grid-cols-2">
        <div className="flex flex-col gap-4">
          <Card title="Container">
            <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3" data-testid="container-facts">
              {c.kind === "waste" ? (
                // A waste container fills rather than empties: its quantity is what has been collected, its initial quantity the capacity.
                <Fact label="Filled">
                  <span data-testid="container-quantity">{formatQuantity(c.quantity, c.unit)}</span> of {formatQuantity(c.initialQuantity, c.unit)}
                  {c.initialQuantity > 0 && (
                    <span data-testid="waste-fill">
                      {" "}({Math.round((c.quantity / c.initialQuantity) * 1000) / 10} % full)
                      {c.quantity / c.initialQuantity >= 0.8 && <strong className="block text-warning-800">Arrange collection</strong>}
                    </span>
                  )}
                </Fact>
              ) : (
                <Fact label="Left">
                  <span data-testid="container-quantity">{formatQuantity(c.quantity, c.unit)}</span> of {formatQuantity(c.initialQuantity, c.unit)}
                  {c.reservedQuantity > 0 && (
                    <span className="block text-xs text-grey-700" data-testid="container-reserved">
                      {formatQuantity(c.reservedQuantity, c.unit)} reserved for booked runs; {formatQuantity(c.freeQuantity, c.unit)} free
                    </span>
                  )}
                </Fact>
              )}
              <Fact label="Status"><StatusBadge status={c.status} chemicalHold={c.chemicalHoldReason} /></Fact>
              <Fact label="Location">{locationPath ?? <span className="text-warning-800">No location</span>}</Fact>
              {c.concentrationMolPerL !== null && <Fact label="Concentration">{formatConcentration(c.concentrationMolPerL)}</Fact>}
              <Fact label="Opened">{c.openedAt ? formatDate(c.openedAt) : "Sealed"}</Fact>
              <Fact label="Expires">{c.expiresAt ? formatDate(c.expiresAt) : "–"}</Fact>
              {c.retestAt && <Fact label="Retest by">{formatDate(c.retestAt)}</Fact>}
              <Fact label="Chemical"><Link to={paths.chemical.getHref(chemical.id)}>{chemical.name}</Link> <span className="font-mono text-xs">{chemical.casNumber}</span></Fact>
            </dl>
          </Card>
          <ContainerActions container={c} />
          {held.length > 0 && (
            <Card title="Reserved for booked runs" description="Only these bookings draw these amounts; cancelling a booking releases its share, checking in uses it.">
              <ul className="text-sm" data-testid="container-reservations">
                {held.map((r) => (
                  <li key={r.id}>
                    {formatQuantity(r.amount - r.drawn, r.unit)} for booking #{r.bookingId}
                    {r.runPlanId !== null && (
                      <>
                        {" "}(<Link to={paths.runPlan.getHref(r.runPlanId)}>run plan</Link>)
                      </>
                    )}
                  </li>
                ))}
              </ul>
            </Card>
          )}
          {labelTools && (
            <Card title="Label" description="The QR label on this container opens this page when scanned">
              <div className="flex flex-col gap-3" data-testid="container-label-tools">
                <p className="text-xs text-grey-600">Label code <span className="font-mono break-all" data-testid="container-label-token">{c.labelToken}</span></p>
                {labelTools(c)}
              </div>
            </Card>
          )}
          {(parents.length > 0 || children.length > 0) && (
            <Card title="Lineage" description="Prepared solutions and the containers they were made from">
              <div data-testid="lineage">
                {parents.length > 0 && (
                  <>
                    <p className="text-xs font-medium text-grey-700">Made from</p>
                    <ul className="mb-2 list-disc pl-5 text-sm">
                      {parents.map((p) => (
                        <li key={`${p.role}-${p.containerId}`}>
                          {humanize(p.role)}: <Link to={paths.container.getHref(p.containerId)}>{p.chemicalName} #{p.containerId}</Link> — {formatQuantity(p.amount, p.unit)}
                        </li>
                      ))}
                    </ul>
                  </>
                )}
                {children.length > 0 && (
                  <>
                    <p className="text-xs font-medium text-grey-700">Used to prepare</p>
                    <ul className="list-disc pl-5 text-sm">
                      {children.map((ch) => (
                        <li key={ch.containerId}>
                          <Link to={paths.container.getHref(ch.containerId)}>{ch.chemicalName} solution #{ch.containerId}</Link> — {formatQuantity(ch.amount, ch.unit)} as {ch.role}
                        </li>
                      ))}
                    </ul>
                  </>
                )}
              </div>
            </Card>
          )}
        </div>
        <HazardPanel chemical={chemical} />
      </div>
      <div className="mt-4 grid gap-4 lg:grid-cols-2">
        <section>
          <h2 className="mb-2 text-sm font-semibold">Usage</h2>
          {!historyShown && (
            <p className="mb-2 text-xs text-grey-600" data-testid="history-hidden">
              Who used it and at what cost is shown to its owners, the manager and the safety officer; your own usage is shown in full.
            </p>
          )}
          <Table caption="Usage of this container">
            <THead>
              <tr><Th>When</Th><Th>Who</Th><Th>Amount</Th><Th>Cost</Th><Th>Note</Th></tr>
            </THead>
            <TBody>
              {usages.length === 0 && <TableMessage colSpan={5}>Nothing logged yet.</TableMessage>}
              {usages.map((u) => (
                <Tr key={u.id}>
                  <Td>{formatDateTime(u.at)}</Td>
                  <Td>{u.userName ?? "–"}</Td>
                  <Td className="font-mono text-xs">{formatQuantity(u.amount, u.unit)}{u.unit !== c.unit && ` (${formatQuantity(u.amountInContainerUnit, c.unit)})`}</Td>
                  <Td className="font-mono text-xs">{u.costCents === null ? "–" : (u.costCents / 100).toFixed(2)}</Td>
                  <Td>{u.note}</Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        </section>
        <section>
          <h2 className="mb-2 text-sm font-semibold">Movements</h2>
          <Table caption="Where this container has been">
            <THead>
              <tr><Th>When</Th><Th>What</Th><Th>From</Th><Th>To</Th><Th>Who</Th></tr>
            </THead>
            <TBody>
              {movements.length === 0 && <TableMessage colSpan={5}>No movements recorded.</TableMessage>}
              {movements.map((m) => (
                <Tr key={m.id}>
                  <Td>{formatDateTime(m.at)}</Td>
                  <Td>{humanize(m.kind)}</Td>
                  <Td>{m.fromLocationName ?? "–"}</Td>
                  <Td>{m.toLocationName ?? "–"}</Td>
                  <Td>{m.userName ?? "–"}</Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        </section>
      </div>
    </>
  );
}
