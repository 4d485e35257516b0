import { describe, expect, it } from "vitest";
import { builtinCell, builtinGlyphs, seg7Code, segmentsOfString } from "../../../../src/core/glyphs/glyphs.ts";

describe("glyphs", () => {
  it("reads '.' in a lit string as the decimal point", () => {
    expect(segmentsOfString("bc.")).toEqual(["b", "c", "dp"]);
    expect(seg7Code(["b", "c", "dp"])).toBe(0x86);
  });
  it("gives a custom cell only the blank", () => {
    expect(builtinGlyphs({ kind: "custom", segments: ["x"] })).toEqual({ " ": [] });
  });
  it("gives a seg7dp cell a lone decimal point glyph", () => {
    expect(builtinGlyphs(builtinCell("seg7dp"))["."]).toEqual(["dp"]);
    expect(builtinCell("seg7dp").segments).toContain("dp");
  });
  it("maps every built-in letter only to real segments", () => {
    for (const segs of Object.values(builtinGlyphs(builtinCell("seg7")))) {
      for (const s of segs) expect(builtinCell("seg7").segments).toContain(s);
    }
  });
});
