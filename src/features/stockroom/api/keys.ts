/** Query keys of the Stockroom: every input of a fetch is in its key. */
import type { ContainerListQuery, ChemicalListQuery } from "@shared/schemas/stock";

export type ContainerFilters = Partial<Omit<ContainerListQuery, "status">> & { status?: string };
export type ChemicalFilters = Partial<ChemicalListQuery>;

export const stockKeys = {
  all: ["stock"] as const,
  containers: () => [...stockKeys.all, "containers"] as const,
  containerList: (q: ContainerFilters) => [...stockKeys.containers(), "list", q] as const,
  container: (id: number) => [...stockKeys.containers(), "detail", id] as const,
  chemicals: () => [...stockKeys.all, "chemicals"] as const,
  chemicalList: (q: ChemicalFilters) => [...stockKeys.chemicals(), "list", q] as const,
  chemical: (id: number) => [...stockKeys.chemicals(), "detail", id] as const,
  sds: (chemicalId: number) => [...stockKeys.chemicals(), "sds", chemicalId] as const,
  locations: () => [...stockKeys.all, "locations"] as const,
};
