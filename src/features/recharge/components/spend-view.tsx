/** Spend per account and member (group leads: their accounts), revenue and payments outstanding (manager). */
import { Badge } from "@/components/ui/badge";
import { Card } from "@/components/ui/card";
import { Table, TBody, Td, Th, THead, TableMessage, Tr } from "@/components/ui/table";
import { useOutstanding, useRevenue, useSpend } from "../api/spend-views";
import { money } from "./money";

export function SpendView({ isManager }: { isManager: boolean }) {
  const spend = useSpend();
  const revenue = useRevenue(isManager);
  const outstanding = useOutstanding(isManager);
  return (
    <div className="flex flex-col gap-4">
      {isManager && revenue.data && (
        <div className="grid gap-4 lg:grid-cols-3">
          <Card title="Revenue by month">
            <Table caption="Revenue by month">
              <THead>
                <Tr>
                  <Th>Month</Th>
                  <Th className="text-right">Internal</Th>
                  <Th className="text-right">External</Th>
                  <Th className="text-right">Total</Th>
                </Tr>
              </THead>
              <TBody>
                {revenue.data.byMonth.map((r) => (
                  <Tr key={r.period}>
                    <Td className="font-mono">{r.period}</Td>
                    <Td className="text-right tabular-nums">{money(r.internal)}</Td>
                    <Td className="text-right tabular-nums">{money(r.external)}</Td>
                    <Td className="text-right tabular-nums">{money(r.total)}</Td>
                  </Tr>
                ))}
              </TBody>
            </Table>
          </Card>
          <Card title="By instrument">
            <Table caption="Revenue by instrument">
              <TBody>
                {revenue.data.byInstrument.map((r) => (
                  <Tr key={r.instrumentId ?? "other"}>
                    <Td>{r.name}</Td>
                    <Td className="text-right tabular-nums">{r.instrumentId == null ? "" : `${r.hours} h`}</Td>
                    <Td className="text-right tabular-nums">{money(r.total)}</Td>
                  </Tr>
                ))}
              </TBody>
            </Table>
          </Card>
          <Card title="By department">
            <Table caption="Revenue by department">
              <TBody>
                {revenue.data.byDepartment.map((r) => (
                  <Tr key={`${r.external ? "external" : "internal"}-${r.departmentId ?? "none"}`}>
                    <Td>{r.name}</Td>
                    <Td className="text-right tabular-nums">{money(r.total)}</Td>
                  </Tr>
                ))}
              </TBody>
            </Table>
          </Card>
        </div>
      )}
      {isManager && (
        <Card title="Payments outstanding" description={outstanding.data ? `Total ${money(outstanding.data.sum)}` : undefined}>
          <Table caption="Invoices not yet paid">
            <THead>
              <Tr>
                <Th>Month</Th>
                <Th>Account</Th>
                <Th className="text-right">Amount</Th>
                <Th>Status</Th>
              </Tr>
            </THead>
            <TBody>
              {outstanding.data?.items.length === 0 && <TableMessage colSpan={4}>Nothing outstanding.</TableMessage>}
              {outstanding.data?.items.map((o) => (
                <Tr key={o.statementId}>
                  <Td className="font-mono">{o.period}</Td>
                  <Td>{o.accountName}</Td>
                  <Td className="text-right tabular-nums">{money(o.total, o.currency)}</Td>
                  <Td>
                    <Badge tone={o.invoiceStatus === "payment_failed" ? "danger" : o.invoiceStatus === "queued" ? "warning" : "aqueous"}>{o.invoiceStatus.replace("_", " ")}</Badge>
                    {o.lastError && <span className="ml-1 text-xs text-grey-600">{o.lastError}</span>}
                  </Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        </Card>
      )}
      <Card title={isManager ? "Spend per account and member" : "Your accounts' spend per member"}>
        <Table caption="Spend per account and member">
          <THead>
            <Tr>
              <Th>Month</Th>
              <Th>Account</Th>
              <Th>Member</Th>
              <Th className="text-right">Amount</Th>
            </Tr>
          </THead>
          <TBody>
            {spend.data?.items.length === 0 && <TableMessage colSpan={4}>No final statements yet.</TableMessage>}
            {spend.data?.items.map((s, i) => (
              <Tr key={i}>
                <Td className="font-mono">{s.period}</Td>
                <Td>
                  <span className="font-mono text-xs">{s.accountCode}</span> {s.accountName}
                </Td>
                <Td>{s.userName}</Td>
                <Td className="text-right tabular-nums">{money(s.total, spend.data.currency)}</Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      </Card>
    </div>
  );
}
