/** A member's own charges from final statements: what their sessions and consumables cost. */
import { PageHeader } from "@/components/ui/page-header";
import { Table, TBody, Td, Th, THead, TableMessage, Tr } from "@/components/ui/table";
import { formatQuantity, formatUnitPrice } from "@shared/domain/charge-format";
import { formatDate } from "@/lib/format";
import { useFacilityZone } from "@/lib/facility";
import { useMyCharges } from "../api/spend-views";
import { money } from "./money";

export function MyCharges() {
  const { data, isLoading } = useMyCharges();
  const zone = useFacilityZone();
  return (
    <div>
      <PageHeader title="My charges" description={data ? `${data.total} line(s) on final statements, ${money(data.sum, data.currency)} in all.` : "What your sessions and consumables cost, from final monthly statements."} />
      <Table caption="My charges">
        <THead>
          <Tr>
            <Th>Month</Th>
            <Th>Date</Th>
            <Th>Account</Th>
            <Th>Charge</Th>
            <Th className="text-right">Quantity</Th>
            <Th>Unit</Th>
            <Th className="text-right">Unit price</Th>
            <Th className="text-right">Amount</Th>
          </Tr>
        </THead>
        <TBody>
          {isLoading && <TableMessage colSpan={8}>Loading…</TableMessage>}
          {data?.items.length === 0 && <TableMessage colSpan={8}>No charges on a final statement yet.</TableMessage>}
          {data?.items.map((c) => (
            <Tr key={c.id}>
              <Td className="font-mono">{c.period}</Td>
              <Td>{formatDate(c.at, zone)}</Td>
              <Td className="font-mono text-xs">{c.accountCode}</Td>
              <Td className="text-xs">{c.description}</Td>
              <Td className="text-right tabular-nums">{formatQuantity(c.quantity)}</Td>
              <Td>{c.unit}</Td>
              <Td className="text-right tabular-nums">{formatUnitPrice(c.unitPriceCents, data.currency)}</Td>
              <Td className="text-right tabular-nums">{money(c.amount, data.currency)}</Td>
            </Tr>
          ))}
        </TBody>
      </Table>
    </div>
  );
}
