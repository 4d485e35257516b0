/**
 * The built-in seven-segment table against its published source.
 *
 * Source: encyclopedia article "Seven-segment display" (Wikipedia; copy seen
 * at primidi.com/seven-segment_display/displaying_letters), as collected in
 * docs/sources.md: segment names, the glyph table for 0-9 and A-F, and
 * the hex codes in gfedcba bit order as a second, independent check.
 */
import { describe, expect, it } from "vitest";
import { SEG7_GLYPHS, SEG7_SEGMENTS, SEG7_VARIANTS, seg7Code, segmentsOfString } from "../../src/core/glyphs/glyphs.ts";
import { compileSpec, litCellCount } from "../../src/core/spec/decodeSpec.ts";
import { showing } from "../support/projects.ts";

// Source: "Seven-segment display" (Wikipedia), table of hexadecimal digits.
const PUBLISHED: Record<string, string> = {
  "0": "abcdef",
  "1": "bc",
  "2": "abdeg",
  "3": "abcdg",
  "4": "bcfg",
  "5": "acdfg",
  "6": "acdefg",
  "7": "abc",
  "8": "abcdefg",
  "9": "abcdfg",
  A: "abcefg",
  b: "cdefg",
  C: "adef",
  d: "bcdeg",
  E: "adefg",
  F: "aefg",
};
// Source: same article, hex codes gfedcba (a = bit 0), in the order 0-9, A-F.
const PUBLISHED_HEX = [0x3f, 0x06, 0x5b, 0x4f, 0x66, 0x6d, 0x7d, 0x07, 0x7f, 0x6f, 0x77, 0x7c, 0x39, 0x5e, 0x79, 0x71];
const HEX_DIGITS = "0123456789AbCdEF".split("");

describe("seven-segment glyph table (source: Wikipedia, Seven-segment display)", () => {
  it("names segments a (top), b-f clockwise, g (middle)", () => {
    expect(SEG7_SEGMENTS).toEqual(["a", "b", "c", "d", "e", "f", "g"]);
  });

  it.each(HEX_DIGITS)("glyph %s lights the published segments", (ch) => {
    expect(SEG7_GLYPHS[ch]).toBe(PUBLISHED[ch]);
  });

  it.each(HEX_DIGITS.map((ch, i) => [ch, PUBLISHED_HEX[i] as number] as const))("glyph %s has the published hex code %i", (ch, hex) => {
    expect(seg7Code(segmentsOfString(SEG7_GLYPHS[ch] ?? ""))).toBe(hex);
  });

  it("offers the common variants: 6 with or without a, 7 as abc or abcf, 9 with or without d (Wikipedia, Seven-segment display character representations)", () => {
    expect(SEG7_VARIANTS["6"]).toEqual(expect.arrayContaining(["acdefg", "cdefg"]));
    expect(SEG7_VARIANTS["7"]).toEqual(expect.arrayContaining(["abc", "abcf"]));
    expect(SEG7_VARIANTS["9"]).toEqual(expect.arrayContaining(["abcdfg", "abcfg"]));
    for (const [ch, variants] of Object.entries(SEG7_VARIANTS)) expect(variants[0]).toBe(SEG7_GLYPHS[ch]);
  });
});

describe("lit cells with the common glyphs (computed from the published table)", () => {
  it("0-9 has 49 lit cells", () => {
    expect(litCellCount(compileSpec(showing("0123456789".split(""))))).toBe(49);
  });
  it("0-F has 78 lit cells", () => {
    expect(litCellCount(compileSpec(showing(HEX_DIGITS)))).toBe(78);
  });
});
