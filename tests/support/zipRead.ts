/**
 * Reads the entries of a ZIP archive whose entries are stored (method 0),
 * as the web app's exports are: local file headers after PKWARE's
 * APPNOTE.TXT, sizes in the header, no data descriptors.
 */
export function storedZipEntries(bytes: Uint8Array): { name: string; text: string }[] {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const dec = new TextDecoder();
  const out: { name: string; text: string }[] = [];
  let at = 0;
  while (at + 30 <= bytes.length && view.getUint32(at, true) === 0x04034b50) {
    if (view.getUint16(at + 8, true) !== 0) throw new Error("a compressed entry; this reader takes stored entries only");
    const size = view.getUint32(at + 18, true);
    const nameLength = view.getUint16(at + 26, true);
    const extraLength = view.getUint16(at + 28, true);
    const name = dec.decode(bytes.subarray(at + 30, at + 30 + nameLength));
    const start = at + 30 + nameLength + extraLength;
    out.push({ name, text: dec.decode(bytes.subarray(start, start + size)) });
    at = start + size;
  }
  return out;
}
