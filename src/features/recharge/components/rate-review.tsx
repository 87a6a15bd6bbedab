/**
 * The yearly rate review: per instrument the year's costs, subsidy, carried surplus (+) or
 * deficit (−) and projected billable hours give the break-even hourly rate (2 CFR 200.468:
 * costs only, no profit, surplus or deficit folded in); compare with the rates in effect and
 * apply the result from a date.
 */
import { useState } from "react";
import type { RateReviewRowDto } from "@shared/schemas/recharge";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { api } from "@/lib/api-client";
import { useQuery } from "@tanstack/react-query";
import { useApplyRates, useReview } from "../api/rate-review";
import { money, parseDollars } from "./money";

interface Row {
  instrumentId: number;
  contracts: string;
  staff: string;
  consumables: string;
  depreciation: string;
  subsidy: string;
  carried: string;
  hours: string;
}

const blank = (instrumentId: number): Row => ({ instrumentId, contracts: "", staff: "", consumables: "", depreciation: "", subsidy: "0", carried: "0", hours: "" });

export function RateReview() {
  const instruments = useQuery({ queryKey: ["instruments", "all"], queryFn: () => api.get<{ items: { id: number; name: string }[] }>("/instruments", { query: { limit: 500 } }) });
  const [rows, setRows] = useState<Row[]>([]);
  const [academic, setAcademic] = useState("1.5");
  const [commercial, setCommercial] = useState("2.5");
  const [from, setFrom] = useState("");
  const review = useReview();
  const apply = useApplyRates();
  const [result, setResult] = useState<RateReviewRowDto[] | null>(null);
  const c = (s: string) => parseDollars(s || "0");
  const update = (i: number, k: keyof Row) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) =>
    setRows(rows.map((r, j) => (j === i ? { ...r, [k]: k === "instrumentId" ? Number(e.target.value) : e.target.value } : r)));

  return (
    <div className="flex flex-col gap-4">
      <Card title="Rate review" description="Break-even rate = (total cost − subsidy − carried surplus) ÷ projected billable hours. Other classes pay the internal rate × a factor of 1 or more.">
        <div className="flex flex-col gap-3">
          {rows.map((r, i) => (
            <div key={i} className="grid grid-cols-2 gap-2 border-b border-grey-100 pb-2 md:grid-cols-8">
              <Select label="Instrument" value={r.instrumentId} onChange={update(i, "instrumentId")}>
                {instruments.data?.items.map((x) => (
                  <option key={x.id} value={x.id}>
                    {x.name}
                  </option>
                ))}
              </Select>
              <Input label="Service contracts" value={r.contracts} onChange={update(i, "contracts")} />
              <Input label="Staff effort" value={r.staff} onChange={update(i, "staff")} />
              <Input label="Consumables" value={r.consumables} onChange={update(i, "consumables")} />
              <Input label="Depreciation" value={r.depreciation} onChange={update(i, "depreciation")} />
              <Input label="Subsidy" value={r.subsidy} onChange={update(i, "subsidy")} />
              <Input label="Carried (+surplus/−deficit)" value={r.carried} onChange={update(i, "carried")} />
              <Input label="Billable hours" inputMode="decimal" value={r.hours} onChange={update(i, "hours")} />
            </div>
          ))}
          <div className="flex flex-wrap items-end gap-2">
            <Button type="button" size="sm" onClick={() => setRows([...rows, blank(instruments.data?.items[0]?.id ?? 0)])} disabled={!instruments.data?.items.length}>
              Add instrument
            </Button>
            <Input label="External academic factor" value={academic} onChange={(e) => setAcademic(e.target.value)} />
            <Input label="Commercial factor" value={commercial} onChange={(e) => setCommercial(e.target.value)} />
            <Button
              type="button"
              variant="primary"
              disabled={rows.length === 0 || review.isPending}
              onClick={() =>
                review.mutate(
                  {
                    factors: { external_academic: Number(academic), commercial: Number(commercial) },
                    instruments: rows.map((r) => ({
                      instrumentId: r.instrumentId,
                      costLines: [
                        { label: "Service contracts", category: "service_contracts" as const, amountCents: c(r.contracts) ?? 0 },
                        { label: "Staff effort", category: "salaries" as const, amountCents: c(r.staff) ?? 0 },
                        { label: "Consumables", category: "supplies" as const, amountCents: c(r.consumables) ?? 0 },
                        { label: "Depreciation", category: "depreciation" as const, amountCents: c(r.depreciation) ?? 0 },
                      ],
                      subsidyCents: c(r.subsidy) ?? 0,
                      carriedBalanceCents: c(r.carried) ?? 0,
                      projectedBillableHours: Number(r.hours),
                    })),
                  },
                  { onSuccess: (d) => setResult(d.items) },
                )
              }
            >
              Compute
            </Button>
          </div>
          {review.error && <Alert tone="danger">{review.error.message}</Alert>}
        </div>
      </Card>
      {result && (
        <Card title="Proposed rates">
          <Table caption="Proposed against current rates">
            <THead>
              <Tr>
                <Th>Instrument</Th>
                <Th className="text-right">To recover</Th>
                <Th className="text-right">Internal (now)</Th>
                <Th className="text-right">Ext. academic (now)</Th>
                <Th className="text-right">Commercial (now)</Th>
              </Tr>
            </THead>
            <TBody>
              {result.map((r) => (
                <Tr key={r.instrumentId}>
                  <Td>{r.instrumentName}</Td>
                  <Td className="text-right tabular-nums">{money(r.recoverableCents)}</Td>
                  {(["internal", "external_academic", "commercial"] as const).map((k) => (
                    <Td key={k} className="text-right tabular-nums">
                      {money(r.proposed[k])} <span className="text-grey-500">({r.current[k] == null ? "—" : money(r.current[k]!)})</span>
                    </Td>
                  ))}
                </Tr>
              ))}
            </TBody>
          </Table>
          <div className="mt-3 flex items-end gap-2">
            <Input label="Apply from (local day)" type="date" value={from} onChange={(e) => setFrom(e.target.value)} />
            <Button
              type="button"
              variant="primary"
              disabled={!from || apply.isPending}
              onClick={() =>
                apply.mutate({
                  effectiveFrom: from,
                  rates: result.flatMap((r) => (["internal", "external_academic", "commercial"] as const).map((k) => ({ instrumentId: r.instrumentId, customerClass: k, hourlyRateCents: r.proposed[k] }))),
                })
              }
            >
              Apply these rates
            </Button>
            {apply.error && <Alert tone="danger">{apply.error.message}</Alert>}
            {apply.isSuccess && <Alert tone="ok">New rates created.</Alert>}
          </div>
        </Card>
      )}
    </div>
  );
}
