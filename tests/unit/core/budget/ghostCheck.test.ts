import { describe, expect, it } from "vitest";
import {
  checkWith,
  dividerCandidates,
  dividerLowerCandidates,
  PULL_UP_ROOM,
  pullUpCandidates,
  pullUpRoom,
  roomSteps,
  sizeDarkNetwork,
} from "../../../../src/core/budget/ghostCheck.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import type { Project } from "../../../../src/core/project/project.ts";
import { makeProject2 } from "../../../support/projects.ts";

/** A project's spec and verified matrix. */
async function synthesized(project: Project) {
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return { project, spec, matrix: r.value };
}

/** A project's spec, matrix and the ghost check's sizing of its dark-decoded network. */
async function sized(project: Project) {
  const { spec, matrix } = await synthesized(project);
  const g = sizeDarkNetwork(project, spec, matrix);
  if (!g.ok) throw new Error(g.error.message);
  return { spec, matrix, v: g.value };
}

function design(decode: string, darkInput = "level-shift") {
  return synthesized(
    makeProject2({
      counter: { states: 6, drive: "complementary" },
      display: {},
      show: [..."012345"],
      synthesis: { depth: "mixed", decode, darkInput, timeLimitMs: 5000 },
    }),
  );
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
    const { spec, matrix, v } = await sized(project);
    expect(v.passes).toBe(true);
    expect(pullUpRoom(v)).toBeGreaterThanOrEqual(PULL_UP_ROOM);
    expect(v.binding).toMatch(
      /^a smaller pull-up leaves less than 20\.0 % to the ghost limit or the active-low line's rating \([\d.]+ kΩ, the smallest that keeps every limit, leaves [\d.]+ %; a smaller pull-up breaks /,
    );
    // Every value below it, down to the smallest that passes, keeps every limit with less room, in the full check;
    // the one below that breaks a limit.
    const candidates = pullUpCandidates();
    let k = candidates.indexOf(v.values.pullUpOhms) - 1;
    let below = checkWith(project, spec, matrix, { ...v.values, pullUpOhms: candidates[k] as number });
    if (!below.ok) throw new Error(below.error.message);
    expect(below.value.passes).toBe(true);
    while (below.ok && below.value.passes) {
      expect(pullUpRoom(below.value)).toBeLessThan(PULL_UP_ROOM);
      k -= 1;
      below = checkWith(project, spec, matrix, { ...v.values, pullUpOhms: candidates[k] as number });
    }
    if (!below.ok) throw new Error(below.error.message);
    expect(below.value.passes).toBe(false);
    const smallest = candidates[k + 1] as number;
    expect(v.binding).toContain(`(${smallest / 1000} kΩ, the smallest that keeps every limit`);
  }, 60_000);

  it("a step up for room: the next pull-up where the line's rating is short, a divider's next upper resistor first where only the ghost limit is", () => {
    const at = { output: "1e", state: "S1", corner: "high" };
    const figures = (unlitA: number, sunkA: number) => ({
      ghostLimitA: 100e-6,
      lineRatedA: 5e-3,
      worstUnlit: { ...at, currentA: unlitA },
      mostSunk: { ...at, output: "nS1", currentA: sunkA },
    });
    const divider = { pullUpOhms: 4700, shiftDiodes: 0, dividerOhms: 12_000, dividerLowerOhms: 10_000 };
    const shift = { pullUpOhms: 4300, shiftDiodes: 2, dividerOhms: null, dividerLowerOhms: null };
    // 15 % to the ghost limit ((100 - 85) / 100), 60 % to the line's rating ((5 - 2) / 5): the upper resistor, then the pull-up.
    expect(roomSteps(divider, figures(85e-6, 2e-3))).toEqual([
      { ...divider, dividerOhms: 13_000 },
      { ...divider, pullUpOhms: 5100 },
    ]);
    // 40 % and 12 % ((5 - 4.4) / 5): the pull-up alone, as a larger upper resistor takes nothing off the line.
    expect(roomSteps(divider, figures(60e-6, 4.4e-3))).toEqual([{ ...divider, pullUpOhms: 5100 }]);
    // Both short: the pull-up first, as it raises both.
    expect(roomSteps(divider, figures(85e-6, 4.4e-3))).toEqual([
      { ...divider, pullUpOhms: 5100 },
      { ...divider, dividerOhms: 13_000 },
    ]);
    // Level-shift diodes: the pull-up, as the pull-up's sizing steps.
    expect(roomSteps(shift, figures(85e-6, 2e-3))).toEqual([{ ...shift, pullUpOhms: 4700 }]);
    // 21 % and 22 %: no step; the top of both series: none.
    expect(roomSteps(divider, figures(79e-6, 3.9e-3))).toEqual([]);
    expect(roomSteps({ ...divider, pullUpOhms: 100_000, dividerOhms: 1_000_000 }, figures(85e-6, 4.4e-3))).toEqual([]);
  });

  it("goes up from the smallest divider values that keep every limit to the first that leave 20 % to the ghost limit and the line's rating", async () => {
    // 0-9 decoded dark at depth 1 through dividers on the 5 V preset: 4.7 kΩ pull-ups over 3.6 kΩ upper resistors
    // (15 kΩ lower ones) are the smallest that keep every limit and leave the line's rating 9.6 % (the room is our own
    // rule, common practice, no source).
    const project = makeProject2({
      counter: { states: 10, drive: "complementary" },
      display: { positions: 1, cell: "seg7" },
      show: [..."0123456789"],
      synthesis: { maxDepth: 1, decode: "dark", darkInput: "divider", timeLimitMs: 5000 },
    });
    const { spec, matrix, v } = await sized(project);
    expect(v.passes, v.binding).toBe(true);
    expect(pullUpRoom(v)).toBeGreaterThanOrEqual(PULL_UP_ROOM);
    const said =
      /; then up the series, as ([\d.]+) kΩ pull-ups over ([\d.]+) kΩ upper resistors, the smallest that keep every limit, leave ([\d.]+) % to the ghost limit or the active-low line's rating, less than 20\.0 %: ([\d.]+) kΩ pull-ups over ([\d.]+) kΩ upper resistors leave ([\d.]+) %$/.exec(
        v.binding,
      );
    expect(said, v.binding).not.toBeNull();
    const [pullUp0, upper0, room0, pullUp1, upper1, room1] = (said ?? []).slice(1).map(Number) as number[];
    expect([pullUp1, upper1]).toEqual([v.values.pullUpOhms / 1000, (v.values.dividerOhms as number) / 1000]);
    expect(room1).toBeCloseTo(100 * pullUpRoom(v), 1);
    const smallest = { ...v.values, pullUpOhms: (pullUp0 as number) * 1000, dividerOhms: (upper0 as number) * 1000 };
    const full = (values: typeof smallest) => {
      const c = checkWith(project, spec, matrix, values);
      if (!c.ok) throw new Error(c.error.message);
      return c.value;
    };
    // The smallest keeps every limit with less room, as it says; one value down of either breaks a limit, in the full check.
    const s = full(smallest);
    expect(s.passes).toBe(true);
    expect(pullUpRoom(s)).toBeLessThan(PULL_UP_ROOM);
    expect(100 * pullUpRoom(s)).toBeCloseTo(room0 as number, 1);
    const pullUps = pullUpCandidates();
    const uppers = dividerCandidates();
    expect(full({ ...smallest, pullUpOhms: pullUps[pullUps.indexOf(smallest.pullUpOhms) - 1] as number }).passes).toBe(false);
    expect(full({ ...smallest, dividerOhms: uppers[uppers.indexOf(smallest.dividerOhms) - 1] as number }).passes).toBe(false);
    // Every value between the smallest and the one taken keeps every limit with less room.
    const between = pullUps.filter((p) => p >= smallest.pullUpOhms && p <= v.values.pullUpOhms);
    const betweenUpper = uppers.filter((u) => u >= smallest.dividerOhms && u <= (v.values.dividerOhms as number));
    expect(between.length * betweenUpper.length).toBeGreaterThan(1);
    for (const p of between)
      for (const u of betweenUpper) {
        if (p === v.values.pullUpOhms && u === v.values.dividerOhms) continue;
        const c = full({ ...smallest, pullUpOhms: p, dividerOhms: u });
        expect(c.passes, `${p} over ${u}`).toBe(true);
        expect(pullUpRoom(c), `${p} over ${u}`).toBeLessThan(PULL_UP_ROOM);
      }
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
