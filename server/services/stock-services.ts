/** The Stockroom's and Safety review's services, wired together once for createServices(). */
import type { DataSource } from "typeorm";
import { createChemicalService } from "./chemical.service";
import { createContainerService } from "./container.service";
import { createLocationService } from "./location.service";
import { createSdsService } from "./sds.service";
import { createSolutionService } from "./solution.service";
import { createStockCsvService } from "./stock-csv.service";

export function createStockServices(deps: { ds: DataSource; now: () => Date; dataDir: string; tz: string }) {
  const chemicals = createChemicalService(deps);
  const containers = createContainerService(deps);
  return {
    chemicals,
    containers,
    solutions: createSolutionService({ ...deps, containers }),
    locations: createLocationService(deps),
    sds: createSdsService(deps),
    stockCsv: createStockCsvService({ ...deps, chemicals, containers }),
  };
}
