import { describe, expect, it } from "vitest";
import { crc32, zipArchive } from "../../../../src/ui/files/zipArchive.ts";

/** Bit-by-bit CRC-32, written separately from the table-driven one under test. */
function slowCrc(bytes: Uint8Array): number {
  let crc = ~0;
  for (const b of bytes) {
    crc ^= b;
    for (let k = 0; k < 8; k++) crc = (crc >>> 1) ^ (0xedb88320 & -(crc & 1));
  }
  return ~crc >>> 0;
}

/** Reads an archive the way an unzipper does: end record -> central directory -> local headers. */
function readZip(zip: Uint8Array): Record<string, string> {
  const v = new DataView(zip.buffer, zip.byteOffset, zip.byteLength);
  const end = zip.length - 22;
  expect(v.getUint32(end, true)).toBe(0x06054b50);
  const count = v.getUint16(end + 10, true);
  let at = v.getUint32(end + 16, true);
  const out: Record<string, string> = {};
  const dec = new TextDecoder("utf-8", { fatal: true });
  for (let i = 0; i < count; i++) {
    expect(v.getUint32(at, true)).toBe(0x02014b50);
    const crc = v.getUint32(at + 16, true);
    const size = v.getUint32(at + 24, true);
    const nameLen = v.getUint16(at + 28, true);
    const extra = v.getUint16(at + 30, true);
    const comment = v.getUint16(at + 32, true);
    const local = v.getUint32(at + 42, true);
    const name = dec.decode(zip.subarray(at + 46, at + 46 + nameLen));
    expect(v.getUint32(local, true)).toBe(0x04034b50);
    expect(v.getUint16(local + 8, true)).toBe(0); // stored
    const dataAt = local + 30 + v.getUint16(local + 26, true) + v.getUint16(local + 28, true);
    const data = zip.subarray(dataAt, dataAt + size);
    expect(slowCrc(data)).toBe(crc);
    out[name] = dec.decode(data);
    at += 46 + nameLen + extra + comment;
  }
  return out;
}

describe("zip archive", () => {
  it("computes the standard CRC-32 check value", () => {
    // The CRC-32 check value of "123456789" is 0xCBF43926 (common practice, no source).
    expect(crc32(new TextEncoder().encode("123456789"))).toBe(0xcbf43926);
    const bytes = Uint8Array.from({ length: 1000 }, (_, i) => (i * 7919) & 0xff);
    expect(crc32(bytes)).toBe(slowCrc(bytes));
  });
  it("writes an archive that reads back unchanged, UTF-8 names and text included", () => {
    const files = [
      { name: "S0.cir", text: "* state S0\n.end\n" },
      { name: "spice/S1.cir", text: "* état S1 µA\n.end\n" },
    ];
    expect(readZip(zipArchive(files))).toEqual(Object.fromEntries(files.map((f) => [f.name, f.text])));
  });
  it("gives the same bytes for the same files", () => {
    const files = [{ name: "x.txt", text: "x" }];
    expect(zipArchive(files)).toEqual(zipArchive(files));
  });
});
