/** Instruments: the facility's potentiostats, interface cells and support equipment. */
import { PageHeader } from "@/components/ui/page-header";
import { InstrumentsTable } from "@/features/instruments/components/instruments-table";

export function InstrumentsRoute() {
  return (
    <>
      <PageHeader
        title="Instruments"
        description="Potentiostats, interface cells and support equipment, with their status and booking rules. A run usually books a potentiostat and a cell together."
      />
      <InstrumentsTable />
    </>
  );
}
