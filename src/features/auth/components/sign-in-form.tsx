/** The sign-in form: shared loginInput rules as you type, the server's verdict in words. */
import { useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import { Link } from "react-router-dom";
import type { LoginInput, UserDto } from "@shared/schemas/auth";
import { paths } from "@/config/paths";
import { isApiError } from "@/lib/api-client";
import { useLogin } from "@/lib/auth";
import { applyServerFieldErrors, describeError, tooManyRequests } from "@/lib/forms";
import { Input } from "@/components/ui/input";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";

/**
 * The shared loginInput rules, fetched with zod on the form's first check (a field left, or
 * the submit) rather than with the page: the sign-in page then appears without them.
 */
const loginRules: Resolver<LoginInput> = async (values, context, options) => {
  const [{ zodResolver }, { loginInput }] = await Promise.all([import("@hookform/resolvers/zod"), import("@shared/schemas/auth")]);
  return zodResolver(loginInput)(values, context, options);
};

export function SignInForm({ onSignedIn }: { onSignedIn: (user: UserDto) => void }) {
  const login = useLogin();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    formState: { errors },
  } = useForm({
    resolver: loginRules,
    mode: "onTouched",
    defaultValues: { email: "", password: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSignedIn(await login.mutateAsync(values));
    } catch (error) {
      if (isApiError(error, 401)) {
        // The server answers the same for an unknown address and a wrong password; so do we.
        setFormError("E-mail or password is not right.");
        setFocus("password");
      } else if (isApiError(error, 429)) {
        setFormError(tooManyRequests(error.retryAfterSeconds));
      } else if (!applyServerFieldErrors(error, setError, ["email", "password"])) {
        setFormError(describeError(error));
      }
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Sign in">
      {formError && <Alert tone="danger">{formError}</Alert>}
      <Input
        label="E-mail"
        type="email"
        autoComplete="username"
        inputMode="email"
        autoFocus
        required
        error={errors.email?.message}
        {...register("email")}
      />
      <Input
        label="Password"
        type="password"
        autoComplete="current-password"
        required
        error={errors.password?.message}
        {...register("password")}
      />
      <Button type="submit" variant="primary" loading={login.isPending} data-testid="sign-in-submit" className="mt-1 w-full">
        Sign in
      </Button>
      <p className="text-center text-xs">
        <Link to={paths.forgot.getHref()}>Forgot your password?</Link>
      </p>
    </form>
  );
}
