/**
 * The instrument budget bounds the supplies' totals over every combination
 * of the counters' states without trying them: per case the sum of each
 * decoder's worst state. Checked here against random combinations
 * (fast-check, seeded) and, for a small instrument, against every
 * combination tried one by one.
 */
import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { solveBudget } from "../../src/core/budget/budget.ts";
import {
  instrumentBudget,
  SUPPLY_CASES,
  type BudgetedDecoder,
  type DecoderDraw,
  type InstrumentBudget,
  type SupplyCaseName,
} from "../../src/core/budget/instrumentBudget.ts";
import { decoderRefPrefix, withRefPrefix } from "../../src/core/matrix/designators.ts";
import { validateInstrument } from "../../src/core/project/instrument.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";

const digits = (n: number): string[] => Array.from({ length: n }, (_, k) => String(k % 10));

async function budgeted(doc: unknown): Promise<BudgetedDecoder[]> {
  const inst = validateInstrument(doc);
  if (!inst.ok) throw new Error(JSON.stringify(inst.error));
  const out: BudgetedDecoder[] = [];
  for (const [i, d] of inst.value.decoders.entries()) {
    const spec = compileSpec(d.project);
    const m = await synthesize(spec, synthSettings(d.project, { mode: "fast" }));
    if (!m.ok) throw new Error(m.error.message);
    const matrix = withRefPrefix(m.value, decoderRefPrefix(i, inst.value.decoders.length));
    const b = solveBudget(d.project, spec, matrix);
    if (!b.ok) throw new Error(b.error.message);
    out.push({ name: d.name, project: d.project, spec, matrix, budget: b.value });
  }
  return out;
}

type Figure = (d: DecoderDraw) => readonly number[];
const FIGURES: readonly [string, Figure, (ib: InstrumentBudget) => number][] = [
  ["segment current", (d) => d.segmentA, (ib) => ib.segment.currentA.value],
  ["segment power", (d) => d.segmentW, (ib) => ib.segment.powerW.value],
  ["logic current", (d) => d.logicA, (ib) => ib.logic.currentA.value],
  ["logic power", (d) => d.logicW, (ib) => ib.logic.powerW.value],
  ["both supplies' power", (d) => d.segmentW.map((w, k) => w + (d.logicW[k] ?? 0)), (ib) => ib.totalPowerW.value],
];

/** The total of a combination: every decoder in its state, each in the given case. */
function combination(ib: InstrumentBudget, f: Figure, cases: readonly SupplyCaseName[], states: readonly number[]): number {
  return states.reduce((a, k, i) => {
    const d = ib.draws[cases[i] ?? "nominal"][i];
    return a + (d ? (f(d)[k] ?? NaN) : NaN);
  }, 0);
}

describe("instrument budget: a clock's three counters on one supply", () => {
  let decoders: BudgetedDecoder[] = [];
  let ib: InstrumentBudget;
  beforeAll(async () => {
    decoders = await budgeted({
      schema: "diodeloom/project@2",
      title: "Clock",
      electrical: { preset: "bench-5v-switch" },
      decoders: [
        { name: "units", counter: { states: 10 }, display: {}, show: digits(10) },
        { name: "tens", counter: { states: 6, code: "binary" }, display: {}, show: digits(6) },
        {
          name: "hours",
          counter: { states: 12 },
          display: { positions: 2 },
          show: Array.from({ length: 12 }, (_, k) => String(k + 1).padStart(2, " ")),
        },
      ],
    });
    const r = instrumentBudget("Clock", decoders);
    if (!r.ok) throw new Error(r.error.message);
    ib = r.value;
  }, 120_000);

  it("bounds it case by case, every decoder sharing the supplies and temperature", () => {
    expect(ib.bound).toBe("per-case-sum");
    // The nominal case sums the decoders' own budgets' worst supply currents.
    expect(ib.cases.nominal.segmentA).toBeCloseTo(
      decoders.reduce((a, d) => a + d.budget.supply.maxCurrentA, 0),
      12,
    );
    expect(ib.cases.nominal.logicA).toBeCloseTo(
      decoders.reduce((a, d) => a + d.budget.logic.maxCurrentA, 0),
      12,
    );
  });

  it("no random combination of states exceeds a total, and the states it names reach it (fast-check seed 1313)", () => {
    const lengths = decoders.map((d) => d.project.counter.states);
    const combo = fc.record({
      c: fc.constantFrom(...SUPPLY_CASES),
      states: fc.tuple(...lengths.map((n) => fc.integer({ min: 0, max: n - 1 }))),
    });
    fc.assert(
      fc.property(combo, ({ c, states }) => {
        for (const [, f, worst] of FIGURES) {
          expect(
            combination(
              ib,
              f,
              states.map(() => c),
              states,
            ),
          ).toBeLessThanOrEqual(worst(ib) * (1 + 1e-12));
        }
      }),
      { seed: 1313, numRuns: 300 },
    );
    for (const t of [ib.segment.currentA, ib.segment.powerW, ib.logic.currentA, ib.logic.powerW, ib.totalPowerW]) {
      const states = t.states.map((s) => Number(s.slice(1)));
      const f = FIGURES[[ib.segment.currentA, ib.segment.powerW, ib.logic.currentA, ib.logic.powerW, ib.totalPowerW].indexOf(t)]?.[1];
      if (!f) throw new Error("figure");
      expect(combination(ib, f, t.cases, states)).toBeCloseTo(t.value, 12);
    }
  });

  it("equals the largest total found by trying all 720 combinations in every case", () => {
    const [a, b, c] = decoders.map((d) => d.project.counter.states) as [number, number, number];
    for (const [name, f, worst] of FIGURES) {
      let best = -Infinity;
      for (const cs of SUPPLY_CASES)
        for (let i = 0; i < a; i++)
          for (let j = 0; j < b; j++) for (let k = 0; k < c; k++) best = Math.max(best, combination(ib, f, [cs, cs, cs], [i, j, k]));
      expect(worst(ib), name).toBeCloseTo(best, 12);
    }
  });
});

describe("instrument budget: decoders whose supplies differ", () => {
  it("bounds by the sum of each decoder's worst over every case, reached by naming each decoder's own (fast-check seed 2024)", async () => {
    const decoders = await budgeted({
      schema: "diodeloom/project@2",
      title: "Two rails",
      electrical: { preset: "bench-5v-switch" },
      decoders: [
        { name: "a", counter: { states: 4 }, display: {}, show: digits(4) },
        {
          name: "b",
          counter: { states: 5 },
          display: {},
          show: digits(5),
          electrical: { supply: { volts: 5, minVolts: 4.5, maxVolts: 5.5 } },
        },
      ],
    });
    const r = instrumentBudget("Two rails", decoders);
    if (!r.ok) throw new Error(r.error.message);
    const ib = r.value;
    expect(ib.bound).toBe("sum-of-maxima");
    fc.assert(
      fc.property(
        fc.tuple(fc.constantFrom(...SUPPLY_CASES), fc.constantFrom(...SUPPLY_CASES)),
        fc.tuple(fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 4 })),
        (cases, states) => {
          for (const [, f, worst] of FIGURES) expect(combination(ib, f, cases, states)).toBeLessThanOrEqual(worst(ib) * (1 + 1e-12));
        },
      ),
      { seed: 2024, numRuns: 200 },
    );
    const t = ib.segment.currentA;
    expect(
      combination(
        ib,
        (d) => d.segmentA,
        t.cases,
        t.states.map((s) => Number(s.slice(1))),
      ),
    ).toBeCloseTo(t.value, 12);
  }, 120_000);
});
