/**
 * Draws label sheets as PDF with pdfkit: per label a QR code of the label URL (vector squares,
 * crisp at any printer resolution), the name, the key hazard pictograms and H-codes for
 * chemicals, the location and the date. Each label also carries a link annotation to its URL,
 * so the PDF itself can be checked (and clicked) label by label.
 */
import PDFDocument from "pdfkit";
import QRCode from "qrcode";
import {
  chooseQrVersion,
  LABEL_EC_LEVEL,
  labelSlots,
  PT_PER_MM,
  type LabelStockLayout,
  type QrEcLevel,
  utf8Length,
} from "@shared/domain/labels";
import { PICTOGRAM_NAMES, type GhsPictogram } from "@shared/domain/hazards";

export interface LabelContent {
  url: string;
  /** Vial labels show less text; bottle labels show everything. */
  size: "vial" | "bottle";
  title: string;
  /** A line under the title: kind, amount, concentration or instrument kind. */
  subtitle: string;
  signalWord: string | null;
  hCodes: string[];
  pictograms: GhsPictogram[];
  location: string | null;
  /** Dates worth printing, e.g. "Printed 2026-12-02", "Expires 2027-06-30". */
  dates: string[];
}

export interface LabelQr {
  version: number;
  ec: QrEcLevel;
  /** Modules per side, without the quiet zone. */
  size: number;
  dark(row: number, col: number): boolean;
}

/**
 * The QR symbol of a label URL: byte mode (so the capacity table applies as printed), level Q,
 * and the smallest version that holds it.
 */
export function labelQr(url: string): LabelQr {
  const version = chooseQrVersion(utf8Length(url), LABEL_EC_LEVEL);
  const qr = QRCode.create([{ data: new TextEncoder().encode(url), mode: "byte" }], { errorCorrectionLevel: LABEL_EC_LEVEL, version });
  const m = qr.modules;
  return { version: qr.version, ec: LABEL_EC_LEVEL, size: m.size, dark: (r, c) => Boolean(m.get(r, c)) };
}

/** ISO/IEC 18004 asks for a light margin of four modules around the symbol. */
export const QUIET_ZONE_MODULES = 4;

