/**
 * Rasterises a QR module matrix to RGBA pixels (with the quiet zone), and decodes pixels with
 * jsqr — an independent decoder — so tests read labels the way a phone camera would.
 */
import jsQR from "jsqr";

export interface ModuleMatrix {
  size: number;
  dark(row: number, col: number): boolean;
}

export interface Rgba {
  width: number;
  height: number;
  data: Uint8ClampedArray;
}

export function rasterise(m: ModuleMatrix, scale = 6, quiet = 4, blot?: (x: number, y: number) => boolean): Rgba {
  const side = (m.size + 2 * quiet) * scale;
  const data = new Uint8ClampedArray(side * side * 4).fill(255);
  for (let y = 0; y < side; y++) {
    for (let x = 0; x < side; x++) {
      const r = Math.floor(y / scale) - quiet;
      const c = Math.floor(x / scale) - quiet;
      const inside = r >= 0 && c >= 0 && r < m.size && c < m.size;
      const dark = blot?.(x / side, y / side) ?? (inside && m.dark(r, c));
      if (dark) {
        const i = (y * side + x) * 4;
        data[i] = data[i + 1] = data[i + 2] = 0;
      }
    }
  }
  return { width: side, height: side, data };
}

export function decode(img: Rgba): string | null {
  return jsQR(img.data, img.width, img.height, { inversionAttempts: "dontInvert" })?.data ?? null;
}
