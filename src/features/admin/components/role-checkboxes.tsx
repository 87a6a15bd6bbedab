/**
 * The five roles as checkboxes under one legend; react-hook-form collects the checked ones into
 * an array. A `kept` role cannot be unchecked (the person's abilities said so); it stays enabled,
 * because react-hook-form leaves disabled boxes out of the value.
 */
import type { UseFormRegisterReturn } from "react-hook-form";
import { ROLES, ROLE_LABELS, type Role } from "@shared/schemas/auth";
import { Checkbox } from "@/components/ui/input";
import { FieldSet } from "@/components/ui/field";

const ROLE_HINTS: Record<(typeof ROLES)[number], string> = {
  member: "books instruments, uses stock",
  group_lead: "owns accounts, sees group spend",
  manager: "runs instruments, training, billing",
  safety_officer: "hazards, storage limits, holds",
  admin: "people, roles, settings",
};

interface RoleCheckboxesProps {
  id: string;
  registration: UseFormRegisterReturn;
  error?: string;
  kept?: { role: Role; reason: string };
}

export function RoleCheckboxes({ id, registration, error, kept }: RoleCheckboxesProps) {
  return (
    <FieldSet id={id} legend="Roles" error={error} hint={kept?.reason}>
      <div className="grid gap-1.5 sm:grid-cols-2">
        {ROLES.map((role) => {
          const isKept = kept?.role === role;
          return (
            <Checkbox
              key={role}
              value={role}
              label={
                <>
                  {ROLE_LABELS[role]} <span className="text-xs text-grey-500">— {ROLE_HINTS[role]}</span>
                </>
              }
              {...registration}
              aria-disabled={isKept || undefined}
              title={isKept ? kept.reason : undefined}
              onClick={isKept ? (e) => e.preventDefault() : undefined}
              data-testid={`role-${role}`}
            />
          );
        })}
      </div>
    </FieldSet>
  );
}
