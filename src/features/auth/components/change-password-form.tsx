/** A signed-in person changes their password; a wrong current password comes back onto its field. */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { changePasswordInput } from "@shared/schemas/auth";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { useChangePassword } from "../api/change-password";
import { Input } from "@/components/ui/input";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { NewPasswordFields } from "./new-password-fields";

const changeForm = changePasswordInput.extend({ repeatPassword: z.string() }).refine((v) => v.newPassword === v.repeatPassword, {
  path: ["repeatPassword"],
  message: "The two new passwords differ",
});

export function ChangePasswordForm() {
  const change = useChangePassword();
  const [changed, setChanged] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(changeForm),
    mode: "onTouched",
    defaultValues: { currentPassword: "", newPassword: "", repeatPassword: "" },
  });

  const onSubmit = handleSubmit(async ({ currentPassword, newPassword }) => {
    setFormError(null);
    setChanged(false);
    try {
      await change.mutateAsync({ currentPassword, newPassword });
      reset();
      setChanged(true);
    } catch (error) {
      if (!applyServerFieldErrors(error, setError, ["currentPassword", "newPassword"])) setFormError(describeError(error));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-sm flex-col gap-3" aria-label="Change password">
      {changed && <Alert tone="ok">Your password has been changed.</Alert>}
      {formError && <Alert tone="danger">{formError}</Alert>}
      <Input
        label="Current password"
        type="password"
        autoComplete="current-password"
        required
        error={errors.currentPassword?.message}
        {...register("currentPassword")}
      />
      <NewPasswordFields
        newPassword={register("newPassword")}
        repeatPassword={register("repeatPassword")}
        errors={{ newPassword: errors.newPassword?.message, repeatPassword: errors.repeatPassword?.message }}
      />
      <div>
        <Button type="submit" variant="primary" loading={change.isPending}>
          Change password
        </Button>
      </div>
    </form>
  );
}
