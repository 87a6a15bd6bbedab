/** Administration › People: accounts, roles, departments, and who may sign in. */
import { useState } from "react";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { Button } from "@/components/ui/button";
import { PeopleTable } from "@/features/admin/components/people-table";

export function PeopleRoute() {
  const [addOpen, setAddOpen] = useState(false);
  return (
    <>
      <PageHeader
        {...SCREEN_HEADS.people}
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
