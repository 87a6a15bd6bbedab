/** Loaders of the Stockroom's pages (see load.ts). */
import { containersQueryOptions, containerTableQuery, IN_STOCK, statusFromLink } from "@/features/stockroom/api/get-containers";
import { chemicalsQueryOptions, firstChemicalsPage } from "@/features/stockroom/api/get-chemicals";
import { chemicalQueryOptions, sheetsQueryOptions } from "@/features/stockroom/api/get-chemical";
import { containerQueryOptions } from "@/features/stockroom/api/get-container";
import { locationsQueryOptions } from "@/features/stockroom/api/get-locations";
import { idParam, type ScreenLoader } from "./load";

/** The containers table as the link opened it (routes/stockroom.tsx reads the same parameters). */
export const containers: ScreenLoader = (qc, args) => {
  const params = new URL(args.request.url).searchParams;
  const sort = params.get("sort") === "expiresAt" ? "expiresAt" : undefined;
  const status = statusFromLink(params.get("status")) ?? IN_STOCK;
  return [qc.prefetchQuery(containersQueryOptions(containerTableQuery({ status, sort }))), qc.prefetchQuery(locationsQueryOptions())];
};

export const chemicals: ScreenLoader = (qc) => [qc.prefetchQuery(chemicalsQueryOptions(firstChemicalsPage))];

export const chemical: ScreenLoader = (qc, args) => {
  const id = idParam(args);
  if (id === null) return;
  return [
    qc.prefetchQuery(chemicalQueryOptions(id)),
    qc.prefetchQuery(sheetsQueryOptions(id)),
    qc.prefetchQuery(containersQueryOptions(containerTableQuery({ status: IN_STOCK, chemicalId: id }))),
    qc.prefetchQuery(locationsQueryOptions()),
  ];
};

export const container: ScreenLoader = (qc, args) => {
  const id = idParam(args);
  if (id === null) return;
  return [qc.prefetchQuery(containerQueryOptions(id))];
};

/** The solution form lists the sealed and opened containers (prepare-solution-form.tsx). */
export const prepare: ScreenLoader = (qc) => [qc.prefetchQuery(containersQueryOptions({ status: "sealed,in_use", limit: 500, sort: "chemical", dir: "asc" }))];

export const receive: ScreenLoader = (qc) => [
  qc.prefetchQuery(chemicalsQueryOptions({ limit: 500, sort: "name", dir: "asc" })),
  qc.prefetchQuery(locationsQueryOptions()),
];