// pdfkit's built-in Helvetica speaks WinAnsi: Latin-1 plus these; anything else would print as garbage.
const WIN_ANSI_EXTRA = new Set([..."€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ"]);
function winAnsi(text: string): string {
  return [...text]
    .map((ch) => {
      const code = ch.codePointAt(0)!;
      if ((code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || WIN_ANSI_EXTRA.has(ch)) return ch;
      if (ch === "·" || ch === "•") return ch;
      if (/[₀-₉]/.test(ch)) return String(code - 0x2080);
      return "?";
    })
    .join("");
}

function drawQr(doc: PDFKit.PDFDocument, qr: LabelQr, x: number, y: number, side: number): void {
  const n = qr.size + 2 * QUIET_ZONE_MODULES;
  const unit = side / n;
  doc.save();
  doc.rect(x, y, side, side).fill("#ffffff");
  // One rectangle per horizontal run of dark modules keeps the file small.
  for (let r = 0; r < qr.size; r++) {
    let c = 0;
    while (c < qr.size) {
      if (!qr.dark(r, c)) {
        c++;
        continue;
      }
      const start = c;
      while (c < qr.size && qr.dark(r, c)) c++;
      // A hair of overlap closes the anti-aliasing seams some viewers draw between squares.
      doc.rect(x + (start + QUIET_ZONE_MODULES) * unit, y + (r + QUIET_ZONE_MODULES) * unit, (c - start) * unit + 0.05, unit + 0.05);
    }
  }
  doc.fill("#000000");
  doc.restore();
}

/** A GHS-style diamond (red border on white) with the pictogram code inside, drawn without image files. */
function drawPictogram(doc: PDFKit.PDFDocument, code: GhsPictogram, x: number, y: number, side: number): void {
  const h = side / 2;
  doc.save();
  doc
    .polygon([x + h, y], [x + side, y + h], [x + h, y + side], [x, y + h])
    .lineWidth(Math.max(0.6, side / 14))
    .fillAndStroke("#ffffff", "#d00000");
  doc.fillColor("#000000").font("Helvetica-Bold").fontSize(side / 5.5);
  doc.text(code, x, y + h - side / 11, { width: side, align: "center", lineBreak: false });
  doc.restore();
}

function drawLabel(doc: PDFKit.PDFDocument, label: LabelContent, x: number, y: number, w: number, h: number): void {
  const qr = labelQr(label.url);
  const pad = Math.min(w, h) * 0.05;
  const qrSide = Math.min(h - 2 * pad, w * (label.size === "vial" ? 0.5 : 0.42));
  drawQr(doc, qr, x + pad, y + (h - qrSide) / 2, qrSide);
  doc.link(x + pad, y + (h - qrSide) / 2, qrSide, qrSide, label.url);

  const tx = x + pad + qrSide + pad * 0.6;
  const tw = x + w - pad - tx;
  let ty = y + pad;
  const bottom = y + h - pad;
  // Font sizes follow the label's height so one design serves every stock.
  const vial = label.size === "vial";
  const base = vial ? Math.max(3.5, Math.min(6.5, h / 8.5)) : Math.max(4, Math.min(7.5, h / 18));
  const line = (text: string, size: number, bold = false) => {
    if (!text || ty + size > bottom + 0.5) return;
    doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(size).fillColor("#000000");
    const clean = winAnsi(text);
    const opts = { width: tw, height: bottom - ty, ellipsis: true, lineGap: 0 };
    const used = doc.heightOfString(clean, opts);
    doc.text(clean, tx, ty, opts);
    ty += Math.min(used, bottom - ty) + size * 0.15;
  };

  line(label.title, base * (vial ? 1.1 : 1.3), true);
  if (!vial) line(label.subtitle, base);
  if (label.signalWord || label.hCodes.length) {
    line([label.signalWord, label.hCodes.join(" ")].filter(Boolean).join(": "), base, Boolean(label.signalWord));
  }
  if (label.size === "bottle" && label.pictograms.length) {
    const side = Math.min(base * 3.4, (tw - 2) / Math.max(1, label.pictograms.length) - 1);
    if (ty + side <= bottom - base * 2) {
      label.pictograms.forEach((p, i) => drawPictogram(doc, p, tx + i * (side + 1), ty, side));
      ty += side + base * 0.3;
    }
    line(label.pictograms.map((p) => PICTOGRAM_NAMES[p]).join(", "), base * 0.85);
  } else if (label.pictograms.length) {
    line(label.pictograms.join(" "), base * 0.9);
  }
  if (label.location) line(label.location, base * 0.9);
  line(label.dates.join(" · "), base * 0.85);
}

/**
 * One PDF of labels on a stock: each label at its slot, new pages as the sheets fill up.
 * The document's Subject says how many labels it holds.
 */
export async function renderLabelsPdf(
  labels: LabelContent[],
  layoutFor: (label: LabelContent) => LabelStockLayout,
  opts: { now: Date; skip?: number; title?: string },
): Promise<Buffer> {
  const doc = new PDFDocument({
    autoFirstPage: false,
    margin: 0,
    info: {
      Title: opts.title ?? "Phasebook labels",
      Subject: `${labels.length} label${labels.length === 1 ? "" : "s"}`,
      Creator: "Phasebook",
      Producer: "Phasebook",
      CreationDate: opts.now,
    },
  });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  // Group by layout so a single-label roll gets one page per label and a sheet fills in order.
  const first = labels[0] ? layoutFor(labels[0]) : null;
  const sameLayout = first !== null && labels.every((l) => layoutFor(l) === first);
  const placements = sameLayout
    ? labelSlots(first!, labels.length, opts.skip ?? 0).map((s, i) => ({ ...s, layout: first!, label: labels[i] }))
    : labels.map((label, i) => ({ page: i, xMm: layoutFor(label).marginLeftMm, yMm: layoutFor(label).marginTopMm, layout: layoutFor(label), label }));

  let page = -1;
  for (const p of placements) {
    if (p.page !== page) {
      doc.addPage({ size: [p.layout.pageWidthMm * PT_PER_MM, p.layout.pageHeightMm * PT_PER_MM], margin: 0 });
      page = p.page;
    }
    drawLabel(doc, p.label, p.xMm * PT_PER_MM, p.yMm * PT_PER_MM, p.layout.labelWidthMm * PT_PER_MM, p.layout.labelHeightMm * PT_PER_MM);
  }
  if (placements.length === 0) doc.addPage({ size: "A4" });
  doc.end();
  return done;
}
