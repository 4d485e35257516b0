import { describe, expect, it } from "vitest";
import {
  checkWith,
  dividerCandidates,
  dividerLowerCandidates,
  PULL_UP_ROOM,
  pullUpCandidates,
  pullUpRoom,
  sizeDarkNetwork,
} from "../../../../src/core/budget/ghostCheck.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { makeProject2 } from "../../../support/projects.ts";

async function design(decode: string, darkInput = "level-shift") {
  const project = makeProject2({
    counter: { states: 6, drive: "complementary" },
    display: {},
    show: [..."012345"],
    synthesis: { depth: "mixed", decode, darkInput, timeLimitMs: 5000 },
  });
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return { project, spec, matrix: r.value };
}

describe("ghostCheck", () => {
  it("tries E24 pull-ups from 1 kΩ to 100 kΩ, E24 upper and E6 lower divider resistors", () => {
    const c = pullUpCandidates();
    expect(c[0]).toBe(1000);
    expect(c[c.length - 1]).toBe(100_000);
    expect(c).toContain(4300);
    expect(c).toHaveLength(49);
    const u = dividerCandidates();
    expect([u[0], u[u.length - 1], u.length]).toEqual([1000, 1_000_000, 73]);
    expect(dividerLowerCandidates()).toEqual([1000, 1500, 2200, 3300, 4700, 6800, 10_000, 15_000, 22_000, 33_000, 47_000, 68_000, 100_000]);
  });

  it("sizes the pull-up on the 5 V preset and names the limit that stops a smaller one", async () => {
    const { project, spec, matrix } = await design("dark");
    const g = sizeDarkNetwork(project, spec, matrix);
    expect(g.ok).toBe(true);
    if (!g.ok) return;
    const v = g.value;
    expect(v.passes).toBe(true);
    expect(v.values.shiftDiodes).toBe(2);
    expect(v.worstUnlit.currentA).toBeLessThanOrEqual(v.ghostLimitA);
    expect(v.mostSunk.currentA).toBeLessThanOrEqual(project.electrical.lowLine.maxCurrentA);
    // The budget's window: target ±20 %.
    expect(v.litWindowA).toEqual([0.008, 0.012]);
    expect(v.weakestLit.currentA).toBeGreaterThanOrEqual(0.008);
    expect(v.strongestLit.currentA).toBeLessThanOrEqual(0.012);
    // Every state at the nominal values and both corners.
    expect(v.states).toHaveLength(3 * 6);
    expect(v.binding).toMatch(/^a smaller pull-up breaks /);
    expect(pullUpRoom(v)).toBeGreaterThanOrEqual(PULL_UP_ROOM);
    // The next smaller E24 value breaks the limit the sizing names, in the full check.
    const candidates = pullUpCandidates();
    const smaller = candidates[candidates.indexOf(v.values.pullUpOhms) - 1] as number;
    const worse = checkWith(project, spec, matrix, { ...v.values, pullUpOhms: smaller });
    expect(worse.ok && worse.value.passes).toBe(false);
    if (worse.ok) expect(v.binding).toContain(worse.value.binding.split(" (")[0]);
  });

  it("goes up from the smallest passing pull-up to the first that leaves 20 % to the ghost limit and the line's rating", async () => {
    // 0-9 decoded either way on the 5 V preset: the smallest pull-up that keeps every limit leaves the
    // ghost limit only about 12 % (the room is our own rule, common practice, no source).
    const project = makeProject2({
      counter: { states: 10, drive: "complementary" },
      display: {},
      show: [..."0123456789"],
      synthesis: { depth: "mixed", decode: "either", timeLimitMs: 5000 },
    });
    const spec = compileSpec(project);
    const r = await synthesize(spec, synthSettings(project));
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    const g = sizeDarkNetwork(project, spec, r.value);
    if (!g.ok) throw new Error(g.error.message);
    const v = g.value;
    expect(v.passes).toBe(true);
    expect(pullUpRoom(v)).toBeGreaterThanOrEqual(PULL_UP_ROOM);
    expect(v.binding).toMatch(
      /^a smaller pull-up leaves less than 20\.0 % to the ghost limit or the active-low line's rating \([\d.]+ kΩ, the smallest that keeps every limit, leaves [\d.]+ %; a smaller pull-up breaks /,
    );
    // Every value below it, down to the smallest that passes, keeps every limit with less room, in the full check;
    // the one below that breaks a limit.
    const candidates = pullUpCandidates();
    let k = candidates.indexOf(v.values.pullUpOhms) - 1;
    let below = checkWith(project, spec, r.value, { ...v.values, pullUpOhms: candidates[k] as number });
    if (!below.ok) throw new Error(below.error.message);
    expect(below.value.passes).toBe(true);
    while (below.ok && below.value.passes) {
      expect(pullUpRoom(below.value)).toBeLessThan(PULL_UP_ROOM);
      k -= 1;
      below = checkWith(project, spec, r.value, { ...v.values, pullUpOhms: candidates[k] as number });
    }
    if (!below.ok) throw new Error(below.error.message);
    expect(below.value.passes).toBe(false);
    const smallest = candidates[k + 1] as number;
    expect(v.binding).toContain(`(${smallest / 1000} kΩ, the smallest that keeps every limit`);
  }, 60_000);

  it("sizes a divider whose lit segments are within the budget's window, and names what binds", async () => {
    const { project, spec, matrix } = await design("dark", "divider");
    const g = sizeDarkNetwork(project, spec, matrix);
    if (!g.ok) throw new Error(g.error.message);
    const v = g.value;
    expect(v.passes, v.binding).toBe(true);
    expect(v.values.dividerOhms).not.toBeNull();
    expect(v.values.dividerLowerOhms).not.toBeNull();
    expect(v.weakestLit.currentA).toBeGreaterThanOrEqual(v.litWindowA[0]);
    expect(v.binding).toMatch(/^pull-up: .*; divider: a smaller upper resistor breaks the ghost limit/);
    // The next smaller upper resistor breaks the ghost limit in the full check.
    const uppers = dividerCandidates();
    const smaller = uppers[uppers.indexOf(v.values.dividerOhms as number) - 1] as number;
    const worse = checkWith(project, spec, matrix, { ...v.values, dividerOhms: smaller });
    expect(worse.ok && worse.value.broken.includes("ghost")).toBe(true);
    // The divider of old (its upper resistor the 22 kΩ pull-up's value, its lower one the 47 kΩ pull-down) leaves the lit segments dim.
    const old = checkWith(project, spec, matrix, { ...v.values, pullUpOhms: 22_000, dividerOhms: 22_000, dividerLowerOhms: 47_000 });
    expect(old.ok && old.value.broken.includes("lit-low")).toBe(true);
  });

  it("finds the ghost without level-shift diodes: a node two drops above the line's low turns the driver on", async () => {
    const { project, spec, matrix } = await design("dark");
    const r = checkWith(project, spec, matrix, { pullUpOhms: 4300, shiftDiodes: 0, dividerOhms: null, dividerLowerOhms: null });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.passes).toBe(false);
    expect(r.value.worstUnlit.currentA).toBeGreaterThan(r.value.ghostLimitA);
    expect(r.value.binding).toContain("the ghost limit");
  });

  it("a design's resistors take the corners' tolerance like the project's own, as the budget's corners do", async () => {
    const { project, spec, matrix } = await design("dark");
    const net = { pullUpOhms: 4300, shiftDiodes: 2, dividerOhms: null, dividerLowerOhms: null };
    const own = checkWith(project, spec, matrix, net);
    // The project's own values given as a design: the same circuit at every corner, so the same figures.
    const ohms = new Map([...matrix.outputs].map((o) => [o, project.electrical.segment.seriesResistor]));
    const given = checkWith(project, spec, matrix, net, { design: ohms });
    if (!own.ok || !given.ok) throw new Error("check failed");
    expect(given.value.weakestLit).toEqual(own.value.weakestLit);
    expect(given.value.strongestLit).toEqual(own.value.strongestLit);
    expect(given.value.worstUnlit).toEqual(own.value.worstUnlit);
    // And the corners spread the lit current around the nominal one.
    const nominal = own.value.states.filter((s) => s.corner === "nominal").map((s) => s.weakestLit?.currentA ?? Infinity);
    expect(own.value.weakestLit.corner).toBe("low");
    expect(own.value.weakestLit.currentA).toBeLessThan(Math.min(...nominal));
  });

  it("refuses a matrix with no dark-decoded output", async () => {
    const { project, spec, matrix } = await design("lit");
    expect(sizeDarkNetwork(project, spec, matrix).ok).toBe(false);
  });
});
