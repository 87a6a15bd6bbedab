/**
 * Table helpers for dense lists: a scroll wrapper so wide tables never break a phone layout,
 * compact cells, and a sortable header that tells screen readers its order (aria-sort).
 */
import { memo, type HTMLAttributes, type ReactNode, type TdHTMLAttributes, type ThHTMLAttributes } from "react";
import { flexRender, type Cell, type Table as DataTable } from "@tanstack/react-table";
import { cn } from "@/lib/cn";
import { formatCount } from "@/lib/format";
import { Button } from "./button";

export function Table({ className, children, caption }: { className?: string; children: ReactNode; caption?: ReactNode }) {
  // The scroll wrapper takes the focus, so a keyboard can scroll a table wider than a phone (WCAG 2.1.1).
  return (
    <div tabIndex={0} className={cn("overflow-x-auto rounded-lg border border-grey-200 bg-white shadow-xs", className)}>
      <table className="min-w-full border-collapse text-left text-sm">
        {caption && <caption className="sr-only">{caption}</caption>}
        {children}
      </table>
    </div>
  );
}

export function THead({ children }: { children: ReactNode }) {
  return <thead className="border-b border-grey-200 bg-grey-50 text-xs text-grey-600">{children}</thead>;
}

export function TBody({ children }: { children: ReactNode }) {
  return <tbody className="divide-y divide-grey-100">{children}</tbody>;
}

export function Tr({ className, ...props }: HTMLAttributes<HTMLTableRowElement>) {
  return <tr className={cn("hover:bg-grey-50/70", className)} {...props} />;
}

export function Th({ className, ...props }: ThHTMLAttributes<HTMLTableCellElement>) {
  return <th scope="col" className={cn("whitespace-nowrap px-3 py-2 font-medium", className)} {...props} />;
}

export function Td({ className, ...props }: TdHTMLAttributes<HTMLTableCellElement>) {
  return <td className={cn("px-3 py-1.5 align-middle text-grey-800", className)} {...props} />;
}

export type SortDirection = "asc" | "desc" | false;

interface SortableThProps {
  children: ReactNode;
  direction: SortDirection;
  onToggle?: (event: unknown) => void;
  className?: string;
}

/** A header cell whose label is a button that flips the sort order. */
export function SortableTh({ children, direction, onToggle, className }: SortableThProps) {
  const aria = direction === "asc" ? "ascending" : direction === "desc" ? "descending" : "none";
  return (
    <th scope="col" aria-sort={aria} className={cn("whitespace-nowrap px-1.5 py-1 font-medium", className)}>
      <button
        type="button"
        onClick={onToggle}
        className="inline-flex items-center gap-1 rounded px-1.5 py-1 hover:bg-grey-200/60 hover:text-grey-900"
      >
        {children}
        <SortIcon direction={direction} />
      </button>
    </th>
  );
}

function SortIcon({ direction }: { direction: SortDirection }) {
  return (
    <svg viewBox="0 0 12 12" className="size-3" aria-hidden="true">
      <path d="M6 1.5 9 5H3Z" className={direction === "asc" ? "fill-grey-900" : "fill-grey-300"} />
      <path d="M6 10.5 3 7h6Z" className={direction === "desc" ? "fill-grey-900" : "fill-grey-300"} />
    </svg>
  );
}

/** A full-width row for "loading" or "nothing matches" inside a table body. */
export function TableMessage({ colSpan, children }: { colSpan: number; children: ReactNode }) {
  return (
    <tr>
      <td colSpan={colSpan} className="px-3 py-6 text-center text-grey-600">
        {children}
      </td>
    </tr>
  );
}

/**
 * The header rows of a TanStack table: a sortable header where the column sorts (by default
 * where TanStack says it can; server-sorted tables name their columns), a plain one elsewhere.
 */
export function HeaderRows<T>({ table, isSortable }: { table: DataTable<T>; isSortable?: (columnId: string) => boolean }) {
  return (
    <>
      {table.getHeaderGroups().map((hg) => (
        <tr key={hg.id}>
          {hg.headers.map((h) =>
            (isSortable ? isSortable(h.column.id) : h.column.getCanSort()) ? (
              <SortableTh key={h.id} direction={h.column.getIsSorted()} onToggle={h.column.getToggleSortingHandler()}>
                {flexRender(h.column.columnDef.header, h.getContext())}
              </SortableTh>
            ) : (
              <Th key={h.id}>{flexRender(h.column.columnDef.header, h.getContext())}</Th>
            ),
          )}
        </tr>
      ))}
    </>
  );
}

interface BodyRowProps<T> {
  /** The row's visible cells: TanStack gives the same array until the row or the columns change. */
  cells: Cell<T, unknown>[];
  className?: string;
  testId?: string;
}

/**
 * One body row: its own component, so React can pause between the rows of a long page, and
 * memoised on its cells, so the table's screen drawing again for another reason (a filter's list
 * arriving, a selection) does not draw every unchanged row again in one block. A cell draws from
 * its row and its column's definition only; columns that read other state are remade when it
 * changes (useMemo with that state), which gives new cells.
 */
const BodyRow = memo(function BodyRow<T>({ cells, className, testId }: BodyRowProps<T>) {
  return (
    <Tr className={className} data-testid={testId}>
      {cells.map((cell) => (
        <Td key={cell.id}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</Td>
      ))}
    </Tr>
  );
}) as <T>(props: BodyRowProps<T>) => ReactNode;

/**
 * The body rows of a TanStack table, each row a component of its own: an arriving page renders
 * row by row, in slices (with the answer deferred, as a transition), not as one long task.
 */
export function BodyRows<T>({ table, rowClassName, rowTestId }: { table: DataTable<T>; rowClassName?: (item: T) => string | undefined; rowTestId?: (item: T) => string }) {
  return (
    <>
      {table.getRowModel().rows.map((row) => (
        <BodyRow key={row.id} cells={row.getVisibleCells()} className={rowClassName?.(row.original)} testId={rowTestId?.(row.original)} />
      ))}
    </>
  );
}

/**
 * "51–100 of 420" with Previous and Next, for a table paged on the server. A list that stopped
 * counting (`totalIsExact` false) reads "51–100 of more than 1,000" and always offers Next.
 */
export function Pager({
  page,
  pageSize,
  total,
  totalIsExact = true,
  onPage,
  nothing,
}: {
  page: number;
  pageSize: number;
  total: number;
  totalIsExact?: boolean;
  onPage: (page: number) => void;
  nothing: string;
}) {
  const first = page * pageSize + 1;
  const n = formatCount;
  const label =
    total === 0 ? nothing : totalIsExact ? `${n(first)}–${n(Math.min(total, (page + 1) * pageSize))} of ${n(total)}` : `${n(first)}–${n((page + 1) * pageSize)} of more than ${n(total)}`;
  return (
    <div className="flex items-center justify-between text-xs text-grey-600">
      <span aria-live="polite" data-testid="pager-range">{label}</span>
      <div className="flex gap-2">
        <Button size="sm" disabled={page === 0} onClick={() => onPage(page - 1)}>
          Previous
        </Button>
        <Button size="sm" disabled={totalIsExact && (page + 1) * pageSize >= total} onClick={() => onPage(page + 1)}>
          Next
        </Button>
      </div>
    </div>
  );
}
