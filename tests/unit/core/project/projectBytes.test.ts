import { describe, expect, it } from "vitest";
import { decodeProjectBytes, firstInvalidUtf8, parseProjectBytes } from "../../../../src/core/project/projectBytes.ts";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";
import { LIMITS } from "../../../../src/core/project/limits.ts";

const TEXT = '{"schema":"diodeloom/project@1","title":"Lap timer","counter":{"states":2},"display":{},"show":["0","1"]}';
const bytes = (...parts: (string | number[])[]): Uint8Array =>
  new Uint8Array(parts.flatMap((p) => (typeof p === "string" ? [...new TextEncoder().encode(p)] : p)));

describe("decodeProjectBytes", () => {
  it("accepts a leading UTF-8 byte-order mark, as the app's Open does, and drops it", () => {
    expect(decodeProjectBytes(bytes([0xef, 0xbb, 0xbf], TEXT))).toEqual({ ok: true, value: TEXT });
    const withMark = parseProjectBytes(bytes([0xef, 0xbb, 0xbf], TEXT));
    const without = parseProjectBytes(bytes(TEXT));
    expect(withMark).toEqual(without);
    expect(parseProject("\uFEFF" + TEXT)).toEqual(without);
  });

  it("names a UTF-16 file", () => {
    expect(decodeProjectBytes(bytes([0xff, 0xfe], "{}"))).toEqual({
      ok: false,
      error: [{ path: "", message: "the file is UTF-16 (it starts with a UTF-16 byte-order mark); save it as UTF-8" }],
    });
  });

  it("refuses bytes that are not UTF-8, naming the field that holds them", () => {
    const bad = bytes(
      '{"schema":"diodeloom/project@1","title":"Lap ',
      [0xc3, 0x28],
      ' timer","counter":{"states":2},"display":{},"show":["0","1"]}',
    );
    expect(decodeProjectBytes(bad)).toEqual({
      ok: false,
      error: [
        {
          path: "title",
          message: "holds a byte that is not UTF-8 (0xC3 at byte 45, line 1, column 46); save the file as UTF-8, or retype the text there",
        },
      ],
    });
    const inText = bytes('{"show": ["0", "', [0xff], '"]}');
    const r = decodeProjectBytes(inText);
    expect(!r.ok && r.error[0]?.path).toBe("show[1]");
  });

  it("refuses a file over the size limit before decoding it", () => {
    const r = decodeProjectBytes(new Uint8Array(LIMITS.fileBytes + 1).fill(0x20));
    expect(!r.ok && r.error[0]?.message).toMatch(/^the file is larger than 1 MiB \(1048577 bytes/);
  });
});

describe("firstInvalidUtf8 (The Unicode Standard, Table 3-7; docs/sources.md)", () => {
  it.each([
    [[0x41, 0x42], -1],
    [[0xc3, 0xa9], -1],
    [[0xe2, 0x82, 0xac], -1],
    [[0xf0, 0x9f, 0x98, 0x80], -1],
    [[0x41, 0xc3, 0x28], 1],
    [[0xc0, 0x80], 0], // overlong NUL
    [[0xe0, 0x80, 0x80], 0], // overlong
    [[0xed, 0xa0, 0x80], 0], // surrogate U+D800
    [[0xf4, 0x90, 0x80, 0x80], 0], // above U+10FFFF
    [[0xf5, 0x80, 0x80, 0x80], 0],
    [[0x41, 0xe2, 0x82], 1], // cut short at the end
    [[0x80], 0],
  ])("%j -> %i", (input, expected) => expect(firstInvalidUtf8(new Uint8Array(input))).toBe(expected));
});
