/**
 * The printable Safety review (PDF, pdfkit): totals per location against limits with over-limit
 * findings in words, then the review lists. It carries the caution that the fire code, the
 * safety office and the safety data sheet take precedence over Phasebook's figures.
 */
import PDFDocument from "pdfkit";
import type { DataSource } from "typeorm";
import { safetyLocationTotals, safetyReview } from "./safety.queries";

export const PRECEDENCE_CAUTION =
  "Storage limits and handling rules are those set by the local fire code, the institution's safety office and the safety data sheet, which take precedence over anything Phasebook computes.";

const litres = (n: number) => `${n.toFixed(2)} L`;

export async function renderSafetyReport(ds: DataSource, now: Date, tz: string): Promise<Buffer> {
  const totals = await safetyLocationTotals(ds);
  const review = await safetyReview(ds, now, tz);
  const doc = new PDFDocument({ size: "A4", margin: 48, info: { Title: "Phasebook safety review", Author: "Phasebook" } });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on("end", () => resolve(Buffer.concat(chunks))));

  const heading = (text: string) => {
    if (doc.y > 720) doc.addPage();
    doc.moveDown(0.8).font("Helvetica-Bold").fontSize(13).text(text).moveDown(0.3).font("Helvetica").fontSize(9.5);
  };
  const line = (text: string, bold = false) => {
    if (doc.y > 780) doc.addPage();
    doc.font(bold ? "Helvetica-Bold" : "Helvetica").text(text);
  };

  doc.font("Helvetica-Bold").fontSize(18).text("Safety review");
  doc.font("Helvetica").fontSize(10).text(`Facility date ${review.today} · generated ${now.toISOString()} by Phasebook`);
  doc.moveDown(0.5).fontSize(9).fillColor("#7a2e0e").text(PRECEDENCE_CAUTION).fillColor("black");

  heading("Flammable liquids per location (GHS categories 1–3; category 4 combustible)");
  const over = totals.filter((t) => t.overLimit);
  line(over.length ? `${over.length} location(s) over their limit:` : "No location is over its limit.", true);
  for (const t of over) {
    const parts = [];
    if (t.flammableOverLimit) parts.push(`flammable ${litres(t.flammableLitres)} against a limit of ${litres(t.flammableLimitLitres!)}`);
    if (t.combustibleOverLimit) parts.push(`combustible ${litres(t.combustibleLitres)} against a limit of ${litres(t.combustibleLimitLitres!)}`);
    line(`OVER LIMIT  ${t.path}: ${parts.join("; ")}`, true);
  }
  doc.moveDown(0.4);
  for (const t of totals.filter((x) => x.flammableLitres > 0 || x.combustibleLitres > 0 || x.flammableLimitLitres !== null)) {
    const limit = t.flammableLimitLitres === null ? "no limit set" : `limit ${litres(t.flammableLimitLitres)}`;
    const cats = `cat. 1 ${litres(t.litresByCategory["1"])}, 2 ${litres(t.litresByCategory["2"])}, 3 ${litres(t.litresByCategory["3"])}, 4 ${litres(t.litresByCategory["4"])}`;
    line(`${t.path}: ${litres(t.flammableLitres)} flammable (${limit}); ${cats}${t.overLimit ? " — OVER LIMIT" : ""}`);
    if (t.limitNote) doc.fontSize(8).fillColor("#555").text(`   ${t.limitNote}`).fillColor("black").fontSize(9.5);
  }

  heading("Carcinogens and acutely toxic substances, and where they are");
  if (!review.hazardous.length) line("None on record.");
  for (const h of review.hazardous) {
    const flags = [h.carcinogen ? "carcinogen" : null, h.acuteToxic ? "acutely toxic" : null].filter(Boolean).join(", ");
    line(`${h.name} (${h.casNumber}) — ${flags}; ${h.hazardStatements.join(" ")}`, true);
    if (!h.containers.length) line("   no containers in stock");
    for (const c of h.containers) line(`   #${c.id}: ${c.quantity} ${c.unit} at ${c.locationPath ?? "no location"} (${c.status.replace("_", " ")})`);
  }

  heading("Expired or past their retest date");
  if (!review.expired.length) line("None.");
  for (const c of review.expired) {
    line(`#${c.id} ${c.chemicalName}, ${c.quantity} ${c.unit}, ${c.locationPath ?? "no location"} — expires ${c.expiresAt ?? "–"}, retest ${c.retestAt ?? "–"}`);
  }

  heading("Containers without a location");
  if (!review.noLocation.length) line("None.");
  for (const c of review.noLocation) line(`#${c.id} ${c.chemicalName}, ${c.quantity} ${c.unit}`);

  heading("On hold");
  if (!review.onHold.containers.length && !review.onHold.chemicals.length) line("Nothing is on hold.");
  for (const ch of review.onHold.chemicals) line(`Chemical ${ch.name}: ${ch.reason}`);
  for (const c of review.onHold.containers) line(`#${c.id} ${c.chemicalName} at ${c.locationPath ?? "no location"}: ${c.holdReason ?? "no reason given"}`);

  heading("Halogenated waste");
  if (!review.halogenatedWaste.length) line("No halogenated waste containers in use.");
  for (const w of review.halogenatedWaste) {
    line(`#${w.id} ${w.chemicalName} waste at ${w.locationPath ?? "no location"}: ${w.quantity} of ${w.initialQuantity} ${w.unit} (${w.fillPercent ?? "?"} % full)`);
  }

  heading(`Safety data sheets due for review (older than ${review.sdsReviewMonths} months, or missing)`);
  if (!review.sdsDue.length) line("All sheets are current.");
  for (const s of review.sdsDue) line(`${s.name}: ${s.reviewedOn ? `reviewed ${s.reviewedOn}` : "no sheet on file"}`);

  doc.end();
  return done;
}
