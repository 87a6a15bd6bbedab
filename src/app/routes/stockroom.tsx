/** Stockroom: the containers table (default) and the chemicals table, with links to receive and prepare. */
import { Link, NavLink, useSearchParams } from "react-router-dom";
import { paths } from "@/config/paths";
import { hasRole, useUser } from "@/lib/auth";
import { cn } from "@/lib/cn";
import { buttonClasses } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { SCREEN_HEADS } from "@shared/screens";
import { ContainersTable, statusFromLink } from "@/features/stockroom/components/containers-table";
import { ChemicalsTable } from "@/features/stockroom/components/chemicals-table";
import { PrintLabelsButton } from "@/features/labels/components/print-labels-button";
import { BENCH_ROLES } from "@shared/schemas/auth";

const printSelected = (ids: number[]) => <PrintLabelsButton containerIds={ids} label={`Print labels for ${ids.length} selected`} />;

function StockroomHeader() {
  const { data: user } = useUser();
  return (
    <>
      <PageHeader
        {...SCREEN_HEADS.stockroom}
        actions={
          <>
            {hasRole(user, ...BENCH_ROLES) && (
              <Link to={paths.prepareSolution.getHref()} className={buttonClasses("primary")} data-testid="prepare-solution-link">Prepare a solution</Link>
            )}
            {hasRole(user, "manager", "safety_officer") && (
              <>
                <Link to={paths.receive.getHref()} className={buttonClasses("secondary")}>Receive a delivery</Link>
                <Link to={paths.stockImport.getHref()} className={buttonClasses("secondary")} data-testid="import-link">Import CSV</Link>
              </>
            )}
          </>
        }
      />
      <nav className="mb-3 flex gap-1 text-sm" aria-label="Stockroom tables">
        {[
          { to: paths.stockroom.getHref(), label: "Containers" },
          { to: paths.stockroomChemicals.getHref(), label: "Chemicals" },
        ].map((t) => (
          <NavLink key={t.to} to={t.to} end className={({ isActive }) => cn("rounded px-2.5 py-1 no-underline", isActive ? "bg-aqueous-50 font-medium text-aqueous-900" : "text-grey-700 hover:bg-grey-100")}>
            {t.label}
          </NavLink>
        ))}
      </nav>
    </>
  );
}

export function StockroomRoute() {
  const { data: user } = useUser();
  // Label PDFs are the manager's and the safety officer's (GET /api/labels.pdf).
  const mayPrint = hasRole(user, "manager", "safety_officer");
  const [params] = useSearchParams();
  return (
    <>
      <StockroomHeader />
      <ContainersTable
        key={params.toString()}
        selectionActions={mayPrint ? printSelected : undefined}
        initialStatus={statusFromLink(params.get("status"))}
        initialSort={params.get("sort") === "expiresAt" ? "expiresAt" : undefined}
      />
    </>
  );
}

export function ChemicalsRoute() {
  return (
    <>
      <StockroomHeader />
      <ChemicalsTable />
    </>
  );
}
