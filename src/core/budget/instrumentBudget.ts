/**
 * One budget for an instrument of several decoders: each decoder's budget
 * as a single project has it, and the supplies' worst-case totals over the
 * combinations of the counters' states.
 *
 * The counters run independently, so any state of one may meet any state of
 * another: a clock of 10 x 6 x 12 states has 720 combinations, sixteen
 * decoders of 256 states 256^16. The decoders' circuits share nothing but
 * the supplies, which the model takes as ideal sources, so at one set of
 * conditions (the supply voltages and the ambient temperature) each
 * decoder's currents depend on its own state only, and the total is a sum
 * of independent terms. Its largest value is then the sum of each
 * decoder's largest, attained by putting every counter in its own worst
 * state: no product needs enumerating.
 *
 * The conditions are the nominal ones and the two tolerance corners
 * (corners.ts). When every decoder has the same supplies and temperature in
 * a case, the case's total is that exact sum, and the worst total is the
 * largest over the cases (`per-case-sum`). When the decoders' cases differ
 * (a decoder overrides the supply or the temperature range), no case is one
 * set of conditions for all of them; the total is then bounded by the sum
 * of each decoder's largest over all its cases (`sum-of-maxima`), a bound
 * no combination exceeds, reached only if every decoder's worst case can
 * happen at once.
 */
import { budgetDesign } from "./budget.ts";
import type { Budget } from "./budgetTypes.ts";
import { cornerConditions, cornerModel } from "./corners.ts";
import { readSweep } from "./sweepReading.ts";
import type { BudgetFailure } from "../circuit/stateSweep.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import type { ElectricalModel, Project } from "../project/project.ts";
import { fail, ok, type Result } from "../result/result.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";

export const INSTRUMENT_BUDGET_SCHEMA = "diodeloom/instrument-budget@1";

/** One decoder of an instrument, synthesized and budgeted. */
export interface BudgetedDecoder {
  readonly name: string;
  readonly project: Project;
  readonly spec: DecodeSpec;
  readonly matrix: VerifiedMatrix;
  readonly budget: Budget;
}

/** The conditions of a case: nominal, or a tolerance corner. */
export type SupplyCaseName = "nominal" | "low" | "high";
export const SUPPLY_CASES: readonly SupplyCaseName[] = ["nominal", "low", "high"];

/** What decides whether two decoders' cases are one set of conditions: the shared rails and the ambient temperature. */
export interface SharedConditions {
  /** Segment supply, volts. */
  readonly supplyV: number;
  /** Logic supply, volts. */
  readonly logicV: number;
  /** A counter line's high level, volts. */
  readonly lineHighV: number;
  readonly temperatureC: number;
}

/** One decoder's draw on the supplies in one case, per state (in state order). */
export interface DecoderDraw {
  readonly conditions: SharedConditions;
  /** Segment supply current per state, amperes. */
  readonly segmentA: readonly number[];
  /** Segment supply power per state, watts. */
  readonly segmentW: readonly number[];
  /** Logic supply current per state (the counter's high lines and what the rail feeds), amperes. */
  readonly logicA: readonly number[];
  /** Logic supply power per state, watts. */
  readonly logicW: readonly number[];
}

/** How a total was bounded (see the module's comment). */
export type TotalBound = "per-case-sum" | "sum-of-maxima";

/** The worst of one figure (a current or a power) summed over the decoders. */
export interface WorstTotal {
  readonly value: number;
  /** The case it is reached in; for `sum-of-maxima`, each decoder's own (`cases`). */
  readonly cases: readonly SupplyCaseName[];
  /** Per decoder, the state it is reached in (`S<k>`). */
  readonly states: readonly string[];
  /** Per decoder, its share. */
  readonly shares: readonly number[];
}

export interface SupplyTotals {
  readonly currentA: WorstTotal;
  readonly powerW: WorstTotal;
}

