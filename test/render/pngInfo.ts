/** Reads a PNG's signature and its IHDR width and height (PNG specification, ISO/IEC 15948). */
export function pngInfo(png: Uint8Array): { signatureOk: boolean; widthPx: number; heightPx: number } {
  const signature = [137, 80, 78, 71, 13, 10, 26, 10];
  const signatureOk = signature.every((byte, index) => png[index] === byte);
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  const chunkType = String.fromCharCode(...png.slice(12, 16));
  if (!signatureOk || chunkType !== 'IHDR') return { signatureOk: false, widthPx: 0, heightPx: 0 };
  return { signatureOk, widthPx: view.getUint32(16), heightPx: view.getUint32(20) };
}
