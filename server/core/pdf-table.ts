/**
 * A table for pdfkit documents: a header row, then rows whose cells wrap inside their column
 * (never cut off with "…"), each row as tall as its tallest cell, a new page (with the header
 * again) when a row would not fit. Used by the Safety review PDF and the statement PDF.
 */
import type PDFKit from "pdfkit";

export interface PdfColumn {
  header: string;
  /** Width in points. */
  width: number;
  align?: "left" | "right";
}

export interface PdfTableOptions {
  fontSize?: number;
  /** Bottom of the usable page, in points from the top. */
  bottom?: number;
  /** Rows drawn in bold (e.g. subtotals), by index. */
  boldRows?: ReadonlySet<number>;
}

const PAD = 3;

export function pdfTable(doc: PDFKit.PDFDocument, columns: readonly PdfColumn[], rows: readonly (readonly string[])[], opts: PdfTableOptions = {}): void {
  const size = opts.fontSize ?? 8.5;
  const bottom = opts.bottom ?? doc.page.height - doc.page.margins.bottom;
  const left = doc.page.margins.left;
  // A cell that fits on one line is one line high and drawn as one run of text; only longer
  // ones go through pdfkit's line wrapper, which costs far more (a statement has thousands of
  // short cells). Widths are measured in the row's font.
  // Widths of the table's strings in each font: dates, units, prices and amounts repeat on many rows.
  const widthsIn = { regular: new Map<string, number>(), bold: new Map<string, number>() };
  const widthOf = (c: string, bold: boolean) => {
    const known = bold ? widthsIn.bold : widthsIn.regular;
    let w = known.get(c);
    if (w === undefined) {
      w = doc.widthOfString(c);
      known.set(c, w);
    }
    return w;
  };
  const measure = (cells: readonly string[], bold: boolean) => {
    doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(size);
    const line = doc.currentLineHeight(true);
    const widths = cells.map((c) => (c.includes("\n") ? Infinity : widthOf(c, bold)));
    const fits = widths.map((w, i) => w < columns[i].width - 2 * PAD);
    const height = Math.max(...cells.map((c, i) => (fits[i] ? line : doc.heightOfString(c || " ", { width: columns[i].width - 2 * PAD })))) + 2 * PAD;
    return { height, widths, fits };
  };
  const drawRow = (cells: readonly string[], bold: boolean, shade: boolean) => {
    const m = measure(cells, bold);
    if (doc.y + m.height > bottom) {
      doc.addPage();
      drawHeader();
    }
    const h = m.height;
    const top = doc.y;
    if (shade) doc.save().rect(left, top, columns.reduce((w, c) => w + c.width, 0), h).fill("#eef1f4").restore();
    let x = left;
    doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(size).fillColor("black");
    cells.forEach((cell, i) => {
      const inner = columns[i].width - 2 * PAD;
      if (!m.fits[i]) doc.text(cell, x + PAD, top + PAD, { width: inner, align: columns[i].align ?? "left" });
      else if (cell !== "") doc.text(cell, columns[i].align === "right" ? x + PAD + inner - m.widths[i] : x + PAD, top + PAD, { lineBreak: false });
      x += columns[i].width;
    });
    doc.moveTo(left, top + h).lineTo(x, top + h).lineWidth(0.4).strokeColor("#9aa5b1").stroke();
    doc.x = left;
    doc.y = top + h;
  };
  const drawHeader = () => drawRow(columns.map((c) => c.header), true, true);
  drawHeader();
  rows.forEach((r, i) => drawRow(r, opts.boldRows?.has(i) ?? false, false));
  doc.moveDown(0.5);
}
