/** The five roles as checkboxes under one legend; react-hook-form collects the checked ones into an array. */
import type { UseFormRegisterReturn } from "react-hook-form";
import { ROLES, ROLE_LABELS } from "@shared/schemas/auth";
import { Checkbox } from "@/components/ui/input";
import { FieldSet } from "@/components/ui/field";

const ROLE_HINTS: Record<(typeof ROLES)[number], string> = {
  member: "books instruments, uses stock",
  group_lead: "owns accounts, sees group spend",
  manager: "runs instruments, training, billing",
  safety_officer: "hazards, storage limits, holds",
  admin: "people, roles, settings",
};

export function RoleCheckboxes({ id, registration, error }: { id: string; registration: UseFormRegisterReturn; error?: string }) {
  return (
    <FieldSet id={id} legend="Roles" error={error}>
      <div className="grid gap-1.5 sm:grid-cols-2">
        {ROLES.map((role) => (
          <Checkbox
            key={role}
            value={role}
            label={
              <>
                {ROLE_LABELS[role]} <span className="text-xs text-grey-500">— {ROLE_HINTS[role]}</span>
              </>
            }
            {...registration}
          />
        ))}
      </div>
    </FieldSet>
  );
}
