import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { designators } from "../../../../src/core/matrix/designators.ts";
import { countParts, refRanges } from "../../../../src/core/papers/parts.ts";
import { synthesizeDirect } from "../../../../src/core/synth/direct.ts";
import { buildCircuit } from "../../../../src/core/circuit/circuit.ts";
import { showing } from "../../../support/projects.ts";

describe("parts", () => {
  it("compresses designators into ranges", () => {
    expect(refRanges(["D1", "D2", "D3", "D5", "D7", "D8"])).toBe("D1-D3, D5, D7-D8");
    expect(refRanges(["Q1"])).toBe("Q1");
    expect(refRanges([])).toBe("");
  });

  it("counts one driver, emitter resistor, pull-down and string per lit output, and a tie-on resistor per tied-on one", () => {
    // " 1" / "12": 7 driven outputs and 2b tied on.
    const p = showing([" 1", "12"], 2);
    const spec = compileSpec(p);
    const groups = countParts(designators(spec, synthesizeDirect(spec, 1, "mixed"), p.electrical));
    const qty = Object.fromEntries(groups.map((g) => [g.kind, g.refs.length]));
    expect(qty).toEqual({ diode: 7, transistor: 8, "emitter-resistor": 8, "pull-down": 8, "tie-on-resistor": 1, display: 8 });
    const allRefs = groups.flatMap((g) => g.refs);
    expect(new Set(allRefs).size).toBe(allRefs.length);
  });

  it("groups emitter resistors by value, lowest first, in ohms", () => {
    const p = showing(["1", "7"], 1, { electrical: { driver: { emitterResistors: { "1a": 8200 } } } });
    const spec = compileSpec(p);
    const groups = countParts(designators(spec, synthesizeDirect(spec, 1, "mixed"), p.electrical)).filter(
      (g) => g.kind === "emitter-resistor",
    );
    expect(groups.map((g) => [g.ohms, g.serves])).toEqual([
      [8200, ["1a"]],
      [10_000, ["1b", "1c"]],
    ]);
  });

  it("takes the design's emitter values (a trim) over the project's", () => {
    const p = showing(["1", "7"], 1, { electrical: { driver: { emitterResistors: { "1a": 8200 } } } });
    const spec = compileSpec(p);
    const trim = new Map([
      ["1a", 6200],
      ["1b", 6200],
      ["1c", 9100],
    ]);
    const groups = countParts(designators(spec, synthesizeDirect(spec, 1, "mixed"), p.electrical, trim)).filter(
      (g) => g.kind === "emitter-resistor",
    );
    expect(groups.map((g) => [g.ohms, g.refs, g.serves])).toEqual([
      [6200, ["R1", "R2"], ["1a", "1b"]],
      [9100, ["R3"], ["1c"]],
    ]);
  });
});

describe("parts count against the circuit", () => {
  it("names every resistor, driver and string the circuit builder places, with the same values, and no other", () => {
    const p = showing([" 1", "12", "22"], 2);
    const spec = compileSpec(p);
    expect(spec.tiedOn.length).toBeGreaterThan(0);
    const m = synthesizeDirect(spec, 1, "mixed");
    const trim = new Map(spec.outputs.map((o, i) => [o, 5100 + 100 * i]));
    const circuit = buildCircuit(spec, m, p.electrical, 0, trim);
    const placed = circuit.elements
      .filter((el) => el.kind === "npn" || el.kind === "string" || (el.kind === "resistor" && el.role !== "counter"))
      .map((el) => `${el.name}=${el.kind === "resistor" ? el.ohms : el.kind}`)
      .sort();
    const counted = countParts(designators(spec, m, p.electrical, trim))
      .filter((g) => g.kind !== "diode")
      .flatMap((g) => g.refs.map((r) => `${r}=${g.ohms ?? (g.kind === "transistor" ? "npn" : "string")}`))
      .sort();
    expect(placed).toEqual(counted);
  });
});
