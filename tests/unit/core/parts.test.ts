import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../src/core/decodeSpec.ts";
import { countParts, formatOhms, refRanges } from "../../../src/core/parts.ts";
import { synthesizeDirect } from "../../../src/core/synthDirect.ts";
import { showing } from "../../support/projects.ts";

describe("parts", () => {
  it("formats ohms as a BOM prints them", () => {
    expect(formatOhms(470)).toBe("470");
    expect(formatOhms(4700)).toBe("4.7k");
    expect(formatOhms(10_000)).toBe("10k");
    expect(formatOhms(100_000)).toBe("100k");
    expect(formatOhms(2_200_000)).toBe("2.2M");
  });

  it("compresses designators into ranges", () => {
    expect(refRanges(["D1", "D2", "D3", "D5", "D7", "D8"])).toBe("D1-D3, D5, D7-D8");
    expect(refRanges(["Q1"])).toBe("Q1");
    expect(refRanges([])).toBe("");
  });

  it("counts one driver, emitter resistor and string per lit output, pull-downs on driven ones only", () => {
    // " 1" / "12": 7 driven outputs and 2b tied on.
    const p = showing([" 1", "12"], 2);
    const spec = compileSpec(p);
    const groups = countParts(p, spec, synthesizeDirect(spec, 1, "mixed"));
    const qty = Object.fromEntries(groups.map((g) => [g.kind, g.refs.length]));
    expect(qty).toEqual({ diode: 7, transistor: 8, "emitter-resistor": 8, "pull-down": 7, "tie-on-resistor": 1, display: 8 });
    const allRefs = groups.flatMap((g) => g.refs);
    expect(new Set(allRefs).size).toBe(allRefs.length);
  });

  it("groups emitter resistors by value", () => {
    const p = showing(["1", "7"], 1, { electrical: { driver: { emitterResistors: { "1a": 8200 } } } });
    const spec = compileSpec(p);
    const groups = countParts(p, spec, synthesizeDirect(spec, 1, "mixed")).filter((g) => g.kind === "emitter-resistor");
    expect(groups.map((g) => [g.value, g.serves])).toEqual([
      ["8.2k", ["1a"]],
      ["10k", ["1b", "1c"]],
    ]);
  });
});
