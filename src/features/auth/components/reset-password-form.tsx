/** Chooses a new password from an e-mailed link; a used or expired link is explained with a way forward. */
import { useState, type ReactNode } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { Link } from "react-router-dom";
import { z } from "zod";
import { resetConfirmInput } from "@shared/schemas/auth";
import { paths } from "@/config/paths";
import { isApiError } from "@/lib/api-client";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { useConfirmPasswordReset } from "../api/confirm-password-reset";
import { NewPasswordFields } from "./new-password-fields";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";

const resetForm = resetConfirmInput
  .pick({ newPassword: true })
  .extend({ repeatPassword: z.string() })
  .refine((v) => v.newPassword === v.repeatPassword, {
    path: ["repeatPassword"],
    message: "The two passwords differ",
  });

function LinkProblem({ children }: { children: ReactNode }) {
  return (
    <Alert tone="danger">
      {children} <Link to={paths.forgot.getHref()}>Ask for a new link</Link>.
    </Alert>
  );
}

export function ResetPasswordForm({ token }: { token: string }) {
  const confirm = useConfirmPasswordReset();
  const [done, setDone] = useState(false);
  const [linkError, setLinkError] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(resetForm),
    mode: "onTouched",
    defaultValues: { newPassword: "", repeatPassword: "" },
  });

  const tokenCheck = resetConfirmInput.shape.token.safeParse(token);
  if (!tokenCheck.success) {
    return <LinkProblem>This reset link is incomplete; it may have been cut off when it was copied.</LinkProblem>;
  }

  const onSubmit = handleSubmit(async ({ newPassword }) => {
    setFormError(null);
    setLinkError(null);
    try {
      await confirm.mutateAsync({ token, newPassword });
      setDone(true);
    } catch (error) {
      if (isApiError(error, 422) && !error.fieldErrors.newPassword) {
        setLinkError(error.message || "This link has been used or has expired.");
      } else if (isApiError(error) && error.fieldErrors.token) {
        setLinkError(error.fieldErrors.token);
      } else if (!applyServerFieldErrors(error, setError, ["newPassword"])) {
        setFormError(describeError(error));
      }
    }
  });

  if (done) {
    return (
      <Alert tone="ok">
        Your new password is set. <Link to={paths.signIn.getHref()}>Sign in with it</Link>.
      </Alert>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Choose a new password">
      {linkError && <LinkProblem>{linkError}</LinkProblem>}
      {formError && <Alert tone="danger">{formError}</Alert>}
      <NewPasswordFields
        autoFocus
        newPassword={register("newPassword")}
        repeatPassword={register("repeatPassword")}
        errors={{ newPassword: errors.newPassword?.message, repeatPassword: errors.repeatPassword?.message }}
      />
      <Button type="submit" variant="primary" loading={confirm.isPending} className="w-full">
        Set new password
      </Button>
    </form>
  );
}
