/**
 * Reads what a generated PDF says, for tests: the text shown by each page's content streams
 * (pdf-lib decodes the streams; the Tj/TJ strings are read back as WinAnsi, the encoding of the
 * standard fonts) and the URIs of its link annotations.
 */
import { PDFArray, PDFDict, PDFDocument, PDFHexString, PDFName, PDFRawStream, PDFString, decodePDFRawStream, type PDFObject } from "pdf-lib";

/** The WinAnsi bytes above 0x7F that our statements use; the rest read as Latin-1. */
const WIN_ANSI: Record<number, string> = { 0x85: "…", 0x96: "–", 0x97: "—", 0x91: "‘", 0x92: "’", 0x93: "“", 0x94: "”" };

function bytesToText(bytes: number[]): string {
  return bytes.map((b) => WIN_ANSI[b] ?? String.fromCharCode(b)).join("");
}

function hexBytes(hex: string): number[] {
  const clean = hex.replace(/\s+/g, "");
  const out: number[] = [];
  for (let i = 0; i < clean.length; i += 2) out.push(parseInt(clean.slice(i, i + 2).padEnd(2, "0"), 16));
  return out;
}

function literalBytes(s: string): number[] {
  const out: number[] = [];
  for (let i = 0; i < s.length; i++) {
    const c = s[i];
    if (c !== "\\") {
      out.push(c.charCodeAt(0));
      continue;
    }
    const n = s[++i];
    const esc: Record<string, number> = { n: 10, r: 13, t: 9, b: 8, f: 12, "(": 40, ")": 41, "\\": 92 };
    if (n in esc) out.push(esc[n]);
    else if (/[0-7]/.test(n)) {
      let oct = n;
      while (oct.length < 3 && /[0-7]/.test(s[i + 1] ?? "")) oct += s[++i];
      out.push(parseInt(oct, 8));
    }
  }
  return out;
}

/** The strings of one content stream, a line per text object (BT … ET). */
function showText(content: string): string {
  const lines: string[] = [];
  for (const block of content.split(/\bET\b/)) {
    let line = "";
    const ops = /\[((?:[^\]\\]|\\.)*)\]\s*TJ|<([0-9a-fA-F\s]*)>\s*Tj|\(((?:[^)\\]|\\.)*)\)\s*Tj/g;
    for (let m = ops.exec(block); m; m = ops.exec(block)) {
      if (m[1] !== undefined) {
        const parts = /<([0-9a-fA-F\s]*)>|\(((?:[^)\\]|\\.)*)\)/g;
        for (let p = parts.exec(m[1]); p; p = parts.exec(m[1])) line += bytesToText(p[1] !== undefined ? hexBytes(p[1]) : literalBytes(p[2]));
      } else if (m[2] !== undefined) line += bytesToText(hexBytes(m[2]));
      else line += bytesToText(literalBytes(m[3]));
    }
    if (line) lines.push(line);
  }
  return lines.join("\n");
}

function streamsOf(doc: PDFDocument, obj: PDFObject | undefined): PDFRawStream[] {
  const o = obj ? doc.context.lookup(obj) : undefined;
  if (o instanceof PDFRawStream) return [o];
  if (o instanceof PDFArray) return o.asArray().flatMap((x) => streamsOf(doc, x));
  return [];
}

export interface PdfReading {
  pages: number;
  /** Every page's text, a line per text object. */
  text: string;
  /** URIs of the link annotations, in page order. */
  links: string[];
  title: string | undefined;
}

export async function readPdf(bytes: Uint8Array): Promise<PdfReading> {
  const doc = await PDFDocument.load(bytes);
  const texts: string[] = [];
  const links: string[] = [];
  for (const page of doc.getPages()) {
    for (const stream of streamsOf(doc, page.node.get(PDFName.of("Contents")))) {
      texts.push(showText(Buffer.from(decodePDFRawStream(stream).decode()).toString("latin1")));
    }
    const annots = page.node.Annots();
    for (const ref of annots?.asArray() ?? []) {
      const annot = doc.context.lookup(ref);
      const action = annot instanceof PDFDict ? annot.lookup(PDFName.of("A")) : undefined;
      const uri = action instanceof PDFDict ? action.lookup(PDFName.of("URI")) : undefined;
      if (uri instanceof PDFString || uri instanceof PDFHexString) links.push(uri.decodeText());
    }
  }
  return { pages: doc.getPageCount(), text: texts.join("\n"), links, title: doc.getTitle() };
}
