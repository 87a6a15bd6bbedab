/**
 * Reads QR codes from camera frames and photos with jsqr, in the browser. Large photos are
 * scaled down first (a phone photo of a label has far more pixels than the code needs, and
 * jsqr's time grows with the pixel count).
 */
import jsQR from "jsqr";

export function decodeImageData(img: ImageData, thorough = false): string | null {
  return jsQR(img.data, img.width, img.height, { inversionAttempts: thorough ? "attemptBoth" : "dontInvert" })?.data ?? null;
}

function drawScaled(source: CanvasImageSource, width: number, height: number, maxSide: number): ImageData | null {
  const scale = Math.min(1, maxSide / Math.max(width, height));
  const w = Math.max(1, Math.round(width * scale));
  const h = Math.max(1, Math.round(height * scale));
  const canvas = document.createElement("canvas");
  canvas.width = w;
  canvas.height = h;
  const ctx = canvas.getContext("2d", { willReadFrequently: true });
  if (!ctx) return null;
  ctx.fillStyle = "#ffffff";
  ctx.fillRect(0, 0, w, h);
  ctx.drawImage(source, 0, 0, w, h);
  return ctx.getImageData(0, 0, w, h);
}

/** The text of the first QR code found in a photo, trying a few sizes; null when none reads. */
export async function decodeImageFile(file: Blob): Promise<string | null> {
  const bitmap = await createImageBitmap(file);
  try {
    for (const side of [1200, 800, 1800, 500]) {
      const data = drawScaled(bitmap, bitmap.width, bitmap.height, side);
      const text = data && decodeImageData(data, true);
      if (text) return text;
    }
    return null;
  } finally {
    bitmap.close();
  }
}

/** A camera frame, scaled to at most 720 px on its long side, for decoding. */
export function frameFrom(video: HTMLVideoElement): ImageData | null {
  if (!video.videoWidth || !video.videoHeight) return null;
  return drawScaled(video, video.videoWidth, video.videoHeight, 720);
}
