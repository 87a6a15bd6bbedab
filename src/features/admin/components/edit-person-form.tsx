/**
 * Changes a person's name, roles, department, group and organisation (PATCH /api/users/:id).
 * The Administrator role stays checked where the person's abilities say it may not be removed
 * (one's own account).
 */
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { updateUserInput, type UserAdminDto } from "@shared/schemas/users";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { useUpdateUser } from "../api/update-user";
import { useDepartments } from "../api/get-departments";
import { useGroups } from "../api/get-groups";
import { Input } from "@/components/ui/input";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { LoadingLine } from "@/components/ui/spinner";
import { RoleCheckboxes } from "./role-checkboxes";
import { DepartmentGroupFields } from "./department-group-fields";
import { OrganisationField } from "./organisation-field";

// The PATCH schema makes every field optional; this form always sends these five.
const editForm = updateUserInput.required().pick({ name: true, roles: true, departmentId: true, groupId: true, organisation: true });

interface EditPersonFormProps {
  person: UserAdminDto;
  onSaved: (user: UserAdminDto) => void;
  onCancel: () => void;
}

export function EditPersonForm(props: EditPersonFormProps) {
  const departments = useDepartments();
  const groups = useGroups();
  if (departments.isPending || groups.isPending) return <LoadingLine label="Loading departments and groups" />;
  return <EditPersonFormBody {...props} />;
}

function EditPersonFormBody({ person, onSaved, onCancel }: EditPersonFormProps) {
  const update = useUpdateUser();
  const rolesId = useId();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm({
    resolver: zodResolver(editForm),
    mode: "onTouched",
    defaultValues: { name: person.name, roles: person.roles, departmentId: person.departmentId, groupId: person.groupId, organisation: person.organisation ?? "" },
  });
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = form;
  const keepsAdmin = person.roles.includes("admin") && !person.abilities.removeAdminRole;

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSaved(await update.mutateAsync({ id: person.id, input: values }));
    } catch (error) {
      if (!applyServerFieldErrors(error, setError, ["name", "roles", "departmentId", "groupId", "organisation"])) setFormError(describeError(error));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label={`Edit ${person.name}`}>
      {formError && <Alert tone="danger">{formError}</Alert>}
      <Input label="Name" required error={errors.name?.message} {...register("name")} />
      <p className="text-xs text-grey-600">
        E-mail: <span className="font-mono">{person.email}</span>
      </p>
      <RoleCheckboxes
        id={rolesId}
        registration={register("roles")}
        error={errors.roles?.message}
        kept={keepsAdmin ? { role: "admin", reason: "You cannot remove your own Administrator role; another administrator can." } : undefined}
      />
      <DepartmentGroupFields form={form} />
      <OrganisationField registration={register("organisation")} error={errors.organisation?.message} />
      <div className="flex justify-end gap-2 pt-1">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" loading={update.isPending}>
          Save changes
        </Button>
      </div>
    </form>
  );
}
