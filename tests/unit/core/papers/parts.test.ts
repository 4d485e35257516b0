import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { designators } from "../../../../src/core/matrix/designators.ts";
import { countParts, refRanges } from "../../../../src/core/papers/parts.ts";
import { synthesizeDirect } from "../../../../src/core/synth/direct.ts";
import { buildCircuit } from "../../../../src/core/circuit/circuit.ts";
import { showing, showingWith } from "../../../support/projects.ts";

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
  const cases: [string, Record<string, unknown> | null][] = [
    ["format 1's sink", null],
    ["a switch", { preset: "bench-5v-switch" }],
    ["a sink with a collector resistor", { preset: "panel-12v-sink", segment: { seriesResistor: 68 } }],
    ["a follower with a base resistor", { preset: "cathode-5v-follower", driver: { baseResistor: 1000 } }],
    ["direct drive", { preset: "line-direct" }],
  ];
  it.each(cases)(
    "names every resistor, driver and segment the circuit builder places, with the same values, and no other: %s",
    (_, electrical) => {
      const texts = [" 1", "12", "22"];
      const p = electrical === null ? showing(texts, 2) : showingWith(texts, electrical, 2);
      const spec = compileSpec(p);
      expect(spec.tiedOn.length).toBeGreaterThan(0);
      const m = synthesizeDirect(spec, 1, "mixed");
      const design = new Map(spec.outputs.map((o, i) => [o, 5100 + 100 * i]));
      const circuit = buildCircuit(spec, m, p.electrical, 0, design);
      const placed = circuit.elements
        .filter((el) => el.kind === "npn" || el.kind === "segment" || (el.kind === "resistor" && el.role !== "counter"))
        .map((el) => `${el.name}=${el.kind === "resistor" ? el.ohms : el.kind}`)
        .sort();
      const counted = countParts(designators(spec, m, p.electrical, design))
        .filter((g) => g.kind !== "diode")
        .flatMap((g) => g.refs.map((r) => `${r}=${g.ohms ?? (g.kind === "transistor" ? "npn" : "segment")}`))
        .sort();
      expect(placed).toEqual(counted);
    },
  );

  it("counts a switch's parts: transistor, series, base and base-emitter resistors, pull-down and segment per output", () => {
    const p = showingWith([" 1", "12"], { preset: "bench-5v-switch" }, 2);
    const spec = compileSpec(p);
    const groups = countParts(designators(spec, synthesizeDirect(spec, 1, "mixed"), p.electrical));
    const qty: Record<string, number> = {};
    for (const g of groups) qty[g.kind] = (qty[g.kind] ?? 0) + g.refs.length;
    expect(qty).toEqual({
      diode: 7,
      transistor: 8,
      "series-resistor": 8,
      "base-resistor": 8,
      "base-emitter-resistor": 8,
      "pull-down": 8,
      "tie-on-resistor": 1,
      display: 8,
    });
  });

  it("counts no transistor for direct drive", () => {
    const p = showingWith(["1", "7"], { preset: "line-direct" });
    const spec = compileSpec(p);
    const kinds = countParts(designators(spec, synthesizeDirect(spec, 1, "mixed"), p.electrical)).map((g) => g.kind);
    expect(kinds).toEqual(["diode", "series-resistor", "pull-down", "tie-on-resistor", "display"]);
  });
});
