/** The rate schedule with a form for a new effective-dated rate, and the billing policy. */
import { useState } from "react";
import { CUSTOMER_CLASSES, CUSTOMER_CLASS_LABELS, INSTRUMENT_KINDS, type BillingPolicyDto, type CustomerClassName } from "@shared/schemas/recharge";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { humanize } from "@/lib/format";
import { isApiError } from "@/lib/api-client";
import { useCreateRate, useEndRate, useRates } from "../api/rates";
import { usePolicy, useSavePolicy } from "../api/billing-policy";
import { money, parseDollars } from "./money";

export function RatesPanel({ canEdit }: { canEdit: boolean }) {
  const rates = useRates();
  const endRate = useEndRate();
  return (
    <div className="flex flex-col gap-4">
      <Card title="Rate schedule" description="Hourly rates per instrument (or kind) and customer class; an instrument's own rate wins over its kind's. Dates are local days; the end day is not included.">
        <Table caption="Rates">
          <THead>
            <Tr>
              <Th>Instrument or kind</Th>
              <Th>Class</Th>
              <Th className="text-right">Per hour</Th>
              <Th>From</Th>
              <Th>Until</Th>
              <Th>Minimum / increment</Th>
              <Th>After hours</Th>
              <Th />
            </Tr>
          </THead>
          <TBody>
            {rates.data?.items.map((r) => (
              <Tr key={r.id}>
                <Td>{r.instrumentName ?? `Every ${humanize(r.instrumentKind ?? "")}`}</Td>
                <Td>{CUSTOMER_CLASS_LABELS[r.customerClass]}</Td>
                <Td className="text-right tabular-nums">{money(r.hourlyRateCents)}</Td>
                <Td>{r.effectiveFrom}</Td>
                <Td>{r.effectiveTo ?? "—"}</Td>
                <Td className="text-xs">
                  {r.minimumMinutes ?? "policy"} min / {r.roundingIncrementMinutes ?? "policy"} min
                </Td>
                <Td>{r.afterHoursFactor ? `× ${r.afterHoursFactor}` : "—"}</Td>
                <Td>
                  {r.inEffect && <Badge tone="ok">in effect</Badge>}
                  {canEdit && r.effectiveTo == null && (
                    <Button
                      type="button"
                      size="sm"
                      variant="ghost"
                      onClick={() => {
                        const to = window.prompt("Last day + 1 (YYYY-MM-DD): the first day this rate no longer applies");
                        if (to) endRate.mutate({ id: r.id, effectiveTo: to });
                      }}
                    >
                      End…
                    </Button>
                  )}
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
        {endRate.error && <Alert tone="danger" className="mt-2">{endRate.error.message}</Alert>}
      </Card>
      {canEdit && <NewRateForm />}
      <PolicyCard canEdit={canEdit} />
    </div>
  );
}

function NewRateForm() {
  const create = useCreateRate();
  const [kind, setKind] = useState<string>("potentiostat");
  const [cls, setCls] = useState<CustomerClassName>("internal");
  const [rate, setRate] = useState("");
  const [from, setFrom] = useState("");
  const [to, setTo] = useState("");
  const [minimum, setMinimum] = useState("");
  const [increment, setIncrement] = useState("");
  const [factor, setFactor] = useState("");
  const cents = parseDollars(rate);
  const errors = create.error && isApiError(create.error) ? create.error.fieldErrors : {};
  return (
    <Card title="New rate">
      <form
        className="grid grid-cols-2 gap-3 md:grid-cols-4"
        onSubmit={(e) => {
          e.preventDefault();
          if (cents === null) return;
          create.mutate({
            instrumentKind: kind as (typeof INSTRUMENT_KINDS)[number],
            customerClass: cls,
            hourlyRateCents: cents,
            effectiveFrom: from,
            effectiveTo: to || null,
            minimumMinutes: minimum ? Number(minimum) : null,
            roundingIncrementMinutes: increment ? Number(increment) : null,
            afterHoursFactor: factor ? Number(factor) : null,
          });
        }}
      >
        <Select label="Instrument kind" value={kind} onChange={(e) => setKind(e.target.value)}>
          {INSTRUMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {humanize(k)}
            </option>
          ))}
        </Select>
        <Select label="Customer class" value={cls} onChange={(e) => setCls(e.target.value as CustomerClassName)}>
          {CUSTOMER_CLASSES.map((c) => (
            <option key={c} value={c}>
              {CUSTOMER_CLASS_LABELS[c]}
            </option>
          ))}
        </Select>
        <Input label="Rate per hour" value={rate} onChange={(e) => setRate(e.target.value)} error={rate && cents === null ? "Give an amount like 45.50" : errors.hourlyRateCents} required />
        <Input label="From (local day)" type="date" value={from} onChange={(e) => setFrom(e.target.value)} error={errors.effectiveFrom} required />
        <Input label="Until (optional)" type="date" value={to} onChange={(e) => setTo(e.target.value)} error={errors.effectiveTo} />
        <Input label="Minimum charge (min)" inputMode="numeric" value={minimum} onChange={(e) => setMinimum(e.target.value)} hint="Empty: the policy's" />
        <Input label="Rounding increment (min)" inputMode="numeric" value={increment} onChange={(e) => setIncrement(e.target.value)} hint="Empty: the policy's" />
        <Input label="After-hours factor" inputMode="decimal" value={factor} onChange={(e) => setFactor(e.target.value)} hint="e.g. 1.25; empty for none" />
        <div className="col-span-full flex items-center gap-2">
          <Button type="submit" variant="primary" disabled={cents === null || !from || create.isPending}>
            Add rate
          </Button>
          {create.error && <Alert tone="danger">{create.error.message}</Alert>}
          {create.isSuccess && <Alert tone="ok">Rate added.</Alert>}
        </div>
      </form>
    </Card>
  );
}

function PolicyCard({ canEdit }: { canEdit: boolean }) {
  const { data } = usePolicy();
  const save = useSavePolicy();
  const [draft, setDraft] = useState<BillingPolicyDto | null>(null);
  const p = draft ?? data?.policy;
  if (!p) return null;
  const set = (k: keyof BillingPolicyDto) => (e: React.ChangeEvent<HTMLInputElement>) => setDraft({ ...p, [k]: Number(e.target.value) });
  return (
    <Card
      title="Billing policy"
      description="Checked-in time is billed when recorded, booked time otherwise; cleaning buffers are never billed; no-shows and late cancellations pay a share of the booked time (no minimum); consumables at unit cost plus the mark-up. Amounts round half away from zero to the cent."
    >
      <form
        className="grid grid-cols-2 gap-3 md:grid-cols-3"
        onSubmit={(e) => {
          e.preventDefault();
          save.mutate(p, { onSuccess: () => setDraft(null) });
        }}
      >
        <Input label="Rounding increment (min)" type="number" value={p.roundingIncrementMinutes} onChange={set("roundingIncrementMinutes")} disabled={!canEdit} />
        <Input label="Minimum charge (min)" type="number" value={p.minimumMinutes} onChange={set("minimumMinutes")} disabled={!canEdit} />
        <Input label="No-show share (0–1)" type="number" step="0.05" value={p.noShowShare} onChange={set("noShowShare")} disabled={!canEdit} />
        <Input label="Late-cancellation share (0–1)" type="number" step="0.05" value={p.lateCancelShare} onChange={set("lateCancelShare")} disabled={!canEdit} />
        <Input label="Cancellation window (min)" type="number" value={p.cancellationWindowMinutes} onChange={set("cancellationWindowMinutes")} disabled={!canEdit} />
        <Input label="Consumables mark-up (%)" type="number" step="0.5" value={p.consumableMarkupPercent} onChange={set("consumableMarkupPercent")} disabled={!canEdit} />
        {canEdit && (
          <div className="col-span-full flex items-center gap-2">
            <Button type="submit" variant="primary" disabled={!draft || save.isPending}>
              Save policy
            </Button>
            {save.error && <Alert tone="danger">{save.error.message}</Alert>}
          </div>
        )}
      </form>
    </Card>
  );
}
