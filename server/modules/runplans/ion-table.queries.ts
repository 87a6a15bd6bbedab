/**
 * The ion table every run-plan computation reads: Phasebook's built-in table
 * (shared/domain/ion-transfer/ion-table.ts) with the solvents and ions the manager added, each
 * with its published source. An added ion named like a built-in one replaces it for its solvent.
 */
import type { DataSource } from "typeorm";
import { STANDARD_ION_TRANSFER_TABLE, resolveSolvent, type IonTransferTable, type SolventEntry, type TabulatedIon } from "@shared/domain/ion-transfer";
import type { IonEntryDto, SolventDto } from "@shared/schemas/ion-table";
import { prepared } from "../../db/prepared";
import type { IonTransferIon, IonTransferSolvent } from "../../entities";

/** CAS numbers of the built-in table's organic solvents, to find them in the Stockroom. */
export const BUILT_IN_SOLVENT_CAS: Readonly<Record<string, string>> = { dce: "107-06-2", nitrobenzene: "98-95-3" };

export interface LoadedTable {
  table: IonTransferTable;
  /** "solvent|ion" of every ion the manager added. */
  added: ReadonlySet<string>;
  solvents: SolventDto[];
}

function fromMemory(source: string): boolean {
  return /from memory/i.test(source);
}

/** The built-in table with the manager's additions, read on the given connection. */
export function loadIonTable(conn: DataSource): LoadedTable {
  const addedSolvents = prepared(conn, `SELECT * FROM ion_transfer_solvents ORDER BY id`).all() as IonTransferSolvent[];
  const addedIons = prepared(conn, `SELECT * FROM ion_transfer_ions ORDER BY id`).all() as IonTransferIon[];
  const added = new Set<string>();
  const asTabulated = (row: IonTransferIon): TabulatedIon => {
    const entry: TabulatedIon = { ion: row.ion, name: row.name || row.ion, charge: row.charge, standardPotential: { value: row.standardPotentialV, source: row.source } };
    if (row.diffusionAqueousCm2PerS !== null) entry.diffusionAqueous = { value: row.diffusionAqueousCm2PerS, source: row.source };
    if (row.diffusionOrganicCm2PerS !== null) entry.diffusionOrganic = { value: row.diffusionOrganicCm2PerS, source: row.source };
    return entry;
  };
  const withAdditions = (solventId: string, ions: readonly TabulatedIon[]): TabulatedIon[] => {
    const mine = addedIons.filter((r) => r.solventKey === solventId);
    for (const r of mine) added.add(`${solventId}|${r.ion}`);
    const replaced = new Set(mine.map((r) => r.ion));
    return [...ions.filter((i) => !replaced.has(i.ion)), ...mine.map(asTabulated)];
  };
  const table: SolventEntry[] = [
    ...STANDARD_ION_TRANSFER_TABLE.map((s) => ({ ...s, ions: withAdditions(s.id, s.ions) })),
    ...addedSolvents.map((s) => ({ id: s.key, name: s.name, aliases: JSON.parse(s.aliases) as string[], ions: withAdditions(s.key, []) })),
  ];
  const solvents: SolventDto[] = table.map((s) => {
    const own = addedSolvents.find((a) => a.key === s.id);
    return {
      id: s.id,
      name: s.name,
      aliases: [...s.aliases],
      ionCount: s.ions.length,
      casNumber: own ? own.casNumber : (BUILT_IN_SOLVENT_CAS[s.id] ?? null),
      origin: own ? "added" : "table",
      source: own ? own.source : null,
    };
  });
  return { table, added, solvents };
}

/** One solvent's ions as the API lists them; 422 (IonTransferError) for an unknown solvent. */
export function ionsOf(loaded: LoadedTable, solventName: string | undefined): { solvent: { id: string; name: string }; items: IonEntryDto[] } {
  const solvent = resolveSolvent(loaded.table, solventName);
  return {
    solvent: { id: solvent.id, name: solvent.name },
    items: solvent.ions.map((i) => ({
      ion: i.ion,
      name: i.name,
      charge: i.charge,
      standardPotential: { value: i.standardPotential.value, source: i.standardPotential.source },
      diffusionAqueous: i.diffusionAqueous ? { ...i.diffusionAqueous } : null,
      diffusionOrganic: i.diffusionOrganic ? { ...i.diffusionOrganic } : null,
      fromMemory: fromMemory(i.standardPotential.source),
      origin: loaded.added.has(`${solvent.id}|${i.ion}`) ? "added" : "table",
    })),
  };
}

/** The CAS number of a solvent of the table (built-in or added), or null. */
export function solventCas(loaded: LoadedTable, solventId: string): string | null {
  return loaded.solvents.find((s) => s.id === solventId)?.casNumber ?? null;
}
