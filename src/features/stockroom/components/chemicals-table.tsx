/** The chemicals table: name, CAS, formula and the hazard classes Phasebook computes; sorted and paged on the server. */
import { useState } from "react";
import { useDebouncedValue } from "@/hooks/use-debounced-value";
import { Link } from "react-router-dom";
import { createColumnHelper, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { CHEMICAL_SORTS, type ChemicalDto } from "@shared/schemas/stock";
import { paths } from "@/config/paths";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Input } from "@/components/ui/input";
import { BodyRows, HeaderRows, Pager, TBody, THead, Table, TableMessage } from "@/components/ui/table";
import { CHEMICAL_PAGE as PAGE, useChemicals } from "../api/get-chemicals";

const col = createColumnHelper<ChemicalDto>();
const SORTABLE = new Set<string>(CHEMICAL_SORTS);

const columns = [
  col.accessor("name", { header: "Name", cell: (c) => <Link to={paths.chemical.getHref(c.row.original.id)} className="font-medium">{c.getValue()}</Link> }),
  col.accessor("casNumber", { header: "CAS", cell: (c) => <span className="font-mono text-xs">{c.getValue()}</span> }),
  col.accessor("formula", { header: "Formula", cell: (c) => <span className="font-mono text-xs">{c.getValue() ?? "–"}</span> }),
  col.accessor("molarMass", { header: "M (g/mol)", cell: (c) => <span className="font-mono text-xs">{c.getValue()?.toFixed(2) ?? "–"}</span> }),
  col.accessor("flashPointC", { header: "Flash point", cell: (c) => (c.getValue() === null ? "–" : `${c.getValue()} °C`) }),
  col.display({
    id: "classes",
    header: "Flammability",
    cell: (c) =>
      c.row.original.ghsFlammableCategory ? `GHS cat. ${c.row.original.ghsFlammableCategory} · NFPA ${c.row.original.nfpaClass}` : "Not a flammable liquid",
  }),
  col.display({
    id: "flags",
    header: "Flags",
    cell: (c) => (
      <span className="flex flex-wrap gap-1">
        {c.row.original.carcinogen && <Badge tone="danger">Carcinogen</Badge>}
        {c.row.original.acuteToxic && <Badge tone="danger">Acutely toxic</Badge>}
        {c.row.original.halogenated && <Badge tone="organic">Halogenated</Badge>}
        {c.row.original.onHoldReason && <Badge tone="warning">On hold</Badge>}
      </span>
    ),
  }),
];

export function ChemicalsTable() {
  const [text, setText] = useState("");
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const [page, setPage] = useState(0);
  // Typing settles for a moment before the server is asked, so each key press is not a request.
  const q = useDebouncedValue(text.trim());
  const sort = sorting[0];
  const chemicals = useChemicals({
    q: q || undefined,
    sort: (sort && SORTABLE.has(sort.id) ? sort.id : "name") as (typeof CHEMICAL_SORTS)[number],
    dir: sort?.desc ? "desc" : "asc",
    limit: PAGE,
    offset: page * PAGE,
  });
  const total = chemicals.data?.total ?? 0;
  const table = useReactTable({
    data: chemicals.data?.items ?? [],
    columns,
    state: { sorting },
    onSortingChange: (u) => {
      setSorting(u);
      setPage(0);
    },
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    rowCount: total,
    getCoreRowModel: getCoreRowModel(),
  });

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-2">
        <Input label="Search" placeholder="Name, synonym, CAS number or formula" value={text} onChange={(e) => {
          setText(e.target.value);
          setPage(0);
        }} fieldClassName="w-72" />
        <a href="/api/chemicals/export.csv" className="ml-auto text-sm" download>
          Export CSV
        </a>
      </div>
      {chemicals.isError && <Alert tone="danger">{describeError(chemicals.error)}</Alert>}
      <Table caption="Chemicals">
        <THead>
          <HeaderRows table={table} isSortable={(id) => SORTABLE.has(id)} />
        </THead>
        <TBody>
          {chemicals.isPending && <TableMessage colSpan={columns.length}>Loading chemicals…</TableMessage>}
          {chemicals.data?.items.length === 0 && <TableMessage colSpan={columns.length}>No chemical matches.</TableMessage>}
          <BodyRows table={table} />
        </TBody>
      </Table>
      <Pager page={page} pageSize={PAGE} total={total} totalIsExact={chemicals.data?.totalIsExact ?? true} onPage={setPage} nothing="No chemicals" />
    </div>
  );
}
