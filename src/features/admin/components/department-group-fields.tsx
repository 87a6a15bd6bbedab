/**
 * Department and research group choices for the person forms. The group list narrows to the
 * chosen department, and a group from another department is cleared when the department changes.
 */
import type { FieldValues, Path, PathValue, UseFormReturn } from "react-hook-form";
import { Select } from "@/components/ui/input";
import { useDepartments } from "../api/get-departments";
import { useGroups } from "../api/get-groups";

interface OrgFields extends FieldValues {
  departmentId?: number | string | null;
  groupId?: number | string | null;
}

const toId = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));

export function DepartmentGroupFields<T extends OrgFields>({ form }: { form: UseFormReturn<T> }) {
  const departments = useDepartments();
  const groups = useGroups();
  const dept = "departmentId" as Path<T>;
  const group = "groupId" as Path<T>;
  const departmentId = form.watch(dept) as number | null | undefined;
  const groupOptions = (groups.data?.items ?? []).filter((g) => !departmentId || g.departmentId === departmentId);
  const errors = form.formState.errors as { departmentId?: { message?: string }; groupId?: { message?: string } };

  return (
    <div className="grid gap-3 sm:grid-cols-2">
      <Select
        label="Department"
        error={errors.departmentId?.message}
        disabled={departments.isPending}
        {...form.register(dept, {
          setValueAs: toId,
          onChange: (e: { target: { value: string } }) => {
            const nextDept = toId(e.target.value);
            const currentGroup = form.getValues(group) as number | null | undefined;
            const stillFits = groups.data?.items.some((g) => g.id === currentGroup && (!nextDept || g.departmentId === nextDept));
            if (currentGroup && !stillFits) form.setValue(group, null as PathValue<T, Path<T>>);
          },
        })}
      >
        <option value="">No department</option>
        {departments.data?.items.map((d) => (
          <option key={d.id} value={d.id}>
            {d.name} ({d.code})
          </option>
        ))}
      </Select>
      <Select
        label="Research group"
        error={errors.groupId?.message}
        disabled={groups.isPending}
        {...form.register(group, { setValueAs: toId })}
      >
        <option value="">No group</option>
        {groupOptions.map((g) => (
          <option key={g.id} value={g.id}>
            {g.name}
          </option>
        ))}
      </Select>
    </div>
  );
}
