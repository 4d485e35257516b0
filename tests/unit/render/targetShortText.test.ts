import { describe, expect, it } from "vitest";
import { solveBudget } from "../../../src/core/budget/budget.ts";
import type { Budget } from "../../../src/core/budget/budgetTypes.ts";
import { TRIM_HELPS_PCT, type TrimMode } from "../../../src/core/budget/segmentDesign.ts";
import { compileSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../src/core/synth/synthesize.ts";
import type { Project } from "../../../src/core/project/project.ts";
import { describeBudget } from "../../../src/cli/commands/budget.ts";
import { budgetJsonText } from "../../../src/render/budgetJson.ts";
import { budgetDesignNote, remedyText, shortOfText } from "../../../src/render/targetShortText.ts";
import { makeProject2 } from "../../support/projects.ts";

/**
 * 0-9 on one position, every output decoded dark through a divider onto NPN
 * switches, paths up to 3 diodes: the divider's pull-ups, sized by the ghost
 * check, leave the switches short of base current at the low corner. The
 * trim of the series resistors, judged at the nominal values, moves the
 * farthest segment by a few millionths of a percent; the rule does not take
 * that for help, but `trim: "on"` applies it.
 */
function darkDivider(synthesis: Record<string, unknown> = {}): Project {
  return makeProject2({
    title: "v",
    counter: { states: 10, drive: "complementary" },
    display: { positions: 1, cell: "seg7" },
    show: [..."0123456789"],
    synthesis: { maxDepth: 3, depth: "mixed", decode: "dark", darkInput: "divider", timeLimitMs: 20_000, ...synthesis },
  });
}

async function budgeted(project: Project, trim: TrimMode = "auto") {
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project));
  if (!r.ok) throw new Error(r.error.message);
  const b = solveBudget(project, spec, r.value, { trim });
  if (!b.ok) throw new Error(b.error.message);
  return { project, spec, matrix: r.value, budget: b.value };
}

describe("a trim that leaves the corners outside the window", () => {
  it(`is not applied by the rule: a gain under ${TRIM_HELPS_PCT} percentage points is no help (here it took the high corner from 11.05 to 19.78 mA)`, async () => {
    const b = (await budgeted(darkDivider())).budget;
    expect(b.trim.applied).toBe(false);
    expect(b.corners.meetsTarget).toBe(false);
    const applied = (await budgeted(darkDivider(), "on")).budget;
    expect(applied.trim.applied).toBe(true);
    // The trimmed design's high corner runs far above the project's: the trim must not be taken for help.
    expect(applied.corners.high.maxCurrentA).toBeGreaterThan(b.corners.high.maxCurrentA + 0.005);
  });

  it("does not read as applied because it helps: the note, the heading, the corner line and the warning name the limits missed and what to change", async () => {
    const d = await budgeted(darkDivider(), "on");
    const b = d.budget;
    // The trim applied (asked for), the corners miss the window both ways, every switch unsaturated.
    expect(b.trim.applied).toBe(true);
    expect(b.corners.meetsTarget).toBe(false);
    expect(b.corners.shortOf).toEqual(["below-window", "above-window", "switch-unsaturated"]);
    expect(Object.values(b.drivers).every((x) => x.saturated === false)).toBe(true);

    const text = describeBudget(d.project, d.spec, d.matrix, b);
    expect(text).not.toContain("applied because it brings the segments nearer the target");
    expect(text).toContain("trim: E24, applied, yet the corners miss the target");
    const note = budgetDesignNote(b);
    expect(note).toMatch(
      /^Series resistors: the E24 trim is applied \(at the nominal values it takes the farthest segment from 19\.6 % to 19\.6 % off the target\), but it does not bring the segments into the ±20 % window: over the corners they are /,
    );
    expect(note).toContain(`below the window at the low corner (`);
    expect(note).toContain(`above it at the high corner (`);
    expect(note).toContain("the switches of 1a, 1b, 1c, 1d, 1e, 1f, 1g not saturated at the low corner");
    expect(note).toContain('the level-shift input network (synthesis.darkInput "level-shift") instead of the divider');
    expect(note).toContain("a lower depth limit (synthesis.maxDepth");
    expect(text).toContain(`\n  ${note}\n`);
    expect(text).toMatch(
      /\n {2}Misses the target: .*\n {2}Missed: below the window at the low corner \(.*\); above it at the high corner \(.*\); the switches of 1a, .* not saturated at the low corner\n/,
    );

    // The JSON: what the corners miss, and the warning's words.
    const json = JSON.parse(budgetJsonText(b)) as Omit<Budget, "warnings"> & {
      warnings: { code: string; message: string; trimApplied?: boolean }[];
    };
    expect(json.corners.shortOf).toEqual(["below-window", "above-window", "switch-unsaturated"]);
    const w = json.warnings.find((x) => x.code === "corner-target");
    expect(w?.trimApplied).toBe(true);
    expect(w?.message).toContain("the trim of the current-setting resistors is applied and does not bring them in");
    expect(w?.message).not.toContain("or a driver saturating");
  });

  it("gives remedies that work: each one the text names, taken alone, brings the corners into the window", async () => {
    for (const fix of [{ darkInput: "level-shift" }, { maxDepth: 2 }]) {
      const d = await budgeted(darkDivider(fix));
      expect(d.budget.corners.meetsTarget, JSON.stringify(fix)).toBe(true);
      expect(d.budget.corners.shortOf).toEqual([]);
      expect(budgetDesignNote(d.budget)).not.toContain("does not bring the segments into");
    }
  });
});

describe("shortOfText and remedyText", () => {
  const f = { minA: 0.0075, maxA: 0.0131, targetA: 0.01, windowPct: 20, maxRatedA: 0.012, unsaturated: ["1a"] };

  it("names each limit with the figure against its bound", () => {
    expect(shortOfText(["below-window", "above-window", "over-rating", "no-headroom", "switch-unsaturated"], f)).toBe(
      "below the window at the low corner (7.5 mA against 8 mA); above it at the high corner (13.1 mA against 12 mA); " +
        "over the segment rating at the high corner (13.1 mA against 12 mA); a driver out of collector-base headroom at the low corner; " +
        "the switch of 1a not saturated at the low corner",
    );
  });

  it("says what to change: the supply's range for a lit design, base current first where a switch is unsaturated, each once", () => {
    const lit = { kind: "low-side-switch", darkInput: null, deeperPaths: false } as const;
    expect(remedyText(["below-window", "above-window"], lit)).toBe(
      "narrow the supply range (electrical.supply.minVolts and maxVolts) or use closer resistors (electrical.tolerance.resistorPct)",
    );
    expect(remedyText(["below-window", "switch-unsaturated"], { kind: "low-side-switch", darkInput: null, deeperPaths: true })).toBe(
      "give the switches more base current (an unsaturated switch's base current sets its segment current, not its series resistor), " +
        "with a smaller base resistor (electrical.driver.baseResistor) or a lower depth limit (synthesis.maxDepth: fewer diodes in series)",
    );
    // A sink's or follower's current does not follow the segment supply.
    expect(remedyText(["above-window"], { ...lit, kind: "current-sink" })).toBe("use closer resistors (electrical.tolerance.resistorPct)");
    expect(remedyText(["over-rating", "no-headroom"], lit)).toBe(
      "lower the target (electrical.segment.targetA) or use a segment rated higher (electrical.segment.maxA); " +
        "or raise the supply or use fewer LEDs per segment (electrical.segment.leds)",
    );
  });
});
