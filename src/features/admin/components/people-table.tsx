/**
 * Administration › People: every account with its roles, department, group, organisation and
 * state, sortable by column and filtered by name, e-mail or organisation on the server. Add, edit
 * and (de)activate open dialogs; each row's abilities (the user policy's answer) say which.
 */
import { useMemo, useState } from "react";
import {
  createColumnHelper,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { ROLE_LABELS } from "@shared/schemas/auth";
import type { UserAdminDto } from "@shared/schemas/users";
import { describeError } from "@/lib/forms";
import { formatCount, formatDate } from "@/lib/format";
import { useDebouncedValue } from "@/hooks/use-debounced-value";
import { useUsers } from "../api/get-users";
import { useDepartments } from "../api/get-departments";
import { useGroups } from "../api/get-groups";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { Dialog } from "@/components/ui/dialog";
import { Spinner } from "@/components/ui/spinner";
import { BodyRows, HeaderRows, TBody, THead, Table, TableMessage } from "@/components/ui/table";
import { AddPersonForm } from "./add-person-form";
import { EditPersonForm } from "./edit-person-form";
import { ActiveToggleDialog } from "./active-toggle-dialog";

// The API caps a page at 500; a facility's people fit, and the filter narrows beyond that.
const PAGE_LIMIT = 500;

const column = createColumnHelper<UserAdminDto>();

export function PeopleTable({ addOpen, onAddOpenChange }: { addOpen: boolean; onAddOpenChange: (open: boolean) => void }) {
  const [filter, setFilter] = useState("");
  const q = useDebouncedValue(filter.trim());
  const users = useUsers({ q: q || undefined, limit: PAGE_LIMIT, offset: 0 });
  const departments = useDepartments();
  const groups = useGroups();
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const [editing, setEditing] = useState<UserAdminDto | null>(null);
  const [toggling, setToggling] = useState<UserAdminDto | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  const departmentName = useMemo(() => {
    const loaded = departments.data !== undefined;
    const byId = new Map((departments.data?.items ?? []).map((x) => [x.id, x.name]));
    // Until the list arrives show nothing rather than a bare id that would flash and change.
    return (id: number | null) => (id === null || !loaded ? "" : (byId.get(id) ?? `#${id}`));
  }, [departments.data]);
  const groupName = useMemo(() => {
    const loaded = groups.data !== undefined;
    const byId = new Map((groups.data?.items ?? []).map((x) => [x.id, x.name]));
    // Until the list arrives show nothing rather than a bare id that would flash and change.
    return (id: number | null) => (id === null || !loaded ? "" : (byId.get(id) ?? `#${id}`));
  }, [groups.data]);

  const columns = useMemo(
    () => [
      column.accessor("name", {
        header: "Name and e-mail",
        cell: (c) => (
          <div className="whitespace-nowrap">
            <p className="font-medium text-grey-900">{c.getValue()}</p>
            <p className="text-xs text-grey-600">{c.row.original.email}</p>
          </div>
        ),
      }),
      column.accessor("roles", {
        header: "Roles",
        enableSorting: false,
        cell: (c) => (
          <div className="flex min-w-40 flex-wrap gap-1">
            {c.getValue().map((r) => (
              <Badge key={r} tone={r === "admin" ? "aqueous" : "neutral"}>
                {ROLE_LABELS[r]}
              </Badge>
            ))}
          </div>
        ),
      }),
      column.accessor((u) => departmentName(u.departmentId), { id: "department", header: "Department" }),
      column.accessor((u) => groupName(u.groupId), { id: "group", header: "Group" }),
      column.accessor((u) => u.organisation ?? "", { id: "organisation", header: "Organisation" }),
      column.accessor("active", {
        header: "State",
        cell: (c) => (c.getValue() ? <Badge tone="ok">Active</Badge> : <Badge tone="neutral">Deactivated</Badge>),
      }),
      column.accessor("createdAt", { header: "Added", cell: (c) => <span className="whitespace-nowrap">{formatDate(c.getValue())}</span> }),
      column.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: ({ row }) => {
          const person = row.original;
          // The user policy's answer for this row: nobody deactivates their own account.
          const mayToggle = person.active ? person.abilities.deactivate : person.abilities.reactivate;
          return (
            <div className="flex justify-end gap-1">
              {person.abilities.edit && (
                <Button size="sm" variant="ghost" onClick={() => setEditing(person)} aria-label={`Edit ${person.name}`}>
                  Edit
                </Button>
              )}
              <Button
                size="sm"
                variant="ghost"
                disabled={!mayToggle}
                title={!mayToggle && person.active ? "You cannot deactivate your own account; another administrator can" : undefined}
                onClick={() => setToggling(person)}
                aria-label={`${person.active ? "Deactivate" : "Reactivate"} ${person.name}`}
                className={person.active ? "text-danger-700 hover:text-danger-800" : undefined}
              >
                {person.active ? "Deactivate" : "Reactivate"}
              </Button>
            </div>
          );
        },
      }),
    ],
    [departmentName, groupName],
  );

  const items = users.data?.items;
  const table = useReactTable({
    data: items ?? [],
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <div className="flex w-full max-w-xs flex-col gap-1">
          <label htmlFor="people-filter" className="text-xs font-medium text-grey-700">
            Filter by name, e-mail or organisation
          </label>
          <input
            id="people-filter"
            type="search"
            value={filter}
            onChange={(e) => setFilter(e.target.value)}
            placeholder="e.g. Okafor or @tidewater"
            className="h-8 rounded-md border border-grey-300 bg-white px-2.5 shadow-xs placeholder:text-grey-400 focus-visible:border-aqueous-600"
          />
        </div>
        <p className="flex h-8 items-center gap-2 text-xs text-grey-600" aria-live="polite">
          {users.isFetching && <Spinner size="sm" className="text-aqueous-600" />}
          {users.data &&
            (!users.data.totalIsExact
              ? `Showing ${users.data.items.length} of more than ${formatCount(users.data.total)}; narrow the filter to see the rest.`
              : users.data.total > users.data.items.length
                ? `Showing ${users.data.items.length} of ${users.data.total}; narrow the filter to see the rest.`
                : `${users.data.total} ${users.data.total === 1 ? "person" : "people"}`)}
        </p>
        <a href="/api/users/export.csv" className="ml-auto flex h-8 items-center text-sm" download data-testid="people-csv">
          Export CSV
        </a>
      </div>

      {notice && (
        <Alert tone="ok" className="flex items-center justify-between gap-2">
          <span>{notice}</span>
          <button type="button" className="text-xs underline" onClick={() => setNotice(null)}>
            Dismiss
          </button>
        </Alert>
      )}
      {users.isError && <Alert tone="danger">{describeError(users.error)}</Alert>}

      <Table caption="People with a Phasebook account">
        <THead>
          <HeaderRows table={table} />
        </THead>
        <TBody>
          {users.isPending && (
            <TableMessage colSpan={columns.length}>
              <span className="inline-flex items-center gap-2">
                <Spinner size="sm" className="text-aqueous-600" /> Loading people…
              </span>
            </TableMessage>
          )}
          {items && items.length === 0 && (
            <TableMessage colSpan={columns.length}>
              {q ? `Nobody matches “${q}”.` : "No people yet. Add the first with “Add person”."}
            </TableMessage>
          )}
          <BodyRows table={table} rowClassName={(p) => (p.active ? undefined : "text-grey-500")} />
        </TBody>
      </Table>

      <Dialog open={addOpen} onClose={() => onAddOpenChange(false)} title="Add a person">
        <AddPersonForm
          onCancel={() => onAddOpenChange(false)}
          onAdded={(user) => {
            onAddOpenChange(false);
            setNotice(`${user.name} was added.`);
          }}
        />
      </Dialog>

      <Dialog open={editing !== null} onClose={() => setEditing(null)} title={`Edit ${editing?.name ?? ""}`}>
        {editing && (
          <EditPersonForm
            person={editing}
            onCancel={() => setEditing(null)}
            onSaved={(user) => {
              setEditing(null);
              setNotice(`Changes to ${user.name} were saved.`);
            }}
          />
        )}
      </Dialog>

      <ActiveToggleDialog person={toggling} onClose={() => setToggling(null)} />
    </div>
  );
}
