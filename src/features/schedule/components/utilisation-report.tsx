/**
 * Utilisation per instrument per month for managers: a bar chart of booked and used percent of
 * bookable hours (bars are labelled with their numbers, so no colour is needed to read them), the
 * table, and the CSV export.
 */
import { useMemo, useState } from "react";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Input } from "@/components/ui/input";
import { LoadingLine } from "@/components/ui/spinner";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { buttonClasses } from "@/components/ui/button";
import { useUtilisation, utilisationCsvHref, type UtilisationRow } from "../api/get-utilisation";

function monthOf(d: Date): string {
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}`;
}

const pct = (v: number | null) => (v === null ? "—" : `${v.toFixed(1)} %`);

function Chart({ rows }: { rows: UtilisationRow[] }) {
  // One bar pair per instrument, averaged over the chosen months by hours (not by percent).
  const per = useMemo(() => {
    const m = new Map<string, { bookable: number; booked: number; used: number }>();
    for (const r of rows) {
      const x = m.get(r.instrumentName) ?? { bookable: 0, booked: 0, used: 0 };
      x.bookable += r.bookableHours;
      x.booked += r.bookedHours;
      x.used += r.usedHours;
      m.set(r.instrumentName, x);
    }
    return [...m].map(([name, x]) => ({ name, booked: x.bookable ? (x.booked / x.bookable) * 100 : 0, used: x.bookable ? (x.used / x.bookable) * 100 : 0 }));
  }, [rows]);
  const rowH = 34;
  const width = 720;
  const label = 230;
  const scale = (v: number) => ((width - label - 60) * Math.min(v, 100)) / 100;
  return (
    <svg viewBox={`0 0 ${width} ${per.length * rowH + 24}`} className="w-full max-w-3xl" role="img" aria-label="Booked and used share of bookable hours per instrument">
      {per.map((p, i) => (
        <g key={p.name} transform={`translate(0, ${i * rowH})`}>
          <text x={0} y={20} fontSize={12} className="fill-grey-800">
            {p.name.length > 34 ? `${p.name.slice(0, 33)}…` : p.name}
          </text>
          <rect x={label} y={4} height={12} width={scale(p.booked)} className="fill-aqueous-600" />
          <text x={label + scale(p.booked) + 4} y={14} fontSize={10} className="fill-grey-800">
            booked {p.booked.toFixed(0)} %
          </text>
          <rect x={label} y={18} height={12} width={scale(p.used)} className="fill-organic-600" />
          <text x={label + scale(p.used) + 4} y={28} fontSize={10} className="fill-grey-800">
            used {p.used.toFixed(0)} %
          </text>
        </g>
      ))}
    </svg>
  );
}

export function UtilisationReport() {
  const now = new Date();
  const [q, setQ] = useState({ from: monthOf(new Date(now.getFullYear(), now.getMonth() - 2, 1)), to: monthOf(now) });
  const report = useUtilisation(q);
  const rows = report.data?.items ?? [];
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end gap-3">
        <Input label="From month" type="month" value={q.from} onChange={(e) => e.target.value && setQ((x) => ({ ...x, from: e.target.value }))} />
        <Input label="To month" type="month" value={q.to} onChange={(e) => e.target.value && setQ((x) => ({ ...x, to: e.target.value }))} />
        <a className={buttonClasses("secondary")} href={utilisationCsvHref(q)} download data-testid="utilisation-csv">
          Download CSV
        </a>
      </div>
      {report.isPending && <LoadingLine label="Computing utilisation" />}
      {report.isError && <Alert tone="danger">{describeError(report.error)}</Alert>}
      {rows.length > 0 && (
        <>
          <p className="text-xs text-grey-600">
            Bookable hours are each instrument's weekly windows in the facility's time zone ({report.data?.tz}). Booked counts confirmed, running, completed
            and no-show bookings; used counts checked-in time.
          </p>
          <Chart rows={rows} />
          <Table caption="Utilisation per instrument and month">
            <THead>
              <tr>
                <Th>Instrument</Th>
                <Th>Month</Th>
                <Th className="text-right">Bookable h</Th>
                <Th className="text-right">Booked h</Th>
                <Th className="text-right">Used h</Th>
                <Th className="text-right">Booked</Th>
                <Th className="text-right">Used</Th>
              </tr>
            </THead>
            <TBody>
              {rows.map((r) => (
                <Tr key={`${r.instrumentId}-${r.period}`}>
                  <Td>{r.instrumentName}</Td>
                  <Td>{r.period}</Td>
                  <Td className="text-right tabular-nums">{r.bookableHours.toFixed(1)}</Td>
                  <Td className="text-right tabular-nums">{r.bookedHours.toFixed(1)}</Td>
                  <Td className="text-right tabular-nums">{r.usedHours.toFixed(1)}</Td>
                  <Td className="text-right tabular-nums">{pct(r.bookedPct)}</Td>
                  <Td className="text-right tabular-nums">{pct(r.usedPct)}</Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        </>
      )}
    </div>
  );
}
