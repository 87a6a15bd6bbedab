import { describe, expect, it } from "vitest";
import QRCode from "qrcode";
import { PNG } from "pngjs";
import {
  chooseQrVersion,
  isLabelTokenShape,
  LABEL_EC_LEVEL,
  labelSlots,
  labelUrl,
  QR_BYTE_CAPACITY,
  qrSideModules,
  SINGLE_LABEL,
  stockProblems,
  tokenFromScan,
  utf8Length,
  type LabelStockLayout,
  type QrEcLevel,
} from "@shared/domain/labels";
import { labelQr } from "../../server/modules/labels";
import { newToken } from "../../server/core/tokens";
import { decode, rasterise } from "../support/qr-raster";

const bytes = (s: string) => [{ data: new TextEncoder().encode(s), mode: "byte" as const }];
const fits = (n: number, version: number, ec: QrEcLevel) => {
  try {
    QRCode.create(bytes("x".repeat(n)), { version, errorCorrectionLevel: ec });
    return true;
  } catch {
    return false;
  }
};

describe("QR_BYTE_CAPACITY", () => {
  it("agrees with the ISO/IEC 18004 capacity table as reproduced by a secondary source (1-L 17, 1-M 14, 2-L 32, 2-M 26, 3-M 42, 4-L 78, 4-M 62)", () => {
    expect(QR_BYTE_CAPACITY.L[0]).toBe(17);
    expect(QR_BYTE_CAPACITY.M[0]).toBe(14);
    expect(QR_BYTE_CAPACITY.L[1]).toBe(32);
    expect(QR_BYTE_CAPACITY.M[1]).toBe(26);
    expect(QR_BYTE_CAPACITY.M[2]).toBe(42);
    expect(QR_BYTE_CAPACITY.L[3]).toBe(78);
    expect(QR_BYTE_CAPACITY.M[3]).toBe(62);
  });

  // The Q and H rows and versions 5–10 are from memory; the qrcode package is the second opinion.
  for (const ec of ["L", "M", "Q", "H"] as const) {
    it(`holds exactly as many bytes at level ${ec} as the qrcode package fits in each version 1–10`, () => {
      QR_BYTE_CAPACITY[ec].forEach((cap, i) => {
        expect(fits(cap, i + 1, ec), `${i + 1}-${ec} holds ${cap}`).toBe(true);
        expect(fits(cap + 1, i + 1, ec), `${i + 1}-${ec} refuses ${cap + 1}`).toBe(false);
      });
    });
  }
});

describe("chooseQrVersion", () => {
  it("picks version 4 for 62 bytes at level M and version 5 for 63 (ISO/IEC 18004 table: 4-M holds 62)", () => {
    expect(chooseQrVersion(62, "M")).toBe(4);
    expect(chooseQrVersion(63, "M")).toBe(5);
  });

  it("picks version 4 for 78 bytes at level L (ISO/IEC 18004 table: 4-L holds 78)", () => {
    expect(chooseQrVersion(78, "L")).toBe(4);
    expect(chooseQrVersion(79, "L")).toBe(5);
  });

  it("refuses an address too long for version 10", () => {
    expect(() => chooseQrVersion(152, "Q")).toThrow(/PUBLIC_URL/);
  });
});

describe("qrSideModules", () => {
  it("is 4 × version + 17 (ISO/IEC 18004): 21 modules for version 1, 57 for version 10", () => {
    expect(qrSideModules(1)).toBe(21);
    expect(qrSideModules(10)).toBe(57);
  });
});

describe("label tokens", () => {
  it("are 32 URL-safe characters carrying 192 random bits, and accepted as label codes", () => {
    const t = newToken(24);
    expect(t).toMatch(/^[A-Za-z0-9_-]{32}$/);
    expect(Buffer.from(t, "base64url")).toHaveLength(24);
    expect(isLabelTokenShape(t)).toBe(true);
  });

  it("refuse shapes that cannot be a label code: too short for 128 bits, a database id, path characters", () => {
    expect(isLabelTokenShape("12")).toBe(false);
    expect(isLabelTokenShape("a".repeat(21))).toBe(false);
    expect(isLabelTokenShape("abc/def/ghi/jkl/mno/pqr/stu")).toBe(false);
    expect(isLabelTokenShape("a".repeat(65))).toBe(false);
  });
});

describe("tokenFromScan", () => {
  const token = "Qw3rTy_uIoP-asDfGhJkLzXcVbNm1234";
  it("reads the token out of a full label URL, with or without a trailing slash or query", () => {
    expect(tokenFromScan(`https://phasebook.kestrelbay.example/s/${token}`)).toBe(token);
    expect(tokenFromScan(`  http://localhost:3000/s/${token}/?from=camera `)).toBe(token);
  });
  it("accepts a bare token typed by hand", () => {
    expect(tokenFromScan(token)).toBe(token);
  });
  it("answers null for text that holds no label code", () => {
    expect(tokenFromScan("https://example.org/some/page")).toBeNull();
    expect(tokenFromScan("hello")).toBeNull();
  });
});