/** One case's worst sums, each over the decoders' worst states in that case. */
export interface CaseTotals {
  readonly segmentA: number;
  readonly segmentW: number;
  readonly logicA: number;
  readonly logicW: number;
  readonly totalW: number;
}

export interface InstrumentBudget {
  readonly schema: typeof INSTRUMENT_BUDGET_SCHEMA;
  readonly title: string;
  /** The decoders' names, in file order. */
  readonly decoders: readonly string[];
  /** How the totals are bounded. */
  readonly bound: TotalBound;
  /** Per case, per decoder (file order), its draw. */
  readonly draws: Readonly<Record<SupplyCaseName, readonly DecoderDraw[]>>;
  /** The segment supply's worst totals (0 where every decoder drives directly). */
  readonly segment: SupplyTotals;
  /** The logic supply's worst totals. */
  readonly logic: SupplyTotals;
  /** Both supplies together: the instrument's worst power, watts. */
  readonly totalPowerW: WorstTotal;
  /**
   * Per case, each figure's sum of the decoders' worst states in that case
   * (amperes, watts): the rows the totals take the largest of. Exact per
   * case where the bound is `per-case-sum`.
   */
  readonly cases: Readonly<Record<SupplyCaseName, CaseTotals>>;
  /** Warnings of all decoders together (each decoder's are in its budget). */
  readonly warningCount: number;
}

function drawOf(
  states: readonly { readonly supplyA: number; readonly highSourceA: number; readonly logicA: number }[],
  model: ElectricalModel,
): DecoderDraw {
  return {
    conditions: {
      supplyV: model.supply.volts,
      logicV: model.logicSupply.volts,
      lineHighV: model.counterOutput.high,
      temperatureC: model.temperatureC,
    },
    segmentA: states.map((s) => s.supplyA),
    segmentW: states.map((s) => s.supplyA * model.supply.volts),
    logicA: states.map((s) => s.highSourceA + s.logicA),
    logicW: states.map((s) => s.highSourceA * model.counterOutput.high + s.logicA * model.logicSupply.volts),
  };
}

/**
 * Each case's draw of one decoder: nominal from its budget's states, the
 * corners solved again with the design its budget took.
 */
export function decoderDraws(
  d: Omit<BudgetedDecoder, "name">,
  deadlineMs?: number,
): Result<Readonly<Record<SupplyCaseName, DecoderDraw>>, BudgetFailure> {
  const e = d.project.electrical;
  const nominal = drawOf(
    d.budget.states.map((s) => ({ supplyA: s.supplyCurrentA, highSourceA: s.sourceCurrentA, logicA: s.logicCurrentA })),
    e,
  );
  const design = budgetDesign(d.budget);
  const chosen = design.trimmed ? design.ohms : undefined;
  const driven = Object.keys(d.budget.drivers);
  const out: Partial<Record<SupplyCaseName, DecoderDraw>> = { nominal };
  for (const c of cornerConditions(e)) {
    const model = cornerModel(e, c, driven, chosen);
    const sweep = readSweep(d.spec, d.matrix, model, `${c.name} corner`, { deadlineMs });
    if (!sweep.ok) return sweep;
    out[c.name] = drawOf(sweep.value.states, model);
  }
  return ok(out as Record<SupplyCaseName, DecoderDraw>);
}

/** The largest entry of a list and its index (the first of equals). */
function argMax(xs: readonly number[]): { readonly value: number; readonly index: number } {
  let index = 0;
  for (let i = 1; i < xs.length; i++) if ((xs[i] as number) > (xs[index] as number)) index = i;
  return { value: xs[index] ?? 0, index };
}

function sameConditions(draws: readonly DecoderDraw[]): boolean {
  const first = draws[0]?.conditions;
  return draws.every((d) => JSON.stringify(d.conditions) === JSON.stringify(first));
}

/**
 * The worst total of one per-state figure over every combination of the
 * decoders' states (and, for `sum-of-maxima`, of their cases), without
 * enumerating them: per case the sum of each decoder's largest.
 */
