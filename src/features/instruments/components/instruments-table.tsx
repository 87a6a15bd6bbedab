/** The instrument list: what each potentiostat, cell and support item is, whether it can be booked, and its rules at a glance. */
import { INSTRUMENT_KIND_LABELS, INSTRUMENT_STATUS_LABELS, type InstrumentDto, type InstrumentStatus } from "@shared/schemas/instruments";
import { describeError } from "@/lib/forms";
import { useInstruments } from "../api/get-instruments";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { Alert } from "@/components/ui/alert";
import { TBody, THead, Table, TableMessage, Td, Th, Tr } from "@/components/ui/table";
import { Spinner } from "@/components/ui/spinner";

const STATUS_TONES: Record<InstrumentStatus, BadgeTone> = {
  in_service: "ok",
  under_maintenance: "warning",
  retired: "neutral",
};

function minutes(value: number): string {
  if (value === 0) return "none";
  if (value % 60 === 0) return `${value / 60} h`;
  return value > 60 ? `${Math.floor(value / 60)} h ${value % 60} min` : `${value} min`;
}

function details(i: InstrumentDto): string {
  const parts: string[] = [];
  if (i.kind === "potentiostat") parts.push(i.fourElectrode ? "four-electrode" : "no four-electrode mode");
  if (i.interfaceAreaCm2 !== null) parts.push(`interface ${i.interfaceAreaCm2} cm²`);
  if (i.model) parts.push(i.model);
  return parts.join(" · ");
}

export function InstrumentsTable() {
  const instruments = useInstruments({ limit: 500 });
  const COLS = 6;

  if (instruments.isError) return <Alert tone="danger">{describeError(instruments.error)}</Alert>;

  return (
    <Table caption="Instruments of the facility">
      <THead>
        <tr>
          <Th>Name</Th>
          <Th>Kind</Th>
          <Th>Status</Th>
          <Th>Booking</Th>
          <Th className="text-right">Cleaning buffer</Th>
          <Th className="text-right">Longest booking</Th>
        </tr>
      </THead>
      <TBody>
        {instruments.isPending && (
          <TableMessage colSpan={COLS}>
            <span className="inline-flex items-center gap-2">
              <Spinner size="sm" className="text-aqueous-600" /> Loading instruments…
            </span>
          </TableMessage>
        )}
        {instruments.data?.items.length === 0 && <TableMessage colSpan={COLS}>No instruments have been entered yet.</TableMessage>}
        {instruments.data?.items.map((i) => (
          <Tr key={i.id}>
            <Td>
              <p className="font-medium text-grey-900">{i.name}</p>
              {details(i) && <p className="text-xs text-grey-600">{details(i)}</p>}
            </Td>
            <Td>{INSTRUMENT_KIND_LABELS[i.kind]}</Td>
            <Td>
              <Badge tone={STATUS_TONES[i.status]}>{INSTRUMENT_STATUS_LABELS[i.status]}</Badge>
            </Td>
            <Td>
              <div className="flex flex-wrap gap-1">
                <Badge tone={i.requiresApproval ? "organic" : "neutral"}>{i.requiresApproval ? "Needs approval" : "Automatic"}</Badge>
                {i.trainingRequired && <Badge tone="neutral">Training required</Badge>}
              </div>
            </Td>
            <Td className="text-right font-mono text-xs">{minutes(i.cleaningBufferMinutes)}</Td>
            <Td className="text-right font-mono text-xs">{minutes(i.maxLengthMinutes)}</Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