describe("labelQr", () => {
  const addresses = [
    labelUrl("http://localhost:3000", newToken(24)),
    labelUrl("https://phasebook.kestrelbay.example/", newToken(24)),
    labelUrl("https://lab-portal.chemistry.kestrelbay.example", newToken(24)),
  ];

  for (const url of addresses) {
    it(`encodes ${url.length} bytes at level Q in a version whose capacity holds them (${url.replace(/\/s\/.*/, "/s/…")})`, () => {
      const qr = labelQr(url);
      expect(qr.ec).toBe("Q");
      expect(LABEL_EC_LEVEL).toBe("Q");
      expect(QR_BYTE_CAPACITY.Q[qr.version - 1]).toBeGreaterThanOrEqual(utf8Length(url));
      if (qr.version > 1) expect(QR_BYTE_CAPACITY.Q[qr.version - 2]).toBeLessThan(utf8Length(url));
      // ISO/IEC 18004: side length = 4 × version + 17 modules.
      expect(qr.size).toBe(4 * qr.version + 17);
    });

    it(`decodes with jsqr, an independent decoder, to exactly the label URL (${url.replace(/\/s\/.*/, "/s/…")})`, () => {
      expect(decode(rasterise(labelQr(url)))).toBe(url);
    });
  }

  it("decodes from the PNG the qrcode package renders with the same version and level", async () => {
    const url = addresses[1];
    const qr = labelQr(url);
    const png = PNG.sync.read(await QRCode.toBuffer(bytes(url), { version: qr.version, errorCorrectionLevel: "Q", scale: 5, margin: 4 }));
    expect(decode({ width: png.width, height: png.height, data: new Uint8ClampedArray(png.data) })).toBe(url);
  });

  it("still reads through a smudge across the middle that makes the same address unreadable at level M", () => {
    const url = labelUrl("https://phasebook.kestrelbay.example/", "S2VzdHJlbEJheUxhYmVsQ29kZTAwMDAw");
    const smudge = (x: number, y: number) => (x > 0.3 && x < 0.54 && y > 0.4 && y < 0.75 ? true : undefined);
    const atM = QRCode.create(bytes(url), { errorCorrectionLevel: "M" });
    const m = { size: atM.modules.size, dark: (r: number, c: number) => Boolean(atM.modules.get(r, c)) };
    expect(decode(rasterise(m))).toBe(url);
    expect(decode(rasterise(m, 6, 4, smudge as never))).toBeNull();
    expect(decode(rasterise(labelQr(url), 6, 4, smudge as never))).toBe(url);
  });
});

describe("stock geometry", () => {
  const a4: LabelStockLayout = {
    pageWidthMm: 210, pageHeightMm: 297, labelWidthMm: 70, labelHeightMm: 37,
    columns: 3, rows: 8, marginTopMm: 0.5, marginLeftMm: 0, gapXMm: 0, gapYMm: 0,
  };
  // US Letter is 8.5 × 11 in; 1 in = 25.4 mm exactly (international inch, 1959).
  const letter30: LabelStockLayout = {
    pageWidthMm: 8.5 * 25.4, pageHeightMm: 11 * 25.4, labelWidthMm: 2.625 * 25.4, labelHeightMm: 25.4,
    columns: 3, rows: 10, marginTopMm: 0.5 * 25.4, marginLeftMm: 0.1875 * 25.4, gapXMm: 0.125 * 25.4, gapYMm: 0,
  };

  it("finds that 3 × 8 labels of 70 × 37 mm fit an A4 page (ISO 216: 210 × 297 mm) and 3 × 9 do not", () => {
    expect(stockProblems(a4)).toEqual([]);
    expect(stockProblems({ ...a4, rows: 9 })).toHaveLength(1);
  });

  it("finds that 30 labels of 2⅝ × 1 in fit a US Letter page with equal side margins, and a fourth column does not", () => {
    expect(stockProblems(letter30)).toEqual([]);
    const right = letter30.marginLeftMm + 3 * letter30.labelWidthMm + 2 * letter30.gapXMm;
    expect(letter30.pageWidthMm - right).toBeCloseTo(letter30.marginLeftMm, 9);
    expect(stockProblems({ ...letter30, columns: 4 })[0]).toMatch(/across/);
  });

  it("places labels row by row and starts a new sheet after the last position", () => {
    const slots = labelSlots(a4, 26);
    expect(slots[0]).toEqual({ page: 0, xMm: 0, yMm: 0.5 });
    expect(slots[1]).toEqual({ page: 0, xMm: 70, yMm: 0.5 });
    expect(slots[3]).toEqual({ page: 0, xMm: 0, yMm: 37.5 });
    expect(slots[23].page).toBe(0);
    expect(slots[24]).toEqual({ page: 1, xMm: 0, yMm: 0.5 });
    expect(slots[25].page).toBe(1);
  });

  it("leaves the used positions of a partly used first sheet empty", () => {
    const slots = labelSlots(letter30, 2, 29);
    expect(slots[0].page).toBe(0);
    expect(slots[0].xMm).toBeCloseTo(letter30.marginLeftMm + 2 * (letter30.labelWidthMm + letter30.gapXMm), 9);
    expect(slots[1]).toEqual({ page: 1, xMm: letter30.marginLeftMm, yMm: letter30.marginTopMm });
  });

  it("gives each single label from a roll a page of its own", () => {
    expect(labelSlots(SINGLE_LABEL.vial, 3).map((s) => s.page)).toEqual([0, 1, 2]);
  });
});
