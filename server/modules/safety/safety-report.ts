/**
 * The printable Safety review (PDF, pdfkit), as tables a safety office files: per location the
 * litres of each fire-code liquid class, each limit with what counts toward it and its finding,
 * and the containers whose volume is unknown; then the review lists. It carries the caution that
 * the fire code, the safety office and the safety data sheet take precedence over Phasebook's figures.
 */
import PDFDocument from "pdfkit";
import type { DataSource } from "typeorm";
import { NFPA_CLASSES } from "@shared/domain/storage";
import { LIMIT_FINDING_LABELS } from "@shared/schemas/storage";
import { pdfTable } from "../../core/pdf-table";
import { safetyLocationTotals, safetyReview } from "./safety.queries";

export const PRECEDENCE_CAUTION =
  "Storage limits and handling rules are those set by the local fire code, the institution's safety office and the safety data sheet, which take precedence over anything Phasebook computes.";

const litres = (n: number) => n.toFixed(2);

export async function renderSafetyReport(ds: DataSource, now: Date, tz: string): Promise<Buffer> {
  const totals = await safetyLocationTotals(ds);
  const review = await safetyReview(ds, now, tz);
  const doc = new PDFDocument({ size: "A4", margin: 40, info: { Title: "Phasebook safety review", Author: "Phasebook" } });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on("end", () => resolve(Buffer.concat(chunks))));
  const heading = (text: string) => {
    if (doc.y > 700) doc.addPage();
    doc.moveDown(0.6).font("Helvetica-Bold").fontSize(12).fillColor("black").text(text, doc.page.margins.left).moveDown(0.3).font("Helvetica").fontSize(9);
  };
  const none = (text: string) => doc.font("Helvetica").fontSize(9).text(text).moveDown(0.3);

  doc.font("Helvetica-Bold").fontSize(18).text("Safety review");
  doc.font("Helvetica").fontSize(10).text(`Facility date ${review.today} · generated ${now.toISOString()} by Phasebook`);
  doc.moveDown(0.5).fontSize(9).fillColor("#7a2e0e").text(PRECEDENCE_CAUTION).fillColor("black");

  heading("Flammable and combustible liquids per location, by NFPA 30 class (litres)");
  const shown = totals.filter((t) => t.limits.length > 0 || t.unknownVolumeContainers > 0 || NFPA_CLASSES.some((c) => t.litresByClass[c] > 0));
  pdfTable(
    doc,
    [{ header: "Location", width: 175 }, ...NFPA_CLASSES.map((c) => ({ header: c, width: 45, align: "right" as const })), { header: "Unknown volume", width: 70, align: "right" }],
    shown.map((t) => [t.path, ...NFPA_CLASSES.map((c) => litres(t.litresByClass[c])), t.unknownVolumeContainers ? `${t.unknownVolumeContainers} container(s)` : "–"]),
  );

  heading("Limits and findings");
  const limitRows = totals.flatMap((t) =>
    t.limits.map((l) => [
      t.path,
      `Class ${l.classes.join(" + ")}`,
      `${litres(l.maxLitres)} L${l.enteredUnit === "US gal" ? ` (${l.enteredVolume} US gal)` : ""}`,
      l.includesCabinets ? "yes" : "no",
      `${litres(l.totalLitres)} L${l.unknownVolumeContainers ? ` + ${l.unknownVolumeContainers} of unknown volume` : ""}`,
      LIMIT_FINDING_LABELS[l.finding],
      [l.note, t.limitNote].filter(Boolean).join(" "),
    ]),
  );
  if (!limitRows.length) none("No limits are set.");
  else
    pdfTable(
      doc,
      [
        { header: "Location", width: 110 },
        { header: "Classes", width: 60 },
        { header: "Limit", width: 60, align: "right" },
        { header: "Cabinets count", width: 42 },
        { header: "Counted", width: 70, align: "right" },
        { header: "Finding", width: 70 },
        { header: "Source of the limit", width: 103 },
      ],
      limitRows,
    );

  heading("Containers whose volume cannot be computed (kept by mass or amount without a density)");
  const unknown = review.unknownVolume;
  if (!unknown.length) none("None: every flammable or combustible liquid's volume is known.");
  else
    pdfTable(
      doc,
      [
        { header: "Container", width: 55 },
        { header: "Chemical", width: 170 },
        { header: "Quantity", width: 80, align: "right" },
        { header: "Location", width: 210 },
      ],
      unknown.map((c) => [`#${c.id}`, c.chemicalName, `${c.quantity} ${c.unit}`, c.locationPath ?? "no location"]),
    );

  heading("Carcinogens and acutely toxic substances, and where they are");
  if (!review.hazardous.length) none("None on record.");
  else
    pdfTable(
      doc,
      [
        { header: "Chemical", width: 130 },
        { header: "Hazard", width: 90 },
        { header: "H-statements", width: 110 },
        { header: "Containers", width: 185 },
      ],
      review.hazardous.map((h) => [
        `${h.name} (${h.casNumber})`,
        [h.carcinogen ? "carcinogen" : null, h.acuteToxic ? "acutely toxic" : null].filter(Boolean).join(", "),
        h.hazardStatements.join(" "),
        h.containers.length ? h.containers.map((c) => `#${c.id}: ${c.quantity} ${c.unit} at ${c.locationPath ?? "no location"}`).join("\n") : "none in stock",
      ]),
    );

  const containerTable = (rows: typeof review.expired, extra: { header: string; value: (c: (typeof review.expired)[number]) => string }) =>
    pdfTable(
      doc,
      [
        { header: "Container", width: 55 },
        { header: "Chemical", width: 150 },
        { header: "Quantity", width: 70, align: "right" },
        { header: "Location", width: 150 },
        { header: extra.header, width: 90 },
      ],
      rows.map((c) => [`#${c.id}`, c.chemicalName, `${c.quantity} ${c.unit}`, c.locationPath ?? "no location", extra.value(c)]),
    );

  heading("Expired or past their retest date");
  if (!review.expired.length) none("None.");
  else containerTable(review.expired, { header: "Expires / retest", value: (c) => `${c.expiresAt ?? "–"} / ${c.retestAt ?? "–"}` });

  heading("Containers without a location");
  if (!review.noLocation.length) none("None.");
  else containerTable(review.noLocation, { header: "Status", value: (c) => c.status.replace("_", " ") });

  heading("On hold");
  if (!review.onHold.containers.length && !review.onHold.chemicals.length) none("Nothing is on hold.");
  if (review.onHold.chemicals.length) pdfTable(doc, [{ header: "Chemical on hold", width: 200 }, { header: "Reason", width: 315 }], review.onHold.chemicals.map((c) => [c.name, c.reason ?? ""]));
  if (review.onHold.containers.length) containerTable(review.onHold.containers, { header: "Reason", value: (c) => c.holdReason ?? "no reason given" });

  heading("Halogenated waste");
  if (!review.halogenatedWaste.length) none("No halogenated waste containers in use.");
  else containerTable(review.halogenatedWaste, { header: "Fill", value: (c) => `${c.quantity} of ${c.initialQuantity} ${c.unit}` });

  heading(`Safety data sheets due for review (older than ${review.sdsReviewMonths} months, or missing)`);
  if (!review.sdsDue.length) none("All sheets are current.");
  else pdfTable(doc, [{ header: "Chemical", width: 300 }, { header: "Last reviewed", width: 215 }], review.sdsDue.map((s) => [s.name, s.reviewedOn ?? "no sheet on file"]));

  doc.end();
  return done;
}
