import { describe, expect, it } from "vitest";
import { checkWith, ghostCheck, pullUpCandidates } from "../../../../src/core/budget/ghostCheck.ts";
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
  it("tries E24 pull-ups from 1 kΩ to 100 kΩ", () => {
    const c = pullUpCandidates();
    expect(c[0]).toBe(1000);
    expect(c[c.length - 1]).toBe(100_000);
    expect(c).toContain(4300);
  });

  it("sizes the pull-up on the 5 V preset and names the limit that stops a smaller one", async () => {
    const { project, spec, matrix } = await design("dark");
    const g = ghostCheck(project, spec, matrix);
    expect(g.ok).toBe(true);
    if (!g.ok) return;
    const v = g.value;
    expect(v.passes).toBe(true);
    expect(v.values.shiftDiodes).toBe(2);
    expect(v.worstUnlit.currentA).toBeLessThanOrEqual(v.ghostLimitA);
    expect(v.mostSunk.currentA).toBeLessThanOrEqual(project.electrical.lowLine.maxCurrentA);
    expect(v.weakestLit.currentA).toBeGreaterThanOrEqual(0.5 * project.electrical.segment.targetA);
    expect(v.binding).toMatch(/^a smaller pull-up fails: /);
    // The next smaller E24 value breaks the limit the check names.
    const candidates = pullUpCandidates();
    const smaller = candidates[candidates.indexOf(v.values.pullUpOhms) - 1] as number;
    const worse = checkWith(project, spec, matrix, { ...v.values, pullUpOhms: smaller });
    expect(worse.ok && worse.value.passes).toBe(false);
  });

  it("finds the ghost without level-shift diodes: a node two drops above the line's low turns the driver on", async () => {
    const { project, spec, matrix } = await design("dark");
    const r = checkWith(project, spec, matrix, { pullUpOhms: 4300, shiftDiodes: 0, dividerOhms: null });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.passes).toBe(false);
    expect(r.value.worstUnlit.currentA).toBeGreaterThan(r.value.ghostLimitA);
    expect(r.value.binding).toContain("the ghost limit");
  });

  it("refuses a matrix with no dark-decoded output", async () => {
    const { project, spec, matrix } = await design("lit");
    expect(ghostCheck(project, spec, matrix).ok).toBe(false);
  });
});
