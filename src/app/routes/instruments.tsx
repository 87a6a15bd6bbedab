/** Instruments: the facility's potentiostats, interface cells and support equipment; managers add them here. */
import { useState } from "react";
import { useNavigate } from "react-router-dom";
import { paths } from "@/config/paths";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { hasRole, useUser } from "@/lib/auth";
import { InstrumentsTable } from "@/features/instruments/components/instruments-table";
import { useInstruments } from "@/features/instruments/api/get-instruments";
import { PrintLabelsButton } from "@/features/labels/components/print-labels-button";
import { AddInstrumentForm } from "@/features/instruments/components/add-instrument-form";

export function InstrumentsRoute() {
  const { data: user } = useUser();
  const mayPrint = hasRole(user, "manager", "safety_officer");
  const manager = hasRole(user, "manager");
  const all = useInstruments({ limit: 500 });
  const [adding, setAdding] = useState(false);
  const navigate = useNavigate();
  return (
    <>
      <PageHeader
        {...SCREEN_HEADS.instruments}
        actions={
          <div className="flex gap-2">
            {manager && (
              <Button variant="primary" onClick={() => setAdding(true)} data-testid="add-instrument">
                Add instrument
              </Button>
            )}
            {mayPrint && all.data && <PrintLabelsButton instrumentIds={all.data.items.map((i) => i.id)} label="Print QR labels" />}
          </div>
        }
      />
      <InstrumentsTable />
      {manager && (
        <Dialog open={adding} onClose={() => setAdding(false)} title="Add an instrument" className="w-[min(44rem,calc(100vw-2rem))]">
          <AddInstrumentForm onCancel={() => setAdding(false)} onAdded={(i) => navigate(paths.instrument.getHref(i.id))} />
        </Dialog>
      )}
    </>
  );
}
