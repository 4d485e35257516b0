import { describe, expect, it } from "vitest";
import { synthesizeCoded } from "../../../../src/core/logic/synthesizeCoded.ts";
import { synthesize } from "../../../../src/core/synth/synthesize.ts";
import { codedProject, customProject, exactSettings, REFERENCE_CASES, specOf } from "../../../support/codedProjects.ts";
import { decoderLights } from "../../../support/logicCheck.ts";
import type { DecodeSpec } from "../../../../src/core/spec/decodeSpec.ts";
import type { DiodeMatrix } from "../../../../src/core/matrix/matrix.ts";

/** Every used code lights exactly its state's outputs, by the independent simulation. */
function lightsEveryState(spec: DecodeSpec, m: DiodeMatrix): void {
  spec.counter.codes.forEach((code, k) => {
    const want = [...spec.outputs.filter((_, j) => spec.lit[k]?.[j]), ...spec.tiedOn].sort();
    expect([...decoderLights(m, code)].sort(), `state ${k} code ${code}`).toEqual(want);
  });
}

describe("synthesizeCoded", () => {
  it.each(REFERENCE_CASES)("proves the specification's figure for $name: $diodes diodes, $gates gates", async (c) => {
    const spec = specOf(codedProject(c.code, c.chars));
    const r = await synthesizeCoded(spec, exactSettings(), { oneHot: synthesize });
    if (!r.ok) throw new Error(r.error.message);
    const two = r.value.twoLevel;
    expect([two.matrix.count, two.gates]).toEqual([c.diodes, c.gates]);
    expect(two.matrix.optimal).toBe(true);
    expect(two.lowerBound).toBe(c.diodes);
    expect(two.gatesProven).toBe(true);
    expect(two.complete).toBe(true);
    expect(two.matrix.longestPath).toBe(1);
    lightsEveryState(spec, r.value.matrix);
    expect(r.value.matrix.count).toBeLessThanOrEqual(r.value.twoRank.matrix.count);
  });

  it("decodes 0-9 from a 5-stage Johnson counter in two ranks with ten two-input gates", async () => {
    const spec = specOf(codedProject("johnson", "0123456789"));
    const r = await synthesizeCoded(spec, exactSettings(), { oneHot: synthesize });
    if (!r.ok) throw new Error(r.error.message);
    const rank = r.value.twoRank;
    expect(rank.matrix.gates).toHaveLength(10);
    expect(rank.matrix.gates.every((g) => g.inputs.length === 2)).toBe(true);
    expect(rank.gateDiodes).toBe(20);
    // The ring-counter matrix on the ten state lines; the specification expects 33-34 diodes.
    expect(rank.matrixDiodes).toBeGreaterThanOrEqual(33);
    expect(rank.matrixDiodes).toBeLessThanOrEqual(34);
    lightsEveryState(spec, rank.matrix);
  });

  it("gives the same decoder every run", async () => {
    const spec = specOf(codedProject("binary", "0123456789"));
    const a = await synthesizeCoded(spec, exactSettings(), { oneHot: synthesize });
    const b = await synthesizeCoded(spec, exactSettings(), { oneHot: synthesize });
    if (!a.ok || !b.ok) throw new Error("failed");
    expect(JSON.stringify(b.value.matrix)).toBe(JSON.stringify(a.value.matrix));
  });

  it("uses shared OR nodes where they beat two-level logic and the depth limit allows them", async () => {
    // Every segment of an "8" lit in the even states of a 5-stage Johnson counter, blank in the odd ones:
    // two levels need a gate per even state feeding all seven segments (5 x 2 + 35 = 45 diodes);
    // the five gates into one segment that drives the other six through links take 10 + 5 + 6 = 21.
    const show = Array.from({ length: 10 }, (_, k) => (k % 2 === 0 ? "8" : " "));
    const spec = specOf(makeJohnson(show));
    const deep = await synthesizeCoded(spec, exactSettings({ depthLimit: 2 }), { oneHot: synthesize });
    if (!deep.ok) throw new Error(deep.error.message);
    expect(deep.value.twoLevel.matrix.count).toBe(45);
    expect(deep.value.structure).not.toBe("two-level");
    expect(deep.value.matrix.count).toBe(21);
    expect(deep.value.matrix.lowerBound).toBeNull();
    expect(deep.value.matrix.longestPath).toBe(2);
    lightsEveryState(spec, deep.value.matrix);
    const flat = await synthesizeCoded(spec, exactSettings({ depthLimit: 1 }), { oneHot: synthesize });
    if (!flat.ok) throw new Error(flat.error.message);
    expect(flat.value.structure).toBe("two-level");
    expect(flat.value.matrix.count).toBe(45);
    expect(flat.value.matrix.optimal).toBe(true);
  });

  it("decodes with one gate per state and one OR diode per lit cell in direct mode, and greedily in fast mode", async () => {
    const spec = specOf(codedProject("binary", "0123456789"));
    const direct = await synthesizeCoded(spec, exactSettings({ mode: "direct" }), { oneHot: synthesize });
    if (!direct.ok) throw new Error(direct.error.message);
    expect(direct.value.matrix.method).toBe("direct");
    expect(direct.value.matrix.count).toBe(49 + 30); // 49 lit cells; the ten state gates take 30 diodes
    lightsEveryState(spec, direct.value.matrix);
    const fast = await synthesizeCoded(spec, exactSettings({ mode: "fast" }), { oneHot: synthesize });
    if (!fast.ok) throw new Error(fast.error.message);
    expect(fast.value.twoLevel.matrix.method).toBe("heuristic");
    expect(fast.value.twoLevel.matrix.count).toBeGreaterThanOrEqual(40);
    lightsEveryState(spec, fast.value.matrix);
  });

  it("needs no diodes when every output is tied on or never lit", async () => {
    const spec = specOf(customProject(["0", "1"], ["8", "8"]));
    const r = await synthesizeCoded(spec, exactSettings(), { oneHot: synthesize });
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.matrix.count).toBe(0);
    expect(r.value.matrix.tiedOn).toHaveLength(7);
    expect(r.value.matrix.optimal).toBe(true);
  });

  it("refuses a depth limit outside the project limits", async () => {
    const spec = specOf(codedProject("binary", "01"));
    const r = await synthesizeCoded(spec, exactSettings({ depthLimit: 0 }), { oneHot: synthesize });
    expect(!r.ok && r.error.kind).toBe("infeasible");
  });
});

function makeJohnson(show: string[]) {
  return codedProject("johnson", "0123456789", { show });
}
