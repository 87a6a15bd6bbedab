/**
 * Pictures of a label for browser tests: the label's QR code as a PNG (a "photo" to upload) and
 * as a Y4M video that Chromium plays as its camera (--use-file-for-fake-video-capture).
 * Y4M is raw YUV 4:2:0: a text header, then per frame "FRAME\n" and the Y, U and V planes.
 */
import fs from "node:fs";
import QRCode from "qrcode";
import { labelQr } from "../../server/modules/labels";

/** A white frame with the label's QR code in the middle, one byte per pixel (0 dark, 255 light). */
function frameWithQr(url: string, width: number, height: number, modulePx: number): Uint8Array {
  const qr = labelQr(url);
  const px = new Uint8Array(width * height).fill(255);
  const side = qr.size * modulePx;
  const x0 = Math.floor((width - side) / 2);
  const y0 = Math.floor((height - side) / 2);
  for (let r = 0; r < qr.size; r++) {
    for (let c = 0; c < qr.size; c++) {
      if (!qr.dark(r, c)) continue;
      for (let dy = 0; dy < modulePx; dy++) px.fill(0, (y0 + r * modulePx + dy) * width + x0 + c * modulePx, (y0 + r * modulePx + dy) * width + x0 + (c + 1) * modulePx);
    }
  }
  return px;
}

export function writeLabelVideo(file: string, url: string, opts: { width?: number; height?: number; frames?: number } = {}): void {
  const width = opts.width ?? 640;
  const height = opts.height ?? 480;
  const frames = opts.frames ?? 10;
  const grey = frameWithQr(url, width, height, 8);
  // Studio-range luma (16 black, 235 white) as video decoders expect; neutral chroma (128).
  const y = Buffer.from(grey.map((v) => (v === 0 ? 16 : 235)));
  const chroma = Buffer.alloc((width / 2) * (height / 2), 128);
  const parts: Buffer[] = [Buffer.from(`YUV4MPEG2 W${width} H${height} F10:1 Ip A1:1 C420jpeg\n`)];
  for (let i = 0; i < frames; i++) parts.push(Buffer.from("FRAME\n"), y, chroma, chroma);
  fs.writeFileSync(file, Buffer.concat(parts));
}

/** The label's QR code as a PNG, with the same version and error-correction level as the printed label. */
export async function writeLabelPng(file: string, url: string): Promise<void> {
  const qr = labelQr(url);
  await QRCode.toFile(file, [{ data: new TextEncoder().encode(url), mode: "byte" }], {
    version: qr.version,
    errorCorrectionLevel: qr.ec,
    scale: 8,
    margin: 6,
  });
}
