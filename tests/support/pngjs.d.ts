// pngjs comes with the qrcode package and has no type package installed; tests use only its sync reader.
declare module "pngjs" {
  export const PNG: { sync: { read(data: Buffer): { width: number; height: number; data: Buffer } } };
}
