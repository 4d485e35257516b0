import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { currentOhmsOf, currentRole, designators, diodeRef } from "../../../../src/core/matrix/designators.ts";
import { synthesizeDirect } from "../../../../src/core/synth/direct.ts";
import { showing, showingWith } from "../../../support/projects.ts";

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

  it("numbers Q, the current-setting R and DS of each driven output alike, in display order (a format-1 sink: its emitter resistor)", () => {
    const driven = spec.allOutputs.filter((o) => m.outputs.includes(o) || m.tiedOn.includes(o));
    expect(parts.drivers.map((d) => d.output)).toEqual(driven);
    parts.drivers.forEach((d, i) => {
      expect([d.transistor, d.current.ref, d.current.role, d.display]).toEqual([`Q${i + 1}`, `R${i + 1}`, "emitter", `DS${i + 1}`]);
      expect(d.emitter).toBe(d.current);
      expect([d.series, d.base, d.baseEmitter]).toEqual([null, null, null]);
    });
  });

  it("numbers the pull-downs of matrix-driven outputs, then the tie-on resistors, then the tied-on pull-downs", () => {
    const n = parts.drivers.length;
    const driven = parts.drivers.filter((d) => !d.tiedOn);
    const tied = parts.drivers.filter((d) => d.tiedOn);
    expect(tied.map((d) => d.output)).toEqual(["2b"]);
    expect(driven.map((d) => d.pullDown.ref)).toEqual(driven.map((_, i) => `R${n + i + 1}`));
    expect(tied.map((d) => d.tieOn?.ref)).toEqual([`R${n + driven.length + 1}`]);
    expect(tied.map((d) => d.pullDown.ref)).toEqual([`R${n + driven.length + 2}`]);
    expect(driven.every((d) => d.tieOn === null)).toBe(true);
    expect(parts.resistors.map((r) => r.ref)).toEqual(Array.from({ length: parts.resistors.length }, (_, i) => `R${i + 1}`));
  });

  it("values every resistor: the current-setting one from the design, pull-down, tie-on at the counter's source resistance", () => {
    const e = p.electrical;
    expect(parts.resistors.filter((r) => r.role === "pull-down").every((r) => r.ohms === e.pullDown)).toBe(true);
    expect(parts.resistors.filter((r) => r.role === "tie-on").map((r) => r.ohms)).toEqual([e.counterOutput.resistance]);
    const trimmed = designators(spec, m, e, new Map([["1b", 6200]]));
    const b = trimmed.drivers.find((d) => d.output === "1b");
    expect(b?.current.ohms).toBe(6200);
    expect(trimmed.resistors.find((r) => r.ref === b?.current.ref)?.ohms).toBe(6200);
    expect(trimmed.drivers.find((d) => d.output === "1c")?.current.ohms).toBe(e.driver.emitterResistor);
  });

  it("takes the current-setting resistor from a trim, then the project's overrides, then the default", () => {
    const q = showing(["1", "7"], 1, { electrical: { driver: { emitterResistors: { "1a": 8200 } } } });
    expect(currentOhmsOf(q.electrical, "1a")).toBe(8200);
    expect(currentOhmsOf(q.electrical, "1b")).toBe(10_000);
    expect(currentOhmsOf(q.electrical, "1a", new Map([["1a", 9100]]))).toBe(9100);
    const s = showingWith(["1", "7"], { segment: { seriesResistors: { "1a": 270 } } });
    expect(currentRole(s.electrical.driver.kind)).toBe("series");
    expect(currentOhmsOf(s.electrical, "1a")).toBe(270);
    expect(currentOhmsOf(s.electrical, "1b")).toBe(s.electrical.segment.seriesResistor);
  });
});

describe("designators of each driver kind", () => {
  const texts = [" 1", "12"];
  const partsOf = (electrical: Record<string, unknown>) => {
    const q = showingWith(texts, electrical, 2);
    const spec = compileSpec(q);
    return { q, parts: designators(spec, synthesizeDirect(spec, 1, "mixed"), q.electrical) };
  };

  it("a switch: Q, its series resistor R<i>, then base and base-emitter resistors block by block, then pull-downs", () => {
    const { q, parts } = partsOf({ preset: "bench-5v-switch" });
    const n = parts.drivers.length;
    parts.drivers.forEach((d, i) => {
      expect([d.transistor, d.current.ref, d.current.role, d.current.ohms]).toEqual([`Q${i + 1}`, `R${i + 1}`, "series", 300]);
      expect(d.series).toBe(d.current);
      expect(d.base).toEqual({ ref: `R${n + i + 1}`, role: "base", ohms: q.electrical.driver.baseResistor });
      expect(d.baseEmitter).toEqual({ ref: `R${2 * n + i + 1}`, role: "base-emitter", ohms: 47_000 });
      expect(d.emitter).toBeNull();
    });
    expect(parts.resistors.map((r) => r.ref)).toEqual(Array.from({ length: parts.resistors.length }, (_, i) => `R${i + 1}`));
    const matrixDriven = parts.drivers.filter((d) => !d.tiedOn);
    expect(matrixDriven[0]?.pullDown.ref).toBe(`R${3 * n + 1}`);
  });

  it("a switch without a base-emitter resistor has none, and the numbers close up", () => {
    const { parts } = partsOf({ driver: { baseEmitterResistor: null } });
    const n = parts.drivers.length;
    expect(parts.drivers.every((d) => d.baseEmitter === null)).toBe(true);
    expect(parts.drivers.filter((d) => !d.tiedOn)[0]?.pullDown.ref).toBe(`R${2 * n + 1}`);
  });

  it("a follower joined to its line has no base resistor; with one, it has", () => {
    expect(partsOf({ preset: "cathode-5v-follower" }).parts.drivers.every((d) => d.base === null && d.transistor !== null)).toBe(true);
    expect(
      partsOf({ preset: "cathode-5v-follower", driver: { baseResistor: 1000 } }).parts.drivers.every((d) => d.base?.ohms === 1000),
    ).toBe(true);
  });

  it("direct drive has no transistor, only its series resistor", () => {
    const { parts } = partsOf({ preset: "line-direct" });
    expect(parts.drivers.every((d) => d.transistor === null && d.base === null && d.current.role === "series")).toBe(true);
  });

  it("a sink with a collector resistor numbers it after the emitter resistors", () => {
    const { parts } = partsOf({ preset: "panel-12v-sink", segment: { seriesResistor: 68 } });
    const n = parts.drivers.length;
    parts.drivers.forEach((d, i) => {
      expect(d.current.role).toBe("emitter");
      expect(d.series).toEqual({ ref: `R${n + i + 1}`, role: "series", ohms: 68 });
    });
    expect(parts.resistors.filter((r) => r.role === "series")).toHaveLength(n);
  });
});
