/**
 * Taking an instrument out of service (under maintenance) and putting it back, offered only where
 * the server's instrument policy allows it (`abilities.takeOutOfService` / `returnToService`).
 * Leaving service tells everyone with an upcoming booking by e-mail, with the note.
 */
import { useState } from "react";
import type { InstrumentDto } from "@shared/schemas/instruments";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { useUpdateInstrument } from "../api/instrument";

export function ServiceStatusControls({ instrument: i }: { instrument: InstrumentDto }) {
  const update = useUpdateInstrument(i.id);
  const [note, setNote] = useState("");
  const [msg, setMsg] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);
  if (!i.abilities.takeOutOfService && !i.abilities.returnToService) return null;

  const set = async (status: "under_maintenance" | "in_service") => {
    setMsg(null);
    try {
      await update.mutateAsync({ status, ...(note.trim() ? { statusNote: note.trim() } : {}) });
      setNote("");
      setMsg({ tone: "ok", text: status === "in_service" ? "Back in service." : "Out of service. People with upcoming bookings have been told by e-mail." });
    } catch (e) {
      setMsg({ tone: "danger", text: describeError(e) });
    }
  };

  return (
    <div className="flex flex-col gap-2" data-testid="service-status-controls">
      <div className="flex flex-wrap items-end gap-2">
        {i.abilities.takeOutOfService && (
          <>
            <Input label="Note to people with bookings (optional)" value={note} onChange={(e) => setNote(e.target.value)} maxLength={500} />
            <Button variant="danger" loading={update.isPending} onClick={() => set("under_maintenance")} data-testid="take-out-of-service">
              Take out of service
            </Button>
          </>
        )}
        {i.abilities.returnToService && (
          <Button variant="primary" loading={update.isPending} onClick={() => set("in_service")} data-testid="return-to-service">
            Put back in service
          </Button>
        )}
      </div>
      {msg && <Alert tone={msg.tone}>{msg.text}</Alert>}
    </div>
  );
}
