/** Reset-password screen: the token comes from the e-mailed link's path. */
import { Link, useParams } from "react-router-dom";
import { paths } from "@/config/paths";
import { AuthLayout } from "@/layouts/auth-layout";
import { ResetPasswordForm } from "@/features/auth/components/reset-password-form";

export function ResetPasswordRoute() {
  const { token = "" } = useParams();
  return (
    <AuthLayout title="Choose a new password">
      <ResetPasswordForm token={token} />
      <p className="mt-4 text-center text-xs">
        <Link to={paths.signIn.getHref()}>Back to sign in</Link>
      </p>
    </AuthLayout>
  );
}
