/**
 * The margin lines of the dark-decoded outputs' sizing: the room left at
 * each limit, worked out by hand on given figures, and the thin-margin line
 * that says the value is the smallest that passes and what the next E24
 * pull-up up gives, solved by the same check the budget runs.
 */
import { describe, expect, it } from "vitest";
import { darkMarginLines, THIN_MARGIN } from "../../../src/cli/darkSizingText.ts";
import { darkMargins, type GhostFigures } from "../../../src/render/darkBudgetText.ts";
import { formatOhms } from "../../../src/render/units.ts";
import { checkWith, dividerCandidates, pullUpCandidates, sizeDarkNetwork } from "../../../src/core/budget/ghostCheck.ts";
import { compileSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../src/core/synth/synthesize.ts";
import { makeProject2 } from "../../support/projects.ts";

const at = { output: "1d", state: "S1", corner: "high" };
const figures = (unlitA: number, sunkA: number): GhostFigures => ({
  ghostLimitA: 100e-6,
  lineRatedA: 5e-3,
  litWindowA: [8e-3, 12e-3],
  worstUnlit: { ...at, currentA: unlitA },
  mostSunk: { ...at, output: "nS1", currentA: sunkA },
  weakestLit: { currentA: 8.4e-3 },
  strongestLit: { currentA: 11.4e-3 },
  passes: true,
});

describe("margins of the dark-decoded outputs' network", () => {
  it("each limit's margin is the room left as a share of the limit (worked by hand)", () => {
    const m = darkMargins(figures(87.6e-6, 2.95e-3));
    // (100 - 87.6) / 100 = 0.124; (5 - 2.95) / 5 = 0.41; (8.4 - 8) / 8 = 0.05; (12 - 11.4) / 12 = 0.05
    expect(m.ghost).toBeCloseTo(0.124, 12);
    expect(m.lineSink).toBeCloseTo(0.41, 12);
    expect(m.litLow).toBeCloseTo(0.05, 12);
    expect(m.litHigh).toBeCloseTo(0.05, 12);
    expect(THIN_MARGIN).toBe(0.2);
  });

  it("a thin margin at the limit a smaller pull-up breaks says no value up leaves the room and solves the next one up", async () => {
    const project = makeProject2({
      counter: { states: 10, drive: "complementary" },
      display: { positions: 1, cell: "seg7" },
      show: [..."0123456789"],
      synthesis: { depth: "mixed", decode: "dark", timeLimitMs: 5000 },
    });
    const spec = compileSpec(project);
    const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
    if (!r.ok) throw new Error(r.error.message);
    const sized = sizeDarkNetwork(project, spec, r.value);
    if (!sized.ok) throw new Error(sized.error.message);
    const g = sized.value;
    expect(g.passes).toBe(true);
    const net = g.values;
    // Wide margins: one line, no thin-margin line.
    const wide = darkMarginLines(project, spec, r.value, net, figures(20e-6, 1e-3));
    expect(wide).toEqual([
      "margins: 80.0 % below the ghost limit, 80.0 % below the active-low line's rating, lit window 5.0 % above its low end and 5.0 % below its high end",
    ]);
    // The ghost limit with less room than the line's rating and under 20 %: the thin line, with the next E24 value solved.
    const thin = darkMarginLines(project, spec, r.value, net, figures(90e-6, 1e-3));
    expect(thin).toHaveLength(2);
    expect(thin[1]).toMatch(/^thin margin, 10\.0 % to the ghost limit \(90\.0 of 100\.0 µA, 1d in S1, high corner\): /);
    expect(thin[1]).toContain(
      `: no E24 pull-up from ${formatOhms(net.pullUpOhms)} up leaves 20.0 % there and keeps every limit; the next one up, `,
    );
    const next = Number(/the next one up, ([\d.]+)k/.exec(thin[1] ?? "")?.[1]) * 1000;
    expect(next).toBeGreaterThan(net.pullUpOhms);
    const check = checkWith(project, spec, r.value, { ...net, pullUpOhms: next });
    if (!check.ok) throw new Error(check.error.message);
    expect(thin[1]).toContain(check.value.passes ? "passes too" : "breaks");
    // The line's rating binds when it has less room.
    const sink = darkMarginLines(project, spec, r.value, net, figures(10e-6, 4.5e-3));
    expect(sink[1]).toMatch(/^thin margin, 10\.0 % to the active-low line's rating \(4\.500 of 5\.00 mA, nS1 in S1, high corner\)/);
    // A failing network gets the margins only (the verdict says what breaks).
    expect(darkMarginLines(project, spec, r.value, net, { ...figures(120e-6, 1e-3), passes: false })).toHaveLength(1);
  }, 60_000);

  it("a divider's thin margin says no step up leaves the room and solves each step the sizing would try", async () => {
    const project = makeProject2({
      counter: { states: 10, drive: "complementary" },
      display: { positions: 1, cell: "seg7" },
      show: [..."0123456789"],
      synthesis: { depth: "mixed", decode: "dark", darkInput: "divider", timeLimitMs: 5000 },
    });
    const spec = compileSpec(project);
    const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
    if (!r.ok) throw new Error(r.error.message);
    const sized = sizeDarkNetwork(project, spec, r.value);
    if (!sized.ok) throw new Error(sized.error.message);
    const net = sized.value.values;
    const upper = net.dividerOhms as number;
    const nextUpper = dividerCandidates().find((u) => u > upper) as number;
    const nextPullUp = pullUpCandidates().find((p) => p > net.pullUpOhms) as number;
    const solved = (values: typeof net): string => {
      const c = checkWith(project, spec, r.value, values);
      if (!c.ok) throw new Error(c.error.message);
      return c.value.passes ? "passes too" : `breaks ${c.value.binding}`;
    };
    // The ghost limit short (10 %), the line's rating not (80 %): the next upper resistor first, then the next pull-up.
    const ghost = darkMarginLines(project, spec, r.value, net, figures(90e-6, 1e-3));
    expect(ghost).toHaveLength(2);
    expect(ghost[1]).toMatch(/^thin margin, 10\.0 % to the ghost limit \(90\.0 of 100\.0 µA, 1d in S1, high corner\): /);
    expect(ghost[1]).toContain(
      `: no E24 step up from ${formatOhms(net.pullUpOhms)} pull-ups over ${formatOhms(upper)} upper resistors (${formatOhms(net.dividerLowerOhms as number)} lower ones) leaves 20.0 % there and keeps every limit; ` +
        `the next one up, ${formatOhms(nextUpper)} upper resistors, ${solved({ ...net, dividerOhms: nextUpper })}: `,
    );
    expect(ghost[1]).toContain(`; or ${formatOhms(nextPullUp)} pull-ups, ${solved({ ...net, pullUpOhms: nextPullUp })}: `);
    // The line's rating short alone: the pull-up only.
    const sink = darkMarginLines(project, spec, r.value, net, figures(10e-6, 4.5e-3));
    expect(sink[1]).toContain(`; the next one up, ${formatOhms(nextPullUp)} pull-ups, `);
    expect(sink[1]).not.toContain("upper resistors, ");
  }, 60_000);
});
