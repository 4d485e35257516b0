/**
 * Lower bounds on the diode count that hold for every matrix, whatever its
 * depth and structure.
 *
 * Every driven output needs a diode into it and every state that lights
 * something needs a diode out of it, so the count is at least the larger of
 * the two numbers. It is weak, but it is the bound that stays honest where
 * the exact model does not cover every structure (depth 3, or a candidate
 * family cut short for size); the MILP's dual bound is used everywhere else.
 */
import type { SharingProblem, SharingRules } from "./plan.ts";
import { linkPairs, statesLighting } from "./rules.ts";

/** max(driven outputs, states that light something). */
export function trivialLowerBound(p: SharingProblem): number {
  const outputs = p.col.filter((c) => c.length > 0).length;
  const states = p.row.filter((r) => r.length > 0).length;
  return Math.max(outputs, states);
}

/** The part of a HiGHS model the LP bound uses. */
export interface LpModelLike {
  readonly options: { set(values: Readonly<Record<string, number | boolean | string>>): unknown };
  run(): unknown;
  getModelStatus(): number;
  getSolution(): { readonly colValue: Float64Array; readonly rowDual: Float64Array };
  addCol(cost: number, lower: number, upper: number, entries: { readonly indices: Int32Array; readonly values: Float64Array }): unknown;
  dispose(): void;
}

export interface LpBoundOptions {
  /** Solves one LP-format text (a fresh model each call). */
  readonly solveLp: (text: string) => LpModelLike;
  /** Safety net only: a `Date.now()` value past which no round starts (and the LP solver stops); `maxWork` is meant to stop it first. */
  readonly deadlineMs: number;
  /**
   * Most LP work, the deterministic stop: the sum over rounds of the
   * model's nonzeros when it is solved (the LP time tracks it; the pricing
   * search takes little beside it). Unlimited by default.
   */
  readonly maxWork?: number;
  /** Most output sets the pricing search visits per round. */
  readonly maxVisits?: number;
}

/** What `lpLowerBound` found. */
export interface LpBound {
  /** The bound, or null when the pricing could not visit every output set. */
  readonly bound: number | null;
  /** Bus output sets the pricing found worth adding, the most used first. */
  readonly shapes: readonly (readonly number[])[];
  /** True when the clock, not the work budget, ended it. */
  readonly deadlineHit: boolean;
  /** LP work done (see `LpBoundOptions.maxWork`), for the bench and for calibrating budgets. */
  readonly work: number;
}

/**
 * Lower bound from the LP relaxation of a relaxed problem, by column
 * generation; valid at depth limit 2 under every policy.
 *
 * The relaxed problem covers every lit cell by direct diodes (cost 1), links
 * (cost 1, where every state lighting the source lights the target; left out
 * under the uniform policy, which has none) and buses S x T (cost |S|+|T|),
 * with no depth policy at all, so any depth-2 matrix is a solution of it. Bus
 * columns are priced out over every output set T by depth-first search
 * (Kovacs, Gunluk and Hauser, "Binary Matrix Factorisation via Column
 * Generation", use the same pricing idea for the same kind of cover).
 *
 * The bound does not trust the LP solver: it takes the row duals as they
 * come, and divides their sum by the largest ratio (dual sum over cost) of any
 * column, found by the same exhaustive search. That makes them a feasible
 * dual solution, so the result is a valid bound even if the solver stops
 * early. The bound is null when the search could not visit every output
 * set; `shapes` are the bus output sets the pricing found worth adding, a
 * good small candidate family for the MILP.
 */
