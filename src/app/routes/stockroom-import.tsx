/** CSV import of chemicals and containers (manager, safety officer). */
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { CsvImport } from "@/features/stockroom/components/csv-import";

export function StockImportRoute() {
  return (
    <>
      <PageHeader
        {...SCREEN_HEADS.stockImport}
      />
      <div className="grid gap-4 xl:grid-cols-2">
        <CsvImport table="chemicals" />
        <CsvImport table="containers" />
      </div>
    </>
  );
}
