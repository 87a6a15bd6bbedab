/**
 * The Stockroom's container table: sorting, filtering and paging happen on the server (the
 * facility may hold 20 000 containers), TanStack Table only lays out the page it gets.
 * With `selectionActions` (the route passes label printing) a checkbox column appears; the
 * selection survives paging and filtering, so labels for several pages go out in one PDF.
 */
import { useCallback, useDeferredValue, useMemo, useState, type ReactNode } from "react";
import { useDebouncedValue } from "@/hooks/use-debounced-value";
import { Link } from "react-router-dom";
import { createColumnHelper, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { CONTAINER_SORTS, CONTAINER_STATUSES, CONTAINER_STATUS_LABELS, type ContainerDto } from "@shared/schemas/stock";
import { paths } from "@/config/paths";
import { describeError } from "@/lib/forms";
import { formatDate } from "@/lib/format";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/input";
import { BodyRows, HeaderRows, Pager, TBody, THead, Table, TableMessage } from "@/components/ui/table";
import { CONTAINER_PAGE as PAGE, IN_STOCK, containerTableQuery, useContainers } from "../api/get-containers";
import { useLocations } from "../api/get-locations";
import { StatusBadge, formatQuantity } from "./stock-format";

const col = createColumnHelper<ContainerDto>();
const SORTABLE = new Set<string>(CONTAINER_SORTS);

const columns = [
  // The number as text: the chemical's name beside it is the row's one link to the container (two
  // links to one place in every row read twice to a screen reader, and cost a router link each).
  col.accessor("id", { header: "No.", cell: (c) => <span className="font-mono text-xs">#{c.getValue()}</span> }),
  col.accessor("chemicalName", {
    id: "chemical",
    header: "Chemical",
    cell: (c) => (
      <span>
        <Link to={paths.container.getHref(c.row.original.id)} className="font-medium text-grey-900">{c.getValue()}</Link>
        <span className="ml-1 font-mono text-xs text-grey-500">{c.row.original.casNumber}</span>
        {c.row.original.kind === "solution" && <span className="block text-xs text-grey-600">{c.row.original.lot}</span>}
      </span>
    ),
  }),
  col.accessor("quantity", {
    header: "Left",
    cell: (c) => (
      <span className="font-mono text-xs">
        {formatQuantity(c.getValue(), c.row.original.unit)}
        {c.row.original.reservedQuantity > 0 && <span className="block text-grey-600">{formatQuantity(c.row.original.freeQuantity, c.row.original.unit)} free</span>}
      </span>
    ),
  }),
  col.accessor("status", { header: "Status", cell: (c) => <StatusBadge status={c.getValue()} chemicalHold={c.row.original.chemicalHoldReason} /> }),
  col.accessor("locationName", { id: "location", header: "Location", cell: (c) => c.getValue() ?? <span className="text-warning-800">No location</span> }),
  col.accessor("expiresAt", { header: "Expires", cell: (c) => (c.getValue() ? formatDate(c.getValue()!) : "–") }),
  col.accessor("lot", { header: "Lot", cell: (c) => (c.row.original.kind === "solution" ? "–" : <span className="text-xs">{c.getValue()}</span>) }),
];

export { statusFromLink } from "../api/get-containers";

interface ContainersTableProps {
  chemicalId?: number;
  /** Where the table starts (e.g. from a link): a status filter and a sort column. */
  initialStatus?: string;
  initialSort?: (typeof CONTAINER_SORTS)[number];
  /** Actions on the selected containers' ids; without it the table has no selection column. */
  selectionActions?: (ids: number[]) => ReactNode;
}

export function ContainersTable({ chemicalId, selectionActions, initialStatus, initialSort }: ContainersTableProps) {
  const [text, setText] = useState("");
  const [status, setStatus] = useState(initialStatus ?? IN_STOCK);
  const [locationId, setLocationId] = useState("");
  const [sorting, setSorting] = useState<SortingState>([{ id: initialSort && SORTABLE.has(initialSort) ? initialSort : "chemical", desc: false }]);
  const [page, setPage] = useState(0);
  const locations = useLocations();
  const [selected, setSelected] = useState<ReadonlySet<number>>(new Set());
  const toggle = useCallback(
    (ids: number[], on: boolean) =>
      setSelected((prev) => {
        const next = new Set(prev);
        for (const i of ids) {
          if (on) next.add(i);
          else next.delete(i);
        }
        return next;
      }),
    [],
  );

  // Typing settles for a moment before the server is asked, so each key press is not a request.
  const q = useDebouncedValue(text.trim());

  const sort = sorting[0];
  const query = useMemo(
    () =>
      containerTableQuery({
        q,
        status,
        locationId: locationId ? Number(locationId) : undefined,
        chemicalId,
        sort: (sort && SORTABLE.has(sort.id) ? sort.id : "chemical") as (typeof CONTAINER_SORTS)[number],
        desc: sort?.desc,
        page,
      }),
    [q, status, locationId, chemicalId, sort, page],
  );
  const containers = useContainers(query);
  // A page of rows renders as a transition, in slices, so an arriving answer never holds the
  // main thread for the whole table at once; until then the last rows (or the waiting line) stay.
  const shown = useDeferredValue(containers.data);
  const total = shown?.total ?? 0;

  const pageIds = useMemo(() => (shown?.items ?? []).map((c) => c.id), [shown]);
  const allOnPage = pageIds.length > 0 && pageIds.every((i) => selected.has(i));
  const someOnPage = pageIds.some((i) => selected.has(i));
  const shownColumns = useMemo(() => {
    if (!selectionActions) return columns;
    const select = col.display({
      id: "select",
      header: () => (
        <input
          type="checkbox"
          aria-label="Select every container on this page"
          checked={allOnPage}
          ref={(el) => {
            if (el) el.indeterminate = someOnPage && !allOnPage;
          }}
          onChange={(e) => toggle(pageIds, e.target.checked)}
          data-testid="select-page"
        />
      ),
      cell: (c) => (
        <input
          type="checkbox"
          aria-label={`Select container #${c.row.original.id}`}
          checked={selected.has(c.row.original.id)}
          onChange={(e) => toggle([c.row.original.id], e.target.checked)}
          data-testid={`select-container-${c.row.original.id}`}
        />
      ),
    });
    return [select, ...columns];
  }, [selectionActions, allOnPage, someOnPage, pageIds, selected, toggle]);

  const table = useReactTable({
    data: shown?.items ?? [],
    columns: shownColumns,
    state: { sorting },
    onSortingChange: (u) => {
      setSorting(u);
      setPage(0);
    },
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    enableSortingRemoval: false,
    rowCount: total,
    getCoreRowModel: getCoreRowModel(),
  });

  const exportHref = `/api/containers/export.csv?${new URLSearchParams(
    Object.entries({ q, status, locationId, within: locationId ? "true" : "", chemicalId: chemicalId ? String(chemicalId) : "" }).filter(([, v]) => v) as [string, string][],
  )}`;

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-2">
        <Input label="Search" placeholder="Chemical, CAS number, lot, supplier or label" value={text} onChange={(e) => {
          setText(e.target.value);
          setPage(0);
        }} fieldClassName="w-72" data-testid="container-search" />
        <Select label="Status" value={status} onChange={(e) => { setStatus(e.target.value); setPage(0); }} fieldClassName="w-48">
          <option value={IN_STOCK}>In stock (sealed, in use, on hold)</option>
          <option value="">Any status</option>
          {CONTAINER_STATUSES.map((s) => (
            <option key={s} value={s}>{CONTAINER_STATUS_LABELS[s]}</option>
          ))}
        </Select>
        <Select label="Location" value={locationId} onChange={(e) => { setLocationId(e.target.value); setPage(0); }} fieldClassName="w-72">
          <option value="">Anywhere</option>
          {locations.data?.map((l) => (
            <option key={l.id} value={l.id}>{l.path}</option>
          ))}
        </Select>
        <a href={exportHref} className="ml-auto text-sm" download>
          Export CSV
        </a>
      </div>
      {selectionActions && selected.size > 0 && (
        <div className="flex flex-wrap items-end gap-2 rounded-md border border-aqueous-200 bg-aqueous-50 px-3 py-2 text-sm" data-testid="container-selection">
          <span className="self-center">{selected.size} selected</span>
          {selectionActions([...selected].sort((a, b) => a - b))}
          <Button size="sm" variant="ghost" onClick={() => setSelected(new Set())}>Clear the selection</Button>
        </div>
      )}
      {containers.isError && <Alert tone="danger">{describeError(containers.error)}</Alert>}
      <Table caption="Containers">
        <THead>
          <HeaderRows table={table} isSortable={(id) => SORTABLE.has(id)} />
        </THead>
        <TBody>
          {shown === undefined && !containers.isError && <TableMessage colSpan={shownColumns.length}>Loading containers…</TableMessage>}
          {shown?.items.length === 0 && <TableMessage colSpan={shownColumns.length}>No container matches these filters.</TableMessage>}
          <BodyRows table={table} rowTestId={(c) => `container-row-${c.id}`} />
        </TBody>
      </Table>
      {/* Under the rows once they are there: a pager drawn beside the waiting line would jump down when they come. */}
      {shown !== undefined && <Pager page={page} pageSize={PAGE} total={total} totalIsExact={shown.totalIsExact} onPage={setPage} nothing="No containers" />}
    </div>
  );
}
