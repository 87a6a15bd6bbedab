/** Instruments: the facility's potentiostats, interface cells and support equipment. */
import { PageHeader } from "@/components/ui/page-header";
import { hasRole, useUser } from "@/lib/auth";
import { InstrumentsTable } from "@/features/instruments/components/instruments-table";
import { useInstruments } from "@/features/instruments/api/get-instruments";
import { PrintLabelsButton } from "@/features/labels/components/print-labels-button";

export function InstrumentsRoute() {
  const { data: user } = useUser();
  const mayPrint = hasRole(user, "manager", "safety_officer");
  const all = useInstruments({ limit: 500 });
  return (
    <>
      <PageHeader
        title="Instruments"
        description="Potentiostats, interface cells and support equipment, with their status and booking rules. A run usually books a potentiostat and a cell together."
        actions={mayPrint && all.data ? <PrintLabelsButton instrumentIds={all.data.items.map((i) => i.id)} label="Print QR labels" /> : undefined}
      />
      <InstrumentsTable />
    </>
  );
}
