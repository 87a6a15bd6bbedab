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
  const heightOf = (cells: readonly string[], bold: boolean) => {
    doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(size);
    return Math.max(...cells.map((c, i) => doc.heightOfString(c || " ", { width: columns[i].width - 2 * PAD }))) + 2 * PAD;
  };
  const drawRow = (cells: readonly string[], bold: boolean, shade: boolean) => {
    const h = heightOf(cells, bold);
    if (doc.y + h > bottom) {
      doc.addPage();
      drawHeader();
    }
    const top = doc.y;
    if (shade) doc.save().rect(left, top, columns.reduce((w, c) => w + c.width, 0), h).fill("#eef1f4").restore();
    let x = left;
    doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(size).fillColor("black");
    cells.forEach((cell, i) => {
      doc.text(cell, x + PAD, top + PAD, { width: columns[i].width - 2 * PAD, align: columns[i].align ?? "left" });
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
