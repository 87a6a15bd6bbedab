/**
 * Retiring an instrument: it leaves the Schedule for good (bookings are refused) and everyone
 * with an upcoming booking on it is told by e-mail, with the manager's note.
 */
import { useState } from "react";
import type { InstrumentDto } from "@shared/schemas/instruments";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Input } from "@/components/ui/input";
import { useUpdateInstrument } from "../api/instrument";

export function RetireInstrumentButton({ instrument }: { instrument: InstrumentDto }) {
  const update = useUpdateInstrument(instrument.id);
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | null>(null);

  const close = () => {
    setOpen(false);
    setNote("");
    setError(null);
  };
  const retire = async () => {
    setError(null);
    try {
      await update.mutateAsync({ status: "retired", ...(note.trim() ? { statusNote: note.trim() } : {}) });
      close();
    } catch (e) {
      setError(describeError(e));
    }
  };

  if (instrument.status === "retired") return null;
  return (
    <>
      <Button variant="danger" onClick={() => setOpen(true)} data-testid="retire-instrument">
        Retire…
      </Button>
      <Dialog
        open={open}
        onClose={close}
        title={`Retire ${instrument.name}`}
        description="It can no longer be booked. People with upcoming bookings on it are told by e-mail; cancel or move their bookings afterwards."
      >
        <form
          className="flex flex-col gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            void retire();
          }}
        >
          <Input label="Note to people with bookings (optional)" value={note} onChange={(e) => setNote(e.target.value)} maxLength={500} data-testid="retire-note" />
          {error && <Alert tone="danger">{error}</Alert>}
          <div className="flex justify-end gap-2">
            <Button onClick={close}>Keep in service</Button>
            <Button type="submit" variant="danger" loading={update.isPending} data-testid="retire-confirm">
              Retire
            </Button>
          </div>
        </form>
      </Dialog>
    </>
  );
}
