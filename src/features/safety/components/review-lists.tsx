/** The Safety review's lists: hazardous substances and where, expired stock, no location, holds, halogenated waste, chemicals whose sheet is due, and each sheet past its review period. */
import { useDeferredValue, type ReactNode } from "react";
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { describeError } from "@/lib/forms";
import { formatDate } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Card } from "@/components/ui/card";
import { LoadingLine } from "@/components/ui/spinner";
import { useReview, type ReviewContainer } from "../api/get-review";
import { useSdsDue } from "../api/get-sds-due";

const qty = (c: ReviewContainer) => `${Number(c.quantity.toPrecision(4))} ${c.unit}`;

function ContainerLine({ c, extra }: { c: ReviewContainer; extra?: ReactNode }) {
  return (
    <li>
      <Link to={paths.container.getHref(c.id)}>#{c.id} {c.chemicalName}</Link>, {qty(c)} — {c.locationPath ?? <strong>no location</strong>}
      {extra && <> · {extra}</>}
    </li>
  );
}

function List({ title, empty, children, count }: { title: string; empty: string; count: number; children: ReactNode }) {
  return (
    <Card title={`${title} (${count})`}>
      {count === 0 ? <p className="text-sm text-grey-600">{empty}</p> : <ul className="flex flex-col gap-1 text-sm">{children}</ul>}
    </Card>
  );
}

/** Each sheet on file that is past the review period, with its file, so the officer can open it and replace it. */
function SheetsPastReview({ months }: { months: number }) {
  const q = useSdsDue();
  const sheets = useDeferredValue(q.data);
  if (q.isError) return <Alert tone="danger">{describeError(q.error)}</Alert>;
  if (sheets === undefined) return <LoadingLine label="Loading the sheets" />;
  return (
    <List title={`Sheets older than the review period (${months} months)`} empty="No sheet on file is past its review period." count={sheets.length}>
      {sheets.map((s) => (
        <li key={s.id} data-testid={`sds-due-${s.id}`}>
          <Link to={paths.chemical.getHref(s.chemicalId)}>{s.chemicalName ?? `Chemical #${s.chemicalId}`}</Link>:{" "}
          <a href={`/api/sds/${s.id}/file`}>{s.originalName}</a>, reviewed {formatDate(s.reviewedOn)}{s.supplier && ` (${s.supplier})`}
        </li>
      ))}
    </List>
  );
}

/**
 * `afterTotals`: the totals above are drawn (useShownTotals). Until then the lists draw nothing, so
 * the totals arriving never push them down the page; in the render that draws the totals,
 * useDeferredValue gives the review at once (React does not defer again in a deferred render), so
 * the lists come with the totals or after them, never before. A review arriving later renders as a
 * transition, in slices, not in one long task.
 */
export function ReviewLists({ afterTotals }: { afterTotals: boolean }) {
  const r = useReview();
  const d = useDeferredValue(afterTotals ? r.data : undefined);
  if (!afterTotals) return null;
  if (r.isError) return <Alert tone="danger">{describeError(r.error)}</Alert>;
  if (d === undefined) return <LoadingLine label="Loading the review" />;
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <List title="Carcinogens and acutely toxic substances" empty="None on record." count={d.hazardous.length}>
        {d.hazardous.map((h) => (
          <li key={h.chemicalId}>
            <Link to={paths.chemical.getHref(h.chemicalId)} className="font-medium">{h.name}</Link>{" "}
            {h.carcinogen && <Badge tone="danger">Carcinogen</Badge>} {h.acuteToxic && <Badge tone="danger">Acutely toxic</Badge>}
            <ul className="ml-4 list-disc pl-3 text-grey-700">
              {h.containers.length === 0 && <li>No containers in stock.</li>}
              {h.containers.map((c) => <ContainerLine key={c.id} c={c} />)}
            </ul>
          </li>
        ))}
      </List>
      <List title="Expired or past retest" empty="Nothing is past its date." count={d.expired.length}>
        {d.expired.map((c) => (
          <ContainerLine key={c.id} c={c} extra={c.expiresAt && c.expiresAt < d.today ? `expired ${formatDate(c.expiresAt)}` : `retest was due ${formatDate(c.retestAt!)}`} />
        ))}
      </List>
      <List title="On hold" empty="Nothing is on hold." count={d.onHold.containers.length + d.onHold.chemicals.length}>
        {d.onHold.chemicals.map((ch) => (
          <li key={`chem-${ch.chemicalId}`}>Chemical <Link to={paths.chemical.getHref(ch.chemicalId)}>{ch.name}</Link>: {ch.reason}</li>
        ))}
        {d.onHold.containers.map((c) => <ContainerLine key={c.id} c={c} extra={c.holdReason ?? "no reason given"} />)}
      </List>
      <List title="Without a location" empty="Every container has a place." count={d.noLocation.length}>
        {d.noLocation.map((c) => <ContainerLine key={c.id} c={c} />)}
      </List>
      <List title="Halogenated waste" empty="No halogenated waste container in use." count={d.halogenatedWaste.length}>
        {d.halogenatedWaste.map((w) => (
          <ContainerLine key={w.id} c={w} extra={<>{w.fillPercent === null ? "fill unknown" : `${w.fillPercent} % full`}{w.fillPercent !== null && w.fillPercent >= 80 && <> <Badge tone="warning">Arrange collection</Badge></>}</>} />
        ))}
      </List>
      <List title={`Safety data sheets due (older than ${d.sdsReviewMonths} months, or missing)`} empty="Every sheet is current." count={d.sdsDue.length}>
        {d.sdsDue.map((s) => (
          <li key={s.chemicalId}><Link to={paths.chemical.getHref(s.chemicalId)}>{s.name}</Link>: {s.reviewedOn ? `reviewed ${formatDate(s.reviewedOn)}` : "no sheet on file"}</li>
        ))}
      </List>
      <SheetsPastReview months={d.sdsReviewMonths} />
    </div>
  );
}
