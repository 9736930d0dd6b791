import { crc32 } from '../data/crc32';

/**
 * Marks a PNG file with its print resolution by inserting (or replacing) the `pHYs` chunk, so that a journal's
 * system reads "300 dpi" rather than the screen default. PNG specification (W3C, 2nd ed., 2003), §11.3.5.3:
 * pixels per unit in X and Y as 4-byte big-endian integers, unit 1 = metre. Chunk CRCs: ISO 3309 / ITU-T V.42.
 */
export function setPngDpi(png: Uint8Array, dpi: number): Uint8Array {
  const signature = [137, 80, 78, 71, 13, 10, 26, 10];
  for (let i = 0; i < 8; i++) if (png[i] !== signature[i]) throw new Error('not a PNG file');
  const pixelsPerMetre = Math.round(dpi / 0.0254);
  const chunk = new Uint8Array(12 + 9);
  const view = new DataView(chunk.buffer);
  view.setUint32(0, 9);
  chunk.set([0x70, 0x48, 0x59, 0x73], 4); // "pHYs"
  view.setUint32(8, pixelsPerMetre);
  view.setUint32(12, pixelsPerMetre);
  chunk[16] = 1;
  view.setUint32(17, crc32(chunk.subarray(4, 17)));

  // Walk the chunks: drop an existing pHYs, insert ours right after IHDR (it must precede IDAT).
  const parts: Uint8Array[] = [png.subarray(0, 8)];
  let offset = 8;
  const pngView = new DataView(png.buffer, png.byteOffset, png.byteLength);
  while (offset + 8 <= png.length) {
    const length = pngView.getUint32(offset);
    const type = String.fromCharCode(png[offset + 4], png[offset + 5], png[offset + 6], png[offset + 7]);
    const end = offset + 12 + length;
    if (type !== 'pHYs') parts.push(png.subarray(offset, end));
    if (type === 'IHDR') parts.push(chunk);
    offset = end;
  }
  const total = parts.reduce((n, p) => n + p.length, 0);
  const out = new Uint8Array(total);
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

/** Reads the resolution in dots per inch from a PNG's pHYs chunk, or null when it has none. */
export function readPngDpi(png: Uint8Array): number | null {
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  let offset = 8;
  while (offset + 8 <= png.length) {
    const length = view.getUint32(offset);
    const type = String.fromCharCode(png[offset + 4], png[offset + 5], png[offset + 6], png[offset + 7]);
    if (type === 'pHYs' && png[offset + 16] === 1) return Math.round(view.getUint32(offset + 8) * 0.0254);
    offset += 12 + length;
  }
  return null;
}