export function worstTotal(
  draws: Readonly<Record<SupplyCaseName, readonly DecoderDraw[]>>,
  figure: (d: DecoderDraw) => readonly number[],
  bound: TotalBound,
): WorstTotal {
  const decoders = draws.nominal.length;
  if (bound === "per-case-sum") {
    let best: WorstTotal | undefined;
    for (const c of SUPPLY_CASES) {
      const picks = draws[c].map((d) => argMax(figure(d)));
      const value = picks.reduce((a, p) => a + p.value, 0);
      if (best === undefined || value > best.value) {
        best = { value, cases: picks.map(() => c), states: picks.map((p) => `S${p.index}`), shares: picks.map((p) => p.value) };
      }
    }
    return best as WorstTotal;
  }
  const cases: SupplyCaseName[] = [];
  const states: string[] = [];
  const shares: number[] = [];
  for (let i = 0; i < decoders; i++) {
    let top = { value: -Infinity, index: 0, c: "nominal" as SupplyCaseName };
    for (const c of SUPPLY_CASES) {
      const d = draws[c][i];
      if (!d) continue;
      const p = argMax(figure(d));
      if (p.value > top.value) top = { ...p, c };
    }
    cases.push(top.c);
    states.push(`S${top.index}`);
    shares.push(top.value);
  }
  return { value: shares.reduce((a, x) => a + x, 0), cases, states, shares };
}

/**
 * The instrument's budget from its decoders' budgets.
 *
 * @param deadlineMs `Date.now()` value after which no further corner solve starts
 * @example
 * const ib = instrumentBudget("Wall clock", decoders);
 * if (ib.ok) ib.value.segment.currentA.value; // the worst segment supply current, amperes
 */
export function instrumentBudget(
  title: string,
  decoders: readonly BudgetedDecoder[],
  deadlineMs?: number,
): Result<InstrumentBudget, BudgetFailure & { readonly decoder?: string }> {
  if (decoders.length === 0) throw new RangeError("an instrument has at least one decoder");
  const draws: Record<SupplyCaseName, DecoderDraw[]> = { nominal: [], low: [], high: [] };
  for (const d of decoders) {
    const r = decoderDraws(d, deadlineMs);
    if (!r.ok) return fail({ ...r.error, decoder: d.name });
    for (const c of SUPPLY_CASES) draws[c].push(r.value[c]);
  }
  const bound: TotalBound = SUPPLY_CASES.every((c) => sameConditions(draws[c])) ? "per-case-sum" : "sum-of-maxima";
  const total = (f: (d: DecoderDraw) => readonly number[]): WorstTotal => worstTotal(draws, f, bound);
  const both = (d: DecoderDraw): readonly number[] => d.segmentW.map((w, k) => w + (d.logicW[k] ?? 0));
  const caseSum = (c: SupplyCaseName, f: (d: DecoderDraw) => readonly number[]): number =>
    draws[c].reduce((a, d) => a + argMax(f(d)).value, 0);
  const cases = Object.fromEntries(
    SUPPLY_CASES.map((c) => [
      c,
      {
        segmentA: caseSum(c, (d) => d.segmentA),
        segmentW: caseSum(c, (d) => d.segmentW),
        logicA: caseSum(c, (d) => d.logicA),
        logicW: caseSum(c, (d) => d.logicW),
        totalW: caseSum(c, both),
      },
    ]),
  ) as Record<SupplyCaseName, CaseTotals>;
  return ok({
    schema: INSTRUMENT_BUDGET_SCHEMA,
    title,
    decoders: decoders.map((d) => d.name),
    bound,
    draws,
    segment: { currentA: total((d) => d.segmentA), powerW: total((d) => d.segmentW) },
    logic: { currentA: total((d) => d.logicA), powerW: total((d) => d.logicW) },
    totalPowerW: total(both),
    cases,
    warningCount: decoders.reduce((a, d) => a + d.budget.warnings.length, 0),
  });
}
