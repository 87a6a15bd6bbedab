/** CSV import of chemicals and containers (manager, safety officer). */
import { PageHeader } from "@/components/ui/page-header";
import { CsvImport } from "@/features/stockroom/components/csv-import";

export function StockImportRoute() {
  return (
    <>
      <PageHeader
        title="Import from CSV"
        description="Line 1 holds the column names; every row is checked with the same rules as the forms. If any row is wrong, nothing is imported. Import the chemicals before their containers."
      />
      <div className="grid gap-4 xl:grid-cols-2">
        <CsvImport table="chemicals" />
        <CsvImport table="containers" />
      </div>
    </>
  );
}
