import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { designators, diodeRef, emitterOhmsOf } from "../../../../src/core/matrix/designators.ts";
import { synthesizeDirect } from "../../../../src/core/synth/direct.ts";
import { showing } from "../../../support/projects.ts";

describe("designators", () => {
  // " 1" / "12" on two positions: 2b is lit in both states (tied on), the rest of "1" and "2" is matrix-driven.
  const p = showing([" 1", "12"], 2);
  const spec = compileSpec(p);
  const m = synthesizeDirect(spec, 1, "mixed");
  const parts = designators(spec, m, p.electrical);

  it("numbers diodes D1.. in assembly order, as the matrix names them", () => {
    expect(diodeRef(0)).toBe("D1");
    expect(parts.diodes.map((d) => d.ref)).toEqual(m.diodes.map((_, i) => `D${i + 1}`));
  });

  it("numbers Q, R and DS of each driven output alike, in display order", () => {
    const driven = spec.allOutputs.filter((o) => m.outputs.includes(o) || m.tiedOn.includes(o));
    expect(parts.drivers.map((d) => d.output)).toEqual(driven);
    parts.drivers.forEach((d, i) => {
      expect([d.transistor, d.emitterResistor, d.display]).toEqual([`Q${i + 1}`, `R${i + 1}`, `DS${i + 1}`]);
    });
  });

  it("numbers the pull-downs of matrix-driven outputs, then the tie-on resistors, then the tied-on pull-downs", () => {
    const n = parts.drivers.length;
    const driven = parts.drivers.filter((d) => !d.tiedOn);
    const tied = parts.drivers.filter((d) => d.tiedOn);
    expect(tied.map((d) => d.output)).toEqual(["2b"]);
    expect(driven.map((d) => d.pullDown)).toEqual(driven.map((_, i) => `R${n + i + 1}`));
    expect(tied.map((d) => d.tieOn)).toEqual([`R${n + driven.length + 1}`]);
    expect(tied.map((d) => d.pullDown)).toEqual([`R${n + driven.length + 2}`]);
    expect(driven.every((d) => d.tieOn === null && d.tieOnOhms === null)).toBe(true);
    expect(parts.resistors.map((r) => r.ref)).toEqual(Array.from({ length: parts.resistors.length }, (_, i) => `R${i + 1}`));
  });

  it("values every resistor: emitter from the design, pull-down, tie-on at the counter's source resistance", () => {
    const e = p.electrical;
    expect(parts.resistors.filter((r) => r.role === "pull-down").every((r) => r.ohms === e.pullDown)).toBe(true);
    expect(parts.resistors.filter((r) => r.role === "tie-on").map((r) => r.ohms)).toEqual([e.counterOutput.resistance]);
    const trimmed = designators(spec, m, e, new Map([["1b", 6200]]));
    expect(trimmed.drivers.find((d) => d.output === "1b")?.emitterOhms).toBe(6200);
    expect(trimmed.resistors.find((r) => r.ref === trimmed.drivers.find((d) => d.output === "1b")?.emitterResistor)?.ohms).toBe(6200);
    expect(trimmed.drivers.find((d) => d.output === "1c")?.emitterOhms).toBe(e.driver.emitterResistor);
  });

  it("takes emitter resistors from a trim, then the project's overrides, then the default", () => {
    const q = showing(["1", "7"], 1, { electrical: { driver: { emitterResistors: { "1a": 8200 } } } });
    expect(emitterOhmsOf(q.electrical, "1a")).toBe(8200);
    expect(emitterOhmsOf(q.electrical, "1b")).toBe(10_000);
    expect(emitterOhmsOf(q.electrical, "1a", new Map([["1a", 9100]]))).toBe(9100);
  });
});
