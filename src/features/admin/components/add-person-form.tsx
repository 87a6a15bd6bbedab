/** Adds a person with the shared createUserInput rules; the server's field errors land on the fields. */
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { PASSWORD_MIN } from "@shared/schemas/auth";
import { createUserInput, type UserAdminDto } from "@shared/schemas/users";
import { isApiError } from "@/lib/api-client";
import { applyServerFieldErrors, describeError } from "@/lib/forms";
import { useCreateUser } from "../api/create-user";
import { useDepartments } from "../api/get-departments";
import { useGroups } from "../api/get-groups";
import { Input } from "@/components/ui/input";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { LoadingLine } from "@/components/ui/spinner";
import { RoleCheckboxes } from "./role-checkboxes";
import { DepartmentGroupFields } from "./department-group-fields";
import { OrganisationField } from "./organisation-field";

interface AddPersonFormProps {
  onAdded: (user: UserAdminDto) => void;
  onCancel: () => void;
}

export function AddPersonForm(props: AddPersonFormProps) {
  const departments = useDepartments();
  const groups = useGroups();
  // The selects must have their options before the form mounts, or a chosen value has nothing to select.
  if (departments.isPending || groups.isPending) return <LoadingLine label="Loading departments and groups" />;
  return <AddPersonFormBody {...props} />;
}

function AddPersonFormBody({ onAdded, onCancel }: AddPersonFormProps) {
  const create = useCreateUser();
  const rolesId = useId();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm({
    resolver: zodResolver(createUserInput),
    mode: "onTouched",
    defaultValues: { name: "", email: "", roles: ["member"], password: undefined, departmentId: null, groupId: null, organisation: "" },
  });
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = form;

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      onAdded(await create.mutateAsync(values));
    } catch (error) {
      if (isApiError(error, 409)) {
        setError("email", { type: "server", message: "Someone already uses this e-mail address" }, { shouldFocus: true });
        return;
      }
      const mapped = applyServerFieldErrors(error, setError, ["name", "email", "roles", "password", "departmentId", "groupId", "organisation"]);
      if (!mapped) setFormError(describeError(error));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Add a person">
      {formError && <Alert tone="danger">{formError}</Alert>}
      <div className="grid gap-3 sm:grid-cols-2">
        <Input label="Name" autoComplete="off" required autoFocus error={errors.name?.message} {...register("name")} />
        <Input label="E-mail" type="email" autoComplete="off" required error={errors.email?.message} {...register("email")} />
      </div>
      <RoleCheckboxes id={rolesId} registration={register("roles")} error={errors.roles?.message} />
      <DepartmentGroupFields form={form} />
      <OrganisationField registration={register("organisation")} error={errors.organisation?.message} />
      <Input
        label="First password (optional)"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters, not a common password. Leave empty and the person sets one through “Forgot your password?” on the sign-in page.`}
        error={errors.password?.message}
        {...register("password", { setValueAs: (v: string) => (v === "" ? undefined : v) })}
      />
      <div className="flex justify-end gap-2 pt-1">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" loading={create.isPending}>
          Add person
        </Button>
      </div>
    </form>
  );
}
