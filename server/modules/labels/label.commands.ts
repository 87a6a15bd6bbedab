/**
 * Label upkeep: re-issuing a label (the old code goes to the label history and answers
 * "replaced" from then on), the label stocks labels are laid out on, and the label PDF.
 */
import type { DataSource } from "typeorm";
import { In } from "typeorm";
import { DateTime } from "luxon";
import { labelUrl, MAX_LABELS_PER_REQUEST, SINGLE_LABEL, stockProblems, type LabelStockLayout } from "@shared/domain/labels";
import { pictogramsFor, signalWordFor, type GhsPictogram } from "@shared/domain/hazards";
import type { LabelHistoryEntryDto, LabelStockDto, LabelStockInput, LabelledTypeName, LabelsPdfQuery } from "@shared/schemas/labels";
import { INSTRUMENT_KIND_LABELS } from "@shared/schemas/instruments";
import { Chemical, Container, Instrument, LabelHistory, LabelStock, User } from "../../entities";
import { NotFound, RuleBroken } from "../../errors";
import type { AuthUser } from "../../middleware/auth";
import { serialTransaction } from "../../db/serial";
import { newToken } from "../../core/tokens";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";
import { renderLabelsPdf, type LabelContent } from "./label-pdf";
import { jsonList, pathFinder } from "./scan.queries";

export interface LabelDeps extends Deps {
  config: { PUBLIC_URL: string; FACILITY_TZ: string };
}

/** Gives the record a new token; the old one goes to the history and answers "replaced" from now on. */
export async function reissueLabel(deps: LabelDeps, actor: AuthUser, type: LabelledTypeName, id: number, reason: string): Promise<{ token: string; url: string }> {
  const token = newToken(24);
  await serialTransaction(deps.ds, async (em) => {
    const Entity = type === "container" ? Container : Instrument;
    const row = await em.getRepository<Container | Instrument>(Entity).findOneBy({ id });
    if (!row) throw new NotFound(type === "container" ? "That container" : "That instrument");
    const t = deps.now();
    await em.insert(LabelHistory, { entityType: type, entityId: id, token: row.labelToken, retiredAt: t.toISOString(), retiredById: actor.id, reason });
    await em.update(Entity, id, { labelToken: token });
    // The audit keeps a prefix only: a full retired token is harmless, but there is no need to spread it.
    await audit(em, t, actor.id, "label.reissued", type, id, { reason, retiredTokenPrefix: row.labelToken.slice(0, 6) });
  });
  return { token, url: labelUrl(deps.config.PUBLIC_URL, token) };
}

export async function labelHistory(ds: DataSource, type: LabelledTypeName, id: number): Promise<LabelHistoryEntryDto[]> {
  const rows = await ds.getRepository(LabelHistory).find({ where: { entityType: type, entityId: id }, order: { id: "DESC" } });
  const names = new Map(
    (await ds.getRepository(User).findBy({ id: In(rows.map((r) => r.retiredById).filter((x): x is number => x !== null)) })).map((u) => [u.id, u.name]),
  );
  return rows.map((r) => ({
    retiredAt: r.retiredAt,
    retiredBy: r.retiredById === null ? null : (names.get(r.retiredById) ?? null),
    reason: r.reason,
    tokenPrefix: r.token.slice(0, 6),
  }));
}

function presentStock(s: LabelStock): LabelStockDto {
  const { createdAt: _c, ...rest } = s;
  void _c;
  return rest;
}

export async function listLabelStocks(ds: DataSource): Promise<LabelStockDto[]> {
  return (await ds.getRepository(LabelStock).find({ order: { id: "ASC" } })).map(presentStock);
}

export async function addLabelStock(deps: Deps, actor: AuthUser, input: LabelStockInput): Promise<LabelStockDto> {
  const problems = stockProblems(input);
  if (problems.length) throw new RuleBroken("These labels do not fit on the page.", problems.map((message) => ({ path: "columns", message })));
  const id = await serialTransaction(deps.ds, async (em) => {
    const res = await em.insert(LabelStock, { ...input, createdAt: deps.now().toISOString() });
    const newId = res.identifiers[0].id as number;
    await audit(em, deps.now(), actor.id, "label_stock.created", "label_stock", newId, { ...input });
    return newId;
  });
  return presentStock(await deps.ds.getRepository(LabelStock).findOneByOrFail({ id }));
}

