/** Forgot-password screen: asks for the address and sends a reset link. */
import { Link } from "react-router-dom";
import { paths } from "@/config/paths";
import { AuthLayout } from "@/layouts/auth-layout";
import { ForgotPasswordForm } from "@/features/auth/components/forgot-password-form";

export function ForgotPasswordRoute() {
  return (
    <AuthLayout title="Reset your password" intro="Give the e-mail address you sign in with and we will send a link to choose a new password.">
      <ForgotPasswordForm />
      <p className="mt-4 text-center text-xs">
        <Link to={paths.signIn.getHref()}>Back to sign in</Link>
      </p>
    </AuthLayout>
  );
}
