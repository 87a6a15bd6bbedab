/**
 * The manager's booking settings (shown as the facility's "booking policy"): how late a cancellation counts as late (and may be charged), how
 * long after the start a booking nobody checked in to becomes a no-show, and how early check-in
 * opens. One setting for the whole facility, validated with the shared schema.
 */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { bookingSettings, type BookingSettings } from "@shared/schemas/bookings";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { LoadingLine } from "@/components/ui/spinner";
import { useBookingSettings, useSaveBookingSettings } from "../api/booking-settings";

const FIELDS = ["lateCancelHours", "noShowGraceMinutes", "checkInEarlyMinutes"] as const;

export function BookingSettingsForm() {
  const settings = useBookingSettings();
  if (settings.isPending) return <LoadingLine label="Loading the booking policy" />;
  if (settings.isError) return <Alert tone="danger">{describeError(settings.error)}</Alert>;
  return <SettingsFormBody initial={settings.data} />;
}

function SettingsFormBody({ initial }: { initial: BookingSettings }) {
  const save = useSaveBookingSettings();
  const [msg, setMsg] = useState<{ tone: "ok" | "danger"; text: string } | null>(null);
  const { register, handleSubmit, setError, formState } = useForm({ resolver: zodResolver(bookingSettings), mode: "onTouched", defaultValues: initial });
  const errors = formState.errors;

  const onSubmit = handleSubmit(async (values) => {
    setMsg(null);
    try {
      await save.mutateAsync(values);
      setMsg({ tone: "ok", text: "Saved. The new policy applies to cancellations, check-ins and no-shows from now on." });
    } catch (e) {
      if (!applyServerFieldErrors(e, setError, FIELDS)) setMsg({ tone: "danger", text: describeError(e) });
    }
  });

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3" data-testid="booking-policy-form" noValidate>
      <div className="grid gap-3 sm:grid-cols-3">
        <Input
          label="Late-cancellation window (hours before the start)"
          type="number"
          min={0}
          {...register("lateCancelHours", { valueAsNumber: true })}
          error={errors.lateCancelHours?.message}
          hint="Cancelling inside this window is flagged for billing."
          data-testid="policy-late-cancel"
        />
        <Input
          label="No-show grace (minutes after the start)"
          type="number"
          min={5}
          {...register("noShowGraceMinutes", { valueAsNumber: true })}
          error={errors.noShowGraceMinutes?.message}
          hint="A confirmed booking nobody checked in to by then becomes a no-show."
          data-testid="policy-no-show"
        />
        <Input
          label="Check-in opens (minutes before the start)"
          type="number"
          min={0}
          {...register("checkInEarlyMinutes", { valueAsNumber: true })}
          error={errors.checkInEarlyMinutes?.message}
          data-testid="policy-check-in"
        />
      </div>
      {msg && <Alert tone={msg.tone}>{msg.text}</Alert>}
      <div className="flex justify-end">
        <Button type="submit" variant="primary" loading={save.isPending} data-testid="policy-save">
          Save policy
        </Button>
      </div>
    </form>
  );
}
