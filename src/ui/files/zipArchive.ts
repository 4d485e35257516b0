/**
 * A minimal ZIP archive writer (stored entries, no compression), so an
 * export of many files (one SPICE netlist per state, several drawing
 * sheets) is one download. Format: PKWARE APPNOTE.TXT, local file headers,
 * central directory and end record; CRC-32 with the reflected polynomial
 * 0xEDB88320.
 */

export interface ArchiveEntry {
  readonly name: string;
  readonly text: string;
}

let crcTable: Uint32Array | null = null;

/** CRC-32 (ISO 3309, as ZIP uses it) of some bytes. */
export function crc32(bytes: Uint8Array): number {
  if (!crcTable) {
    crcTable = new Uint32Array(256);
    for (let n = 0; n < 256; n++) {
      let c = n;
      for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
      crcTable[n] = c >>> 0;
    }
  }
  let crc = 0xffffffff;
  for (const b of bytes) crc = (crcTable[(crc ^ b) & 0xff] as number) ^ (crc >>> 8);
  return (crc ^ 0xffffffff) >>> 0;
}

/**
 * The fields a local file header and its central directory entry share,
 * from "version needed" to the extra-field length, written at `at`: version
 * 2.0, flags with bit 11 (UTF-8 names), method 0 (stored), the fixed time
 * and date 1980-01-01 00:00, the CRC, both sizes, the name length, no extra.
 */
function entryFields(view: DataView, at: number, e: { readonly crc: number; readonly size: number; readonly nameLength: number }): void {
  view.setUint16(at, 20, true);
  view.setUint16(at + 2, 0x0800, true);
  view.setUint16(at + 4, 0, true);
  view.setUint16(at + 6, 0, true);
  view.setUint16(at + 8, 0x21, true);
  view.setUint32(at + 10, e.crc, true);
  view.setUint32(at + 14, e.size, true);
  view.setUint32(at + 18, e.size, true);
  view.setUint16(at + 22, e.nameLength, true);
  view.setUint16(at + 24, 0, true);
}

/**
 * Packs text files into a ZIP archive. Names are stored as UTF-8 (flag bit
 * 11); the timestamp is fixed (1980-01-01) so the same files give the same
 * bytes.
 */
export function zipArchive(entries: readonly ArchiveEntry[]): Uint8Array {
  const enc = new TextEncoder();
  const locals: Uint8Array[] = [];
  const centrals: Uint8Array[] = [];
  let offset = 0;
  for (const e of entries) {
    const name = enc.encode(e.name);
    const data = enc.encode(e.text);
    const crc = crc32(data);
    const local = new Uint8Array(30 + name.length + data.length);
    const lv = new DataView(local.buffer);
    lv.setUint32(0, 0x04034b50, true);
    entryFields(lv, 4, { crc, size: data.length, nameLength: name.length });
    local.set(name, 30);
    local.set(data, 30 + name.length);
    locals.push(local);

    const central = new Uint8Array(46 + name.length);
    const cv = new DataView(central.buffer);
    cv.setUint32(0, 0x02014b50, true);
    cv.setUint16(4, 20, true); // version made by: 2.0
    entryFields(cv, 6, { crc, size: data.length, nameLength: name.length });
    cv.setUint32(42, offset, true);
    central.set(name, 46);
    centrals.push(central);
    offset += local.length;
  }
  const centralSize = centrals.reduce((a, c) => a + c.length, 0);
  const end = new Uint8Array(22);
  const ev = new DataView(end.buffer);
  ev.setUint32(0, 0x06054b50, true);
  ev.setUint16(8, entries.length, true);
  ev.setUint16(10, entries.length, true);
  ev.setUint32(12, centralSize, true);
  ev.setUint32(16, offset, true);
  const out = new Uint8Array(offset + centralSize + end.length);
  let at = 0;
  for (const part of [...locals, ...centrals, end]) {
    out.set(part, at);
    at += part.length;
  }
  return out;
}
