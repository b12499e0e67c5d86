/**
 * WOFF 1.0 → SFNT (TrueType/OpenType) with Node's zlib, once per process. pdfkit's font reader
 * inflates WOFF tables in pure JavaScript for every document, which dominated the time to make a
 * calc sheet; the decoded font is the same glyph data (W3C WOFF 1.0, sections 4–5). Node only.
 */
import { inflateSync } from 'node:zlib';

const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'

/** Decode a WOFF 1.0 file to the SFNT it wraps; throws on anything that is not WOFF 1.0. */
export function woffToSfnt(woff: Buffer): Buffer {
  if (woff.length < 44 || woff.readUInt32BE(0) !== WOFF_SIGNATURE)
    throw new Error('not a WOFF 1.0 font');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  const tables: { tag: number; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const at = 44 + i * 20;
    const tag = woff.readUInt32BE(at);
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const checksum = woff.readUInt32BE(at + 16);
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw) : Buffer.from(raw);
    if (data.length !== origLength)
      throw new Error(`WOFF table ${i} inflates to ${data.length} bytes, not ${origLength}`);
    tables.push({ tag, checksum, data });
  }
  let pow2 = 1;
  while (pow2 * 2 <= numTables) pow2 *= 2;
  const headerSize = 12 + 16 * numTables;
  const pad4 = (n: number) => (n + 3) & ~3;
  const total = tables.reduce((n, t) => n + pad4(t.data.length), headerSize);
  const out = Buffer.alloc(total);
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(pow2 * 16, 6);
  out.writeUInt16BE(Math.log2(pow2), 8);
  out.writeUInt16BE(numTables * 16 - pow2 * 16, 10);
  let offset = headerSize;
  tables.forEach((t, i) => {
    const rec = 12 + i * 16;
    out.writeUInt32BE(t.tag, rec);
    out.writeUInt32BE(t.checksum, rec + 4);
    out.writeUInt32BE(offset, rec + 8);
    out.writeUInt32BE(t.data.length, rec + 12);
    t.data.copy(out, offset);
    offset += pad4(t.data.length);
  });
  return out;
}
