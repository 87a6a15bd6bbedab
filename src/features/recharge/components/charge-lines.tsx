/**
 * A statement's charge lines as a finance office reads them: date, description, quantity, unit,
 * the price of one unit and the amount. Quantities and unit prices are the exact figures the
 * server keeps (a fraction such as 1/6 h where no decimal is exact); quantity × unit price,
 * rounded once to the cent, is the amount.
 */
import type { ChargeLineDto } from "@shared/schemas/recharge";
import { CHARGE_ROUNDING_NOTE } from "@shared/domain/charges";
import { formatQuantity, formatUnitPrice } from "@shared/domain/charge-format";
import { Table, TBody, Td, Th, THead, TableMessage, Tr } from "@/components/ui/table";
import { formatDate } from "@/lib/format";
import { useFacilityZone } from "@/lib/facility";
import { money } from "./money";

export function ChargeLines({ lines, currency, caption }: { lines: ChargeLineDto[]; currency: string; caption: string }) {
  const zone = useFacilityZone();
  return (
    <div>
      <Table caption={caption}>
        <THead>
          <Tr>
            <Th>Date</Th>
            <Th>Description</Th>
            <Th className="text-right">Quantity</Th>
            <Th>Unit</Th>
            <Th className="text-right">Unit price</Th>
            <Th className="text-right">Amount</Th>
          </Tr>
        </THead>
        <TBody>
          {lines.length === 0 && <TableMessage colSpan={6}>No lines.</TableMessage>}
          {lines.map((l, i) => (
            <Tr key={l.id ?? i}>
              <Td className="whitespace-nowrap">{formatDate(l.at, zone)}</Td>
              <Td className="text-xs">{l.description}</Td>
              <Td className="text-right tabular-nums">{formatQuantity(l.quantity)}</Td>
              <Td>{l.unit}</Td>
              <Td className="text-right tabular-nums">{formatUnitPrice(l.unitPriceCents, currency)}</Td>
              <Td className="text-right tabular-nums">{money(l.amount, currency)}</Td>
            </Tr>
          ))}
        </TBody>
      </Table>
      <p className="mt-1 text-xs text-grey-600">{CHARGE_ROUNDING_NOTE}</p>
    </div>
  );
}