/** The label PDF for containers and instruments; 422 over the maximum, 404 naming ids that do not exist. */
export async function labelsPdf(deps: LabelDeps, actor: AuthUser, q: LabelsPdfQuery): Promise<{ pdf: Buffer; count: number }> {
  const { ds } = deps;
  const cIds = q.containerIds ?? [];
  const iIds = q.instrumentIds ?? [];
  const count = cIds.length + iIds.length;
  if (count > MAX_LABELS_PER_REQUEST) {
    throw new RuleBroken(`Ask for at most ${MAX_LABELS_PER_REQUEST} labels at a time; this asked for ${count}.`, [
      { path: "containerIds", message: `At most ${MAX_LABELS_PER_REQUEST} labels per PDF.` },
    ], "too_many_labels");
  }
  let stock: LabelStockLayout | null = null;
  if (q.stockId !== undefined) {
    stock = await ds.getRepository(LabelStock).findOneBy({ id: q.stockId });
    if (!stock) throw new NotFound("That label stock");
  }
  const containers = cIds.length ? await ds.getRepository(Container).findBy({ id: In(cIds) }) : [];
  const instruments = iIds.length ? await ds.getRepository(Instrument).findBy({ id: In(iIds) }) : [];
  const missing = [
    ...cIds.filter((id) => !containers.some((c) => c.id === id)).map((id) => `container ${id}`),
    ...iIds.filter((id) => !instruments.some((i) => i.id === id)).map((id) => `instrument ${id}`),
  ];
  if (missing.length) throw new NotFound(`No label can be made: ${missing.join(", ")}`);

  const chemicals = new Map((await ds.getRepository(Chemical).findBy({ id: In([...new Set(containers.map((c) => c.chemicalId))]) })).map((c) => [c.id, c]));
  const where = await pathFinder(ds);
  const now = deps.now();
  const today = DateTime.fromJSDate(now).setZone(deps.config.FACILITY_TZ).toISODate();
  const labels: LabelContent[] = [];
  for (const id of cIds) {
    const c = containers.find((x) => x.id === id)!;
    const chem = chemicals.get(c.chemicalId)!;
    const hCodes = jsonList(chem.hazardStatements);
    const stored = jsonList(chem.pictograms) as GhsPictogram[];
    const signal = chem.signalWord ?? signalWordFor(hCodes);
    const amount = `${c.initialQuantity} ${c.unit}`;
    const conc = c.concentrationMolPerL !== null ? `${c.concentrationMolPerL} mol/L · ` : "";
    labels.push({
      url: labelUrl(deps.config.PUBLIC_URL, c.labelToken),
      size: q.size ?? (c.kind === "vial" ? "vial" : "bottle"),
      title: chem.name,
      subtitle: `${conc}${c.kind} ${amount} · CAS ${chem.casNumber} · container ${c.id}`,
      signalWord: signal === "Danger" || signal === "Warning" ? signal : null,
      hCodes,
      pictograms: stored.length ? stored : pictogramsFor(hCodes),
      location: where(c.locationId),
      dates: [`Printed ${today}`, ...(c.expiresAt ? [`Expires ${c.expiresAt}`] : [])],
    });
  }
  for (const id of iIds) {
    const i = instruments.find((x) => x.id === id)!;
    labels.push({
      url: labelUrl(deps.config.PUBLIC_URL, i.labelToken),
      size: q.size ?? "bottle",
      title: i.name,
      subtitle: [INSTRUMENT_KIND_LABELS[i.kind], i.model, i.serialNumber && `S/N ${i.serialNumber}`].filter(Boolean).join(" · "),
      signalWord: null,
      hCodes: [],
      pictograms: [],
      location: where(i.locationId),
      dates: [`Printed ${today}`],
    });
  }
  const pdf = await renderLabelsPdf(labels, (l) => stock ?? SINGLE_LABEL[l.size], { now, skip: q.skip });
  await serialTransaction(ds, (em) => audit(em, now, actor.id, "labels.printed", "label", null, { containerIds: cIds, instrumentIds: iIds, stockId: q.stockId ?? null }));
  return { pdf, count };
}
