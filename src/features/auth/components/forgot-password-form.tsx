/**
 * Asks for a reset link. The server answers 202 whatever the address, so the confirmation
 * never tells a stranger whether someone has an account.
 */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { resetRequestInput } from "@shared/schemas/auth";
import { isApiError } from "@/lib/api-client";
import { applyServerFieldErrors, describeError, tooManyRequests } from "@/lib/forms";
import { useRequestPasswordReset } from "../api/request-password-reset";
import { Input } from "@/components/ui/input";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";

export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({ resolver: zodResolver(resetRequestInput), mode: "onTouched", defaultValues: { email: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await request.mutateAsync(values);
      setSentTo(values.email);
    } catch (error) {
      if (isApiError(error, 429)) setFormError(tooManyRequests(error.retryAfterSeconds));
      else if (!applyServerFieldErrors(error, setError, ["email"])) setFormError(describeError(error));
    }
  });

  if (sentTo) {
    return (
      <Alert tone="ok">
        If <strong>{sentTo}</strong> belongs to a Phasebook account, a message with a link to choose a new password is on its
        way. The link works once and for a limited time. Nothing arriving? Check the spam folder, then ask the facility staff.
      </Alert>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Ask for a password reset link">
      {formError && <Alert tone="danger">{formError}</Alert>}
      <Input
        label="E-mail"
        type="email"
        autoComplete="email"
        inputMode="email"
        autoFocus
        required
        hint="The address you sign in with."
        error={errors.email?.message}
        {...register("email")}
      />
      <Button type="submit" variant="primary" loading={request.isPending} className="w-full">
        Send reset link
      </Button>
    </form>
  );
}
