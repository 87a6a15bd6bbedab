/**
 * CSV import of chemicals or containers (manager, safety officer): choose a file, send it, and
 * see either how many rows were imported or every bad row with its line number and reason.
 * The server imports all or nothing, so a refused file can be fixed and sent again whole.
 */
import { useRef, useState, type FormEvent } from "react";
import { describeError } from "@/lib/forms";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Input } from "@/components/ui/input";
import { TBody, THead, Table, Td, Th, Tr } from "@/components/ui/table";
import { badRowsOf, useImportCsv, type ImportTable } from "../api/import-csv";

/** The columns each import reads (the export writes the same names). */
const COLUMNS: Record<ImportTable, { required: string[]; optional: string[] }> = {
  chemicals: {
    required: ["name", "casNumber"],
    optional: ["formula", "molarMass", "synonyms", "hazardStatements", "signalWord", "precautions", "flashPointC", "boilingPointC", "densityGPerMl", "storageGroup", "reorderPoint", "reorderUnit", "unitCostCents", "costUnit"],
  },
  containers: {
    required: ["casNumber", "quantity", "unit"],
    optional: ["chemicalName", "location", "status", "kind", "expiresAt", "retestAt", "supplier", "lot", "priceCents"],
  },
};

const MAX_FILE_BYTES = 10 * 1024 * 1024; // the server's text body limit

export function CsvImport({ table }: { table: ImportTable }) {
  const run = useImportCsv(table);
  const fileRef = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | undefined>();
  const cols = COLUMNS[table];
  const template = `data:text/csv;charset=utf-8,${encodeURIComponent(`${[...cols.required, ...cols.optional].join(",")}\r\n`)}`;

  async function submit(e: FormEvent) {
    e.preventDefault();
    run.reset();
    if (!file) return setFileError("Choose a CSV file.");
    if (file.size > MAX_FILE_BYTES) return setFileError("The file is larger than 10 MB; split it.");
    setFileError(undefined);
    try {
      await run.mutateAsync(await file.text());
    } catch {
      // Shown below from run.error.
    }
  }

  const bad = run.isError ? badRowsOf(run.error) : null;
  const what = table === "chemicals" ? "chemicals" : "containers";
  return (
    <Card title={table === "chemicals" ? "Import chemicals" : "Import containers"} description={`Required columns: ${cols.required.join(", ")}. Optional: ${cols.optional.join(", ")}.`}>
      <form onSubmit={submit} className="flex flex-col gap-3" noValidate aria-label={`Import ${what}`} data-testid={`import-${table}`}>
        <div className="flex flex-wrap items-end gap-2">
          <Input
            ref={fileRef}
            label="CSV file"
            type="file"
            accept=".csv,text/csv"
            error={fileError}
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              setFileError(undefined);
              run.reset();
            }}
            fieldClassName="w-80"
            className="py-1"
            data-testid={`import-${table}-file`}
          />
          <Button type="submit" variant="primary" loading={run.isPending} data-testid={`import-${table}-send`}>Import</Button>
          <a href={template} download={`phasebook-${table}-template.csv`} className="text-sm">Empty template</a>
        </div>
        {table === "containers" && (
          <p className="text-xs text-grey-600">
            A container's chemical is found by its CAS number (add chemicalName when two share one); location is an id, a name or a full path; status is sealed or in_use; kind is bottle, vial or waste.
          </p>
        )}
        {run.isSuccess && (
          <Alert tone="ok">
            <span data-testid={`import-${table}-done`}>Imported {run.data.imported} {run.data.imported === 1 ? what.slice(0, -1) : what}.</span>
          </Alert>
        )}
        {bad && (
          <div className="flex flex-col gap-2" data-testid={`import-${table}-bad`}>
            <Alert tone="danger">{bad.length} row{bad.length === 1 ? " is" : "s are"} wrong; nothing was imported. Fix them and send the whole file again.</Alert>
            <Table caption="Rows that could not be imported">
              <THead>
                <tr><Th>Line</Th><Th>Column</Th><Th>Reason</Th></tr>
              </THead>
              <TBody>
                {bad.map((b, i) => (
                  <Tr key={`${b.line}-${b.field}-${i}`}>
                    <Td className="font-mono text-xs">{b.line}</Td>
                    <Td className="font-mono text-xs">{b.field ?? "–"}</Td>
                    <Td>{b.reason}</Td>
                  </Tr>
                ))}
              </TBody>
            </Table>
          </div>
        )}
        {run.isError && !bad && <Alert tone="danger">{describeError(run.error)}</Alert>}
      </form>
    </Card>
  );
}
