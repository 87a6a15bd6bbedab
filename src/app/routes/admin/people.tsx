/** Administration › People: accounts, roles, departments, and who may sign in. */
import { useState } from "react";
import { PageHeader } from "@/components/ui/page-header";
import { Button } from "@/components/ui/button";
import { PeopleTable } from "@/features/admin/components/people-table";

export function PeopleRoute() {
  const [addOpen, setAddOpen] = useState(false);
  return (
    <>
      <PageHeader
        title="People"
        description="Everyone with a Phasebook account. Roles decide what each person sees; deactivated people cannot sign in."
        actions={
          <Button variant="primary" onClick={() => setAddOpen(true)} data-testid="add-person">
            Add person
          </Button>
        }
      />
      <PeopleTable addOpen={addOpen} onAddOpenChange={setAddOpen} />
    </>
  );
}
