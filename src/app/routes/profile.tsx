/** Profile: who you are in Phasebook, your roles, and a password change. */
import { ROLE_LABELS } from "@shared/schemas/auth";
import { useUser } from "@/lib/auth";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { Card } from "@/components/ui/card";
import { Badge } from "@/components/ui/badge";
import { ChangePasswordForm } from "@/features/auth/components/change-password-form";

export function ProfileRoute() {
  const { data: user } = useUser();
  if (!user) return null;
  return (
    <>
      <PageHeader {...SCREEN_HEADS.profile} />
      <div className="grid items-start gap-4 lg:grid-cols-2">
        <Card title="Account">
          <dl className="grid grid-cols-[8rem_1fr] gap-y-2 text-sm">
            <dt className="text-grey-600">Name</dt>
            <dd className="font-medium text-grey-900" data-testid="profile-name">
              {user.name}
            </dd>
            <dt className="text-grey-600">E-mail</dt>
            <dd className="text-grey-900" data-testid="profile-email">
              {user.email}
            </dd>
            <dt className="text-grey-600">Roles</dt>
            <dd className="flex flex-wrap gap-1" data-testid="profile-roles">
              {user.roles.map((r) => (
                <Badge key={r}>{ROLE_LABELS[r]}</Badge>
              ))}
            </dd>
          </dl>
        </Card>
        <Card title="Change password">
          <ChangePasswordForm />
        </Card>
      </div>
    </>
  );
}
