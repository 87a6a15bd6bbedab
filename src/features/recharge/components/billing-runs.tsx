/**
 * Monthly billing for the manager: preview a month, finalise it, and for each run its statements
 * (their lines, the PDF), the finance journal (CSV; for a voided run its reversal too), invoice
 * status, and voiding with a reason. The newest run is open when the page opens.
 */
import { Fragment, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { Button, buttonClasses } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input } from "@/components/ui/input";
import { Table, TBody, Td, Th, THead, TableMessage, Tr } from "@/components/ui/table";
import { isApiError } from "@/lib/api-client";
import { useFinaliseRun, usePreview, useRetryInvoices, useRun, useRuns, useVoidRun } from "../api/billing-runs";
import { ChargeLines } from "./charge-lines";
import { lastMonth, money } from "./money";

const INVOICE_TONE: Record<string, BadgeTone> = { queued: "warning", open: "aqueous", paid: "ok", payment_failed: "danger", void: "neutral", none: "neutral" };
const INVOICE_WORD: Record<string, string> = {
  queued: "queued",
  open: "open",
  paid: "paid",
  payment_failed: "payment declined",
  void: "void",
  none: "journal",
};

function problemText(e: unknown): string {
  if (isApiError(e)) return [e.message, ...(e.fieldErrors ? Object.values(e.fieldErrors) : [])].join(" ");
  return e instanceof Error ? e.message : String(e);
}

