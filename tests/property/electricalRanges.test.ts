/**
 * Every electrical value the schema allows gives a budget or a failure that
 * names the problem, never an internal error: for random projects of every
 * preset (so every driver kind) whose fields sit at the ends of their
 * allowed ranges, at their defaults, or anywhere in between (log-uniform
 * for ranges over decades), `solveBudget` returns a value and does not
 * throw. Issue 15 found a 5e-324 A target passing the schema and then
 * crashing the trim.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { solveBudget } from "../../src/core/budget/budget.ts";
import { ELECTRICAL_DEFAULTS, ELECTRICAL_RANGES } from "../../src/core/project/electricalSchema.ts";
import { PRESET_NAMES } from "../../src/core/project/electricalPresets.ts";
import type { NumberRule } from "../../src/core/project/fieldRules.ts";
import { validateProject } from "../../src/core/project/projectSchema.ts";
import { directDesign } from "../support/budgetFixtures.ts";

const SEED = 15_015;

/** A value of one field: an end of its range, its default, or a value inside it. */
function valueIn(rule: NumberRule, fallback: number): fc.Arbitrary<number> {
  const min = rule.min ?? 0;
  const max = rule.max ?? 1;
  const inside =
    rule.integer === true
      ? fc.integer({ min, max })
      : min > 0 && max / min > 1000
        ? fc.double({ min: Math.log10(min), max: Math.log10(max), noNaN: true }).map((e) => Math.min(max, Math.max(min, 10 ** e)))
        : fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
  return fc.oneof(fc.constant(min), fc.constant(max), fc.constant(fallback), inside);
}

/** Up to four fields changed from their defaults at once. */
const changes = fc.uniqueArray(fc.constantFrom(...Object.keys(ELECTRICAL_RANGES)), { minLength: 1, maxLength: 4 }).chain((paths) =>
  fc.tuple(
    ...paths.map((path) => {
      const rule = ELECTRICAL_RANGES[path as keyof typeof ELECTRICAL_RANGES];
      const [a, b] = path.split(".") as [string, string | undefined];
      const section = ELECTRICAL_DEFAULTS[a as keyof typeof ELECTRICAL_DEFAULTS];
      const fallback =
        typeof section === "number" ? section : b === undefined ? 0 : ((section as unknown as Record<string, number>)[b] ?? 0);
      return valueIn(rule, typeof fallback === "number" ? fallback : 0).map((x) => [path, x] as const);
    }),
  ),
);

function electricalWith(values: readonly (readonly [string, number])[]): Record<string, unknown> {
  const e: Record<string, Record<string, unknown> | number> = {};
  for (const [path, x] of values) {
    const [a, b] = path.split(".") as [string, string];
    if (b === undefined) e[a] = x;
    else if (path === "driver.emitterResistors") e["driver"] = { ...(e["driver"] as object), emitterResistors: { "1b": x } };
    else if (path === "segment.seriesResistors") e["segment"] = { ...(e["segment"] as object), seriesResistors: { "1b": x } };
    else if (path === "tolerance.temperatureC") e["tolerance"] = { ...(e["tolerance"] as object), temperatureC: [x, x] };
    else e[a] = { ...(e[a] as object), [b]: x };
  }
  return e;
}

describe(`electrical values across their allowed ranges (fast-check seed ${SEED})`, () => {
  it("give a budget or a named failure, never a throw", () => {
    let solved = 0;
    let checked = 0;
    fc.assert(
      fc.property(changes, fc.constantFrom(...PRESET_NAMES), (values, preset) => {
        const r = validateProject({
          schema: "diodeloom/project@2",
          // A high-side switch's lit cells sit on active-low lines: a sink-drive counter.
          counter: { states: 3, drive: preset === "bench-5v-high-side" ? "sink" : "source" },
          display: {},
          show: ["1", "7", "8"],
          electrical: { preset, ...electricalWith(values) },
        });
        fc.pre(r.ok);
        if (!r.ok) return;
        checked++;
        const d = directDesign("ranges", r.value);
        const b = solveBudget(d.project, d.spec, d.matrix);
        if (b.ok) solved++;
        else expect(b.error.message).toMatch(/\S/);
      }),
      { seed: SEED, numRuns: 150 },
    );
    expect(checked).toBeGreaterThan(50);
    expect(solved).toBeGreaterThan(0);
  });
});
