/**
 * A person's organisation: empty for the host institution's own people; for an external
 * customer's people, the customer's name as on its accounts (the organisation rules compare the
 * two), offered from the organisations already known.
 */
import { useId } from "react";
import type { UseFormRegisterReturn } from "react-hook-form";
import { Input } from "@/components/ui/input";
import { useOrganisations } from "../api/get-organisations";

export function OrganisationField({ registration, error }: { registration: UseFormRegisterReturn; error?: string }) {
  const organisations = useOrganisations();
  const listId = useId();
  return (
    <>
      <Input
        label="Organisation (external customers only)"
        hint="Leave empty for the institution's own people. For a customer's people, write the customer's name as on its account."
        autoComplete="off"
        list={listId}
        error={error}
        data-testid="person-organisation"
        {...registration}
      />
      <datalist id={listId}>
        {(organisations.data ?? []).map((o) => (
          <option key={o} value={o} />
        ))}
      </datalist>
    </>
  );
}