export function BillingRuns() {
  const [period, setPeriod] = useState(lastMonth());
  const [previewFor, setPreviewFor] = useState<string | null>(null);
  const [selected, setSelected] = useState<number | null>(null);
  const [previewOpen, setPreviewOpen] = useState<number | null>(null);
  const runs = useRuns();
  // Until the manager picks one, the newest run is shown, so the page opens on a real month.
  const shown = selected ?? runs.data?.items[0]?.id ?? null;
  const preview = usePreview(previewFor);
  const finalise = useFinaliseRun();
  const retry = useRetryInvoices();
  const valid = /^\d{4}-(0[1-9]|1[0-2])$/.test(period);

  return (
    <div className="flex flex-col gap-4">
      <Card title="Run a month" description="Preview first: nothing is stored until you finalise. A final month is locked; later changes land in the next month as corrections.">
        <div className="flex flex-wrap items-end gap-2">
          <Input
            label="Month"
            id="run-period"
            data-testid="run-period"
            value={period}
            onChange={(e) => setPeriod(e.target.value)}
            error={valid ? undefined : "Give the month as YYYY-MM"}
            hint="YYYY-MM, a month that has ended"
          />
          <Button type="button" data-testid="preview-button" disabled={!valid} onClick={() => setPreviewFor(period)}>
            Preview
          </Button>
          <Button
            type="button"
            variant="primary"
            data-testid="finalise-button"
            disabled={!valid || finalise.isPending}
            onClick={() =>
              finalise.mutate(period, {
                onSuccess: (r) => {
                  setSelected(r.run.id);
                  setPreviewFor(null);
                },
              })
            }
          >
            {finalise.isPending ? "Finalising…" : "Finalise"}
          </Button>
        </div>
        {finalise.error && (
          <Alert tone="danger" className="mt-3">
            {problemText(finalise.error)}
          </Alert>
        )}
        {preview.error && (
          <Alert tone="danger" className="mt-3">
            {problemText(preview.error)}
          </Alert>
        )}
        {preview.data && (
          <div className="mt-3" data-testid="preview">
            {preview.data.preview.missingRates.length > 0 && (
              <Alert tone="warning" className="mb-2">
                No rate for: {preview.data.preview.missingRates.join("; ")}. Add the rates before finalising.
              </Alert>
            )}
            <Table caption={`Preview of ${preview.data.preview.period}`}>
              <THead>
                <Tr>
                  <Th>Account</Th>
                  <Th>Kind</Th>
                  <Th className="text-right">Lines</Th>
                  <Th className="text-right">Total</Th>
                  <Th>Notes</Th>
                </Tr>
              </THead>
              <TBody>
                {preview.data.preview.statements.length === 0 && <TableMessage colSpan={5}>Nothing to bill for this month.</TableMessage>}
                {preview.data.preview.statements.map((s) => (
                  <Fragment key={s.accountId}>
                    <Tr>
                      <Td>
                        <span className="font-mono text-xs">{s.accountCode}</span> {s.accountName}
                      </Td>
                      <Td>{s.accountKind}</Td>
                      <Td className="text-right tabular-nums">
                        <Button
                          type="button"
                          size="sm"
                          variant="ghost"
                          aria-expanded={previewOpen === s.accountId}
                          aria-label={`${previewOpen === s.accountId ? "Hide" : "Show"} the ${s.lines.length} lines of ${s.accountCode}`}
                          onClick={() => setPreviewOpen(previewOpen === s.accountId ? null : s.accountId)}
                        >
                          {s.lines.length} {previewOpen === s.accountId ? "▴" : "▾"}
                        </Button>
                      </Td>
                      <Td className="text-right tabular-nums">{money(s.total, s.currency)}</Td>
                      <Td className="text-xs text-warning-800">{s.warnings.join(" ")}</Td>
                    </Tr>
                    {previewOpen === s.accountId && (
                      <Tr>
                        <Td colSpan={5} className="bg-grey-50">
                          <ChargeLines lines={s.lines} currency={s.currency} caption={`Previewed lines of ${s.accountCode}`} />
                        </Td>
                      </Tr>
                    )}
                  </Fragment>
                ))}
              </TBody>
            </Table>
            <p className="mt-1 text-right font-medium tabular-nums">Total {money(preview.data.preview.total, preview.data.preview.currency)}</p>
          </div>
        )}
      </Card>

      <Card
        title="Billing runs"
        actions={
          <Button type="button" size="sm" onClick={() => retry.mutate()} disabled={retry.isPending}>
            Retry queued invoices
          </Button>
        }
      >
        <Table caption="Billing runs">
          <THead>
            <Tr>
              <Th>Month</Th>
              <Th>Status</Th>
              <Th className="text-right">Statements</Th>
              <Th className="text-right">Total</Th>
              <Th>Invoices</Th>
              <Th />
            </Tr>
          </THead>
          <TBody>
            {runs.data?.items.length === 0 && <TableMessage colSpan={6}>No month has been billed yet.</TableMessage>}
            {runs.data?.items.map((r) => (
              <Tr key={r.id} data-testid={`run-${r.period}`} className={r.id === shown ? "bg-aqueous-50/60" : undefined}>
                <Td className="font-mono">{r.period}</Td>
                <Td>
                  <Badge tone={r.status === "final" ? "ok" : "neutral"}>{r.status}</Badge>
                </Td>
                <Td className="text-right tabular-nums">{r.statementCount}</Td>
                <Td className="text-right tabular-nums">{money(r.total, r.currency)}</Td>
                <Td className="text-xs">
                  {Object.entries(r.invoices)
                    .map(([k, n]) => `${n} ${INVOICE_WORD[k] ?? k}`)
                    .join(", ")}
                </Td>
                <Td>
                  <Button type="button" size="sm" variant="ghost" onClick={() => setSelected(r.id)}>
                    Open
                  </Button>
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      </Card>
      {shown != null && <RunDetail id={shown} />}
    </div>
  );
}

function RunDetail({ id }: { id: number }) {
  const { data, error } = useRun(id);
  const voidRun = useVoidRun();
  const [reason, setReason] = useState("");
  const [open, setOpen] = useState<number | null>(null);
  if (error) return <Alert tone="danger">{problemText(error)}</Alert>;
  if (!data) return null;
  const run = data.run;
  const internal = run.statements.filter((s) => s.accountKind === "internal").reduce((a, s) => a + s.total, 0);
  return (
    <Card
      title={`Run #${run.id} · ${run.period}`}
      description={`${run.status === "final" ? "Final" : `Void (${run.voidReason ?? ""})`} · internal statements ${money(internal, run.currency)} · total ${money(run.total, run.currency)}`}
      actions={
        <div className="flex flex-wrap gap-2">
          {run.abilities.journal && (
            <a className={buttonClasses("secondary", "sm")} href={`/api/billing/runs/${run.id}/journal.csv`} download data-testid="journal-link">
              {run.status === "voided" ? "Journal, void (CSV)" : "Journal (CSV)"}
            </a>
          )}
          {run.abilities.reversal && (
            <a className={buttonClasses("secondary", "sm")} href={`/api/billing/runs/${run.id}/reversal.csv`} download data-testid="reversal-link">
              Reversing journal (CSV)
            </a>
          )}
        </div>
      }
    >
      {run.status === "voided" && (
        <Alert tone="warning" className="mb-3">
          This run is void. If its journal was posted, post the reversing journal to undo it; its file and every row of it say VOID.
        </Alert>
      )}
      <Table caption={`Statements of ${run.period}`}>
        <THead>
          <Tr>
            <Th>Account</Th>
            <Th className="text-right">Lines</Th>
            <Th className="text-right">Total</Th>
            <Th>Settlement</Th>
            <Th />
          </Tr>
        </THead>
        <TBody>
          {run.statements.map((s) => (
            <Fragment key={s.id}>
              <Tr data-testid={`statement-${s.accountCode}`}>
                <Td>
                  <span className="font-mono text-xs">{s.accountCode}</span> {s.accountName}
                </Td>
                <Td className="text-right tabular-nums">
                  <Button
                    type="button"
                    size="sm"
                    variant="ghost"
                    aria-expanded={open === s.id}
                    aria-label={`${open === s.id ? "Hide" : "Show"} the ${s.lines.length} lines of ${s.accountCode}`}
                    onClick={() => setOpen(open === s.id ? null : s.id!)}
                  >
                    {s.lines.length} {open === s.id ? "▴" : "▾"}
                  </Button>
                </Td>
                <Td className="text-right tabular-nums">{money(s.total, s.currency)}</Td>
                <Td>
                  <Badge tone={INVOICE_TONE[s.invoiceStatus ?? "none"]}>
                    <span data-testid={`invoice-status-${s.accountCode}`}>{INVOICE_WORD[s.invoiceStatus ?? "none"]}</span>
                  </Badge>
                  {s.invoiceUrl && (
                    <a className="ml-2 text-xs text-aqueous-800 underline" href={s.invoiceUrl} target="_blank" rel="noreferrer" data-testid={`invoice-link-${s.accountCode}`}>
                      Invoice {s.invoiceNumber}
                    </a>
                  )}
                </Td>
                <Td>
                  {s.abilities?.download && (
                    <a className="text-xs text-aqueous-800 underline" href={`/api/billing/statements/${s.id}/statement.pdf`} download>
                      Statement PDF
                    </a>
                  )}
                </Td>
              </Tr>
              {open === s.id && (
                <Tr>
                  <Td colSpan={5} className="bg-grey-50">
                    <ChargeLines lines={s.lines} currency={s.currency} caption={`Lines of ${s.accountCode}, ${run.period}`} />
                  </Td>
                </Tr>
              )}
            </Fragment>
          ))}
        </TBody>
      </Table>
      {run.abilities.void && (
        <form
          className="mt-3 flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            voidRun.mutate({ id: run.id, reason });
          }}
        >
          <Input label="Reason for voiding" id="void-reason" value={reason} onChange={(e) => setReason(e.target.value)} hint="Voiding unlocks the month so it can be run again." />
          <Button type="submit" variant="danger" disabled={reason.trim().length < 3 || voidRun.isPending}>
            Void this run
          </Button>
          {voidRun.error && <Alert tone="danger">{problemText(voidRun.error)}</Alert>}
        </form>
      )}
    </Card>
  );
}
