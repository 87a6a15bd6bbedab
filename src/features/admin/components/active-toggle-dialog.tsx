/** Confirms deactivating or reactivating a person before the PATCH goes out. */
import { Dialog } from "@/components/ui/dialog";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { describeError } from "@/lib/forms";
import type { UserAdminDto } from "@shared/schemas/users";
import { useUpdateUser } from "../api/update-user";

interface ActiveToggleDialogProps {
  person: UserAdminDto | null;
  onClose: () => void;
}

export function ActiveToggleDialog({ person, onClose }: ActiveToggleDialogProps) {
  const update = useUpdateUser();
  const deactivating = person?.active ?? true;

  const confirm = () => {
    if (!person) return;
    update.mutate({ id: person.id, input: { active: !person.active } }, { onSuccess: onClose });
  };
  const close = () => {
    update.reset();
    onClose();
  };

  return (
    <Dialog
      open={person !== null}
      onClose={close}
      title={deactivating ? `Deactivate ${person?.name ?? ""}?` : `Reactivate ${person?.name ?? ""}?`}
      description={
        deactivating
          ? "They can no longer sign in. Their bookings, usage and statements stay in Phasebook, and you can reactivate them later."
          : "They can sign in again with their existing password and the roles they had."
      }
    >
      {update.isError && <Alert tone="danger">{describeError(update.error)}</Alert>}
      <div className="flex justify-end gap-2">
        <Button onClick={close}>Cancel</Button>
        <Button variant={deactivating ? "danger" : "primary"} loading={update.isPending} onClick={confirm} data-testid="confirm-active-toggle">
          {deactivating ? "Deactivate" : "Reactivate"}
        </Button>
      </div>
    </Dialog>
  );
}
