/**
 * POST /api/chemicals/import and /api/containers/import: a CSV file sent as JSON { csv }. The
 * import is all or nothing: 201 { imported, ids }, or 422 with every bad row in `rows`.
 */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { api, isApiError, parseResponse } from "@/lib/api-client";
import { stockKeys } from "./keys";

export type ImportTable = "chemicals" | "containers";

const imported = z.object({ imported: z.number(), ids: z.array(z.number()) });
const badRow = z.object({ line: z.number(), field: z.string().nullable(), reason: z.string() });
export type BadRow = z.infer<typeof badRow>;

export async function importCsv(table: ImportTable, csv: string) {
  return parseResponse(imported, await api.post<unknown>(`/${table}/import`, { csv }), `POST /api/${table}/import`);
}

/** The bad rows of a refused import, or null when the error was something else. */
export function badRowsOf(error: unknown): BadRow[] | null {
  if (!isApiError(error, 422) || error.code !== "import_refused") return null;
  const rows = z.array(badRow).safeParse((error.problem as { rows?: unknown }).rows);
  return rows.success ? rows.data : null;
}

export function useImportCsv(table: ImportTable) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (csv: string) => importCsv(table, csv),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: table === "chemicals" ? stockKeys.chemicals() : stockKeys.containers() }),
  });
}
