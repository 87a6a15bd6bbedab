/** Sign-in screen: after signing in, go where the person was heading (`next`) or to their start page. */
import { Navigate, useNavigate, useSearchParams } from "react-router-dom";
import { safeNext } from "@/config/paths";
import { useUser } from "@/lib/auth";
import { AuthLayout } from "@/layouts/auth-layout";
import { SignInForm } from "@/features/auth/components/sign-in-form";
import { FullPageSpinner } from "@/components/ui/spinner";

export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const { data: user, isPending } = useUser();
  const next = safeNext(params.get("next"));

  if (isPending) return <FullPageSpinner label="Checking your session" />;
  if (user) return <Navigate to={next} replace />;

  return (
    <AuthLayout title="Sign in to Phasebook">
      <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
    </AuthLayout>
  );
}
