import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { countParts, formatOhms, refRanges } from "../../../../src/core/papers/parts.ts";
import { synthesizeDirect } from "../../../../src/core/synth/direct.ts";
import { showing } from "../../../support/projects.ts";

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

  it("counts one driver, emitter resistor, pull-down and string per lit output, and a tie-on resistor per tied-on one", () => {
    // " 1" / "12": 7 driven outputs and 2b tied on.
    const p = showing([" 1", "12"], 2);
    const spec = compileSpec(p);
    const groups = countParts(p, spec, synthesizeDirect(spec, 1, "mixed"));
    const qty = Object.fromEntries(groups.map((g) => [g.kind, g.refs.length]));
    expect(qty).toEqual({ diode: 7, transistor: 8, "emitter-resistor": 8, "pull-down": 8, "tie-on-resistor": 1, display: 8 });
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

describe("parts count against the circuit", () => {
  it("names every resistor, driver and string the circuit builder places, and no other", async () => {
    const { buildCircuit } = await import("../../../../src/core/circuit/circuit.ts");
    const p = showing([" 1", "12", "22"], 2);
    const spec = compileSpec(p);
    expect(spec.tiedOn.length).toBeGreaterThan(0);
    const m = synthesizeDirect(spec, 1, "mixed");
    const circuit = buildCircuit(spec, m, p.electrical, 0);
    const placed = circuit.elements
      .filter((el) => el.kind === "npn" || el.kind === "string" || (el.kind === "resistor" && el.role !== "counter"))
      .map((el) => el.name)
      .sort();
    const counted = countParts(p, spec, m)
      .filter((g) => g.kind !== "diode")
      .flatMap((g) => g.refs)
      .sort();
    expect(placed).toEqual(counted);
  });
});