export function lpLowerBound(p: SharingProblem, rules: Pick<SharingRules, "policy" | "links" | "buses">, opts: LpBoundOptions): LpBound {
  const m = p.m;
  let deadlineHit = false;
  const cellRow = new Int32Array(p.n * m).fill(-1);
  let rows = 0;
  for (let k = 0; k < p.n; k++) for (const o of p.row[k] ?? []) cellRow[k * m + o] = rows++;
  if (rows === 0) return { bound: 0, shapes: [], deadlineHit, work: 0 };
  const links: [number, number][] = linkPairs(p, rules).map((l) => [l.from, l.to]);
  const patterns: { s: number[]; t: number[] }[] = [];
  const seen = new Set<string>();
  const maxVisits = opts.maxVisits ?? 3_000_000;
  let best: number | null = null;
  let work = 0;
  let nonzeros = rows + links.reduce((a, [l]) => a + (p.col[l]?.length ?? 0), 0);
  let lastUsed: Float64Array = new Float64Array(0);

  // One LP model for all rounds: new bus columns are appended, so the
  // simplex restarts from the last basis.
  let lp: LpModelLike | undefined;
  let firstPattern = 0;
  let inModel = 0;
  const solve = (): { pi: Float64Array; patternValue: Float64Array } | null => {
    try {
      if (!lp) {
        lp = opts.solveLp(relaxedText(p, cellRow, rows, links));
        // HiGHS counts time over all runs of one model, so one limit for all rounds: the deadline.
        lp.options.set({
          output_flag: false,
          solver: "ipm",
          run_crossover: "off",
          time_limit: Math.max(0.05, (opts.deadlineMs - Date.now()) / 1000),
        });
        firstPattern = rows + links.length;
      }
      for (; inModel < patterns.length; inModel++) {
        const pt = patterns[inModel] as { s: number[]; t: number[] };
        const idx: number[] = [];
        for (const k of pt.s) for (const o of pt.t) idx.push(cellRow[k * m + o] ?? 0);
        idx.sort((a, b) => a - b);
        lp.addCol(pt.s.length + pt.t.length, 0, 1e30, { indices: Int32Array.from(idx), values: new Float64Array(idx.length).fill(1) });
      }
      lp.run();
      if (lp.getModelStatus() === LP_TIME_LIMIT) deadlineHit = true;
      const sol = lp.getSolution();
      if (sol.rowDual.length !== rows) return null;
      return { pi: Float64Array.from(sol.rowDual, (x) => Math.abs(x)), patternValue: sol.colValue.slice(firstPattern) };
    } catch {
      return null;
    }
  };

  for (let round = 0; round < 500; round++) {
    if (Date.now() > opts.deadlineMs) {
      deadlineHit = true;
      break;
    }
    for (let i = inModel; i < patterns.length; i++) nonzeros += (patterns[i]?.s.length ?? 0) * (patterns[i]?.t.length ?? 0);
    // The first round always runs: without it there is no bound at all.
    if (round > 0 && work + nonzeros > (opts.maxWork ?? Infinity)) break;
    work += nonzeros;
    const solved = solve();
    if (solved === null) break;
    const pi = solved.pi;
    lastUsed = solved.patternValue;
    // Largest dual-sum-to-cost ratio over every column, and new columns to add.
    let theta = 0;
    for (let r = 0; r < rows; r++) theta = Math.max(theta, pi[r] ?? 0);
    for (const [a, b] of links) {
      let s = 0;
      for (const k of p.col[a] ?? []) s += pi[cellRow[k * m + b] ?? 0] ?? 0;
      theta = Math.max(theta, s);
    }
    const fresh: { s: number[]; t: number[]; rc: number }[] = [];
    let visits = 0;
    let complete = true;
    if (rules.buses) {
      const v = new Float64Array(p.n);
      const visit = (t: number[], sm: number[], next: number): void => {
        for (let o = next; o < m; o++) {
          if (++visits > maxVisits) {
            complete = false;
            return;
          }
          const s2 = statesLighting(p, sm, o);
          if (s2.length < 2) continue;
          const t2 = [...t, o];
          if (t2.length >= 2) {
            const vals = s2.map((k) => {
              let x = 0;
              for (const q of t2) x += pi[cellRow[k * m + q] ?? 0] ?? 0;
              v[k] = x;
              return x;
            });
            // Best ratio for this T: the states with the largest dual sums, a prefix after sorting.
            vals.sort((x, y) => y - x);
            let sum = 0;
            for (let i = 0; i < vals.length; i++) {
              sum += vals[i] ?? 0;
              theta = Math.max(theta, sum / (i + 1 + t2.length));
            }
            let rc = t2.length;
            const chosen: number[] = [];
            for (const k of s2) {
              if ((v[k] ?? 0) > 1 + 1e-9) {
                rc += 1 - (v[k] ?? 0);
                chosen.push(k);
              }
            }
            if (rc < -1e-7 && chosen.length > 0) fresh.push({ s: chosen, t: t2, rc });
          }
          visit(t2, s2, o + 1);
          if (!complete) return;
        }
      };
      visit(
        [],
        Array.from({ length: p.n }, (_, k) => k),
        0,
      );
    }
    if (!complete) break;
    let dualSum = 0;
    for (let r = 0; r < rows; r++) dualSum += pi[r] ?? 0;
    const bound = dualSum / Math.max(1, theta);
    best = best === null ? bound : Math.max(best, bound);
    if (fresh.length === 0) break;
    fresh.sort((a, b) => a.rc - b.rc);
    let added = 0;
    for (const f of fresh) {
      const key = `${f.s.join(",")}|${f.t.join(",")}`;
      if (seen.has(key)) continue;
      seen.add(key);
      patterns.push({ s: f.s, t: f.t });
      if (++added >= 500) break;
    }
    if (added === 0) break;
  }
  try {
    lp?.dispose();
  } catch {
    // nothing to free after an abort
  }
  // Shapes the last LP used, then the rest in order of generation, at most 400.
  const order = patterns.map((_, i) => i).sort((a, b) => (lastUsed[b] ?? 0) - (lastUsed[a] ?? 0) || a - b);
  const keys = [...new Set(order.map((i) => (patterns[i]?.t ?? []).join(",")))].slice(0, 400);
  const shapes = keys.map((key) => key.split(",").map(Number));
  return { bound: best === null ? null : Math.ceil(best - 1e-6), shapes, deadlineHit, work };
}

/** HiGHS model status: its time limit (here the deadline) stopped it. */
const LP_TIME_LIMIT = 13;

/** The relaxed LP with direct and link columns only (bus columns are added as they are priced). */
function relaxedText(p: SharingProblem, cellRow: Int32Array, rows: number, links: readonly [number, number][]): string {
  const m = p.m;
  const terms: string[][] = Array.from({ length: rows }, () => []);
  const obj: string[] = [];
  let c = 0;
  for (let k = 0; k < p.n; k++) {
    for (const o of p.row[k] ?? []) {
      obj.push(`+ z${c}`);
      terms[cellRow[k * m + o] ?? 0]?.push(`+ z${c}`);
      c++;
    }
  }
  for (const [a, b] of links) {
    obj.push(`+ z${c}`);
    for (const k of p.col[a] ?? []) terms[cellRow[k * m + b] ?? 0]?.push(`+ z${c}`);
    c++;
  }
  const lines = ["Minimize", ` obj: ${joinLines(obj)}`, "Subject To"];
  terms.forEach((t, r) => lines.push(` r${r}: ${joinLines(t)} >= 1`));
  lines.push("End", "");
  return lines.join("\n");
}

function joinLines(terms: readonly string[]): string {
  const out: string[] = [];
  for (let i = 0; i < terms.length; i += 12) out.push(terms.slice(i, i + 12).join(" "));
  return out.join("\n   ").replace(/^\+ /, "");
}
