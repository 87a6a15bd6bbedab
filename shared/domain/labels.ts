/**
 * QR labels: the shape of a label token, the URL a label encodes, the QR version and
 * error-correction level that hold that URL, and where labels sit on a sheet of label stock.
 * Pure functions, used by the PDF renderer on the server and by the Scan page in the browser.
 *
 * QR facts (ISO/IEC 18004, as reproduced by a secondary source, not re-read in the standard): side length
 * = 4 × version + 17 modules; error correction recovers about 7 % (L), 15 % (M), 25 % (Q)
 * and 30 % (H) of the symbol. Labels use level Q: a smudge or a drop of solvent over a
 * quarter of the code still reads, at a modest cost in size over M.
 */

/** 24 random bytes in base64url: 32 characters, 192 bits. At least 22 characters (128 bits) are accepted. */
export const LABEL_TOKEN_PATTERN = /^[A-Za-z0-9_-]{22,64}$/;

export function isLabelTokenShape(token: string): boolean {
  return LABEL_TOKEN_PATTERN.test(token);
}

/** What a label encodes: the public address of the scan route for its token. */
export function labelUrl(publicUrl: string, token: string): string {
  return `${publicUrl.replace(/\/+$/, "")}/s/${token}`;
}

/**
 * Reads a label token out of whatever a person typed, pasted or a camera decoded: the full
 * label URL (any host, so a label printed under an old address still resolves) or the bare
 * token. Null when nothing token-shaped is there.
 */
export function tokenFromScan(text: string): string | null {
  const s = text.trim();
  const m = /\/s\/([A-Za-z0-9_-]+)\/?(?:[?#].*)?$/.exec(s);
  const candidate = m ? m[1] : s;
  return isLabelTokenShape(candidate) ? candidate : null;
}

export type QrEcLevel = "L" | "M" | "Q" | "H";

/**
 * Byte-mode capacity (bytes) per version and error-correction level.
 * L and M for versions 1–4: ISO/IEC 18004 capacity table as reproduced by a secondary source
 * (1-L 17, 1-M 14, 2-L 32, 2-M 26, 3-M 42, 4-L 78, 4-M 62). 3-L and all Q and H values, and
 * versions 5–10: from memory of the same table; the unit tests check every entry against the
 * qrcode package, which refuses one byte more than a version holds.
 */
export const QR_BYTE_CAPACITY: Readonly<Record<QrEcLevel, readonly number[]>> = {
  //  v1   v2   v3   v4   v5   v6   v7   v8   v9  v10
  L: [17, 32, 53, 78, 106, 134, 154, 192, 230, 271],
  M: [14, 26, 42, 62, 84, 106, 122, 152, 180, 213],
  Q: [11, 20, 32, 46, 60, 74, 86, 108, 130, 151],
  H: [7, 14, 24, 34, 44, 58, 64, 84, 98, 119],
};

/** The level every Phasebook label is printed with; see the module header for why. */
export const LABEL_EC_LEVEL: QrEcLevel = "Q";

/** Side length in modules, without the quiet zone (ISO/IEC 18004: 4 × version + 17). */
export function qrSideModules(version: number): number {
  return 4 * version + 17;
}

/**
 * The smallest version (1–10) whose byte-mode capacity at this level holds the data. Labels
 * stay small enough to print on a vial; a URL too long for version 10 is a configuration
 * mistake (PUBLIC_URL) and throws.
 */
export function chooseQrVersion(byteLength: number, ec: QrEcLevel = LABEL_EC_LEVEL): number {
  const caps = QR_BYTE_CAPACITY[ec];
  const i = caps.findIndex((c) => c >= byteLength);
  if (i < 0) throw new RangeError(`A ${byteLength}-byte label address does not fit a version 10 QR code at level ${ec}; shorten PUBLIC_URL.`);
  return i + 1;
}

/** UTF-8 length, which is what byte mode stores. */
export function utf8Length(text: string): number {
  return new TextEncoder().encode(text).length;
}

/** Label stock geometry in millimetres (see the label_stocks table). */
export interface LabelStockLayout {
  pageWidthMm: number;
  pageHeightMm: number;
  labelWidthMm: number;
  labelHeightMm: number;
  columns: number;
  rows: number;
  marginTopMm: number;
  marginLeftMm: number;
  gapXMm: number;
  gapYMm: number;
}

export interface LabelSlot {
  /** 0-based page index. */
  page: number;
  /** Top-left corner of the label, from the page's top-left corner, in mm. */
  xMm: number;
  yMm: number;
}

/** Rounding slack for dimensions given in inches and converted to mm (1 in = 25.4 mm exactly). */
const FIT_TOLERANCE_MM = 0.01;

/** Problems with a stock's geometry, in words; empty when the labels fit on the page. */
export function stockProblems(s: LabelStockLayout): string[] {
  const out: string[] = [];
  const right = s.marginLeftMm + s.columns * s.labelWidthMm + (s.columns - 1) * s.gapXMm;
  const bottom = s.marginTopMm + s.rows * s.labelHeightMm + (s.rows - 1) * s.gapYMm;
  if (right > s.pageWidthMm + FIT_TOLERANCE_MM) out.push(`The labels reach ${right.toFixed(1)} mm across a ${s.pageWidthMm} mm wide page.`);
  if (bottom > s.pageHeightMm + FIT_TOLERANCE_MM) out.push(`The labels reach ${bottom.toFixed(1)} mm down a ${s.pageHeightMm} mm tall page.`);
  return out;
}

/**
 * Where each of `count` labels goes: row by row, left to right, page after page. `skip`
 * leaves the first positions of the first sheet empty, for a sheet already partly used.
 */
export function labelSlots(s: LabelStockLayout, count: number, skip = 0): LabelSlot[] {
  const perPage = s.columns * s.rows;
  const first = Math.min(Math.max(0, Math.floor(skip)), perPage - 1);
  const slots: LabelSlot[] = [];
  for (let n = 0; n < count; n++) {
    const k = first + n;
    const page = Math.floor(k / perPage);
    const within = k % perPage;
    const row = Math.floor(within / s.columns);
    const col = within % s.columns;
    slots.push({
      page,
      xMm: s.marginLeftMm + col * (s.labelWidthMm + s.gapXMm),
      yMm: s.marginTopMm + row * (s.labelHeightMm + s.gapYMm),
    });
  }
  return slots;
}

/** Single labels on a roll: the page is the label. Sizes are common practice for vials and bottles. */
export const SINGLE_LABEL: Readonly<Record<"vial" | "bottle", LabelStockLayout>> = {
  vial: { pageWidthMm: 40, pageHeightMm: 20, labelWidthMm: 40, labelHeightMm: 20, columns: 1, rows: 1, marginTopMm: 0, marginLeftMm: 0, gapXMm: 0, gapYMm: 0 },
  bottle: { pageWidthMm: 100, pageHeightMm: 50, labelWidthMm: 100, labelHeightMm: 50, columns: 1, rows: 1, marginTopMm: 0, marginLeftMm: 0, gapXMm: 0, gapYMm: 0 },
};

/** The most labels one PDF request may ask for; more answers 422 instead of tying up the server. */
export const MAX_LABELS_PER_REQUEST = 500;

/** PDF points per millimetre (1 pt = 1/72 in, 1 in = 25.4 mm exactly). */
export const PT_PER_MM = 72 / 25.4;
