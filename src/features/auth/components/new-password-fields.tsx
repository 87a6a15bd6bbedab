/** The "new password" and "again" pair shared by the change-password and reset-password forms. */
import type { UseFormRegisterReturn } from "react-hook-form";
import { PASSWORD_MIN } from "@shared/schemas/auth";
import { Input } from "@/components/ui/input";

interface NewPasswordFieldsProps {
  newPassword: UseFormRegisterReturn;
  repeatPassword: UseFormRegisterReturn;
  errors: { newPassword?: string; repeatPassword?: string };
  autoFocus?: boolean;
}

export function NewPasswordFields({ newPassword, repeatPassword, errors, autoFocus }: NewPasswordFieldsProps) {
  return (
    <>
      <Input
        label="New password"
        type="password"
        autoComplete="new-password"
        autoFocus={autoFocus}
        required
        hint={`At least ${PASSWORD_MIN} characters, and not a common password or one made of your e-mail address. A short sentence is easy to remember and hard to guess.`}
        error={errors.newPassword}
        {...newPassword}
      />
      <Input label="New password again" type="password" autoComplete="new-password" required error={errors.repeatPassword} {...repeatPassword} />
    </>
  );
}
