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
import { WorkMeter } from "./workMeter.ts";

/** max(driven outputs, states that light something); a merged row counts for its states. */
export function trivialLowerBound(p: SharingProblem): number {
  const outputs = p.col.filter((c) => c.length > 0).length;
  const states = p.row.reduce((a, r, k) => a + (r.length > 0 ? (p.weight[k] ?? 1) : 0), 0);
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
   * model's nonzeros when it is solved, plus the states the pricing search
   * looks at. Unlimited by default. A round that would overrun it does not
   * start; a pricing search that overruns it ends the bound at the last
   * complete round.
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
 * The relaxed problem covers every lit cell by direct diodes (cost 1, or w
 * for a row standing for w states), links (cost 1, where every state
 * lighting the source lights the target; left out under the uniform policy,
 * which has none) and buses S x T (cost |S|+|T|, each row counted w times),
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
  const meter = new WorkMeter(opts.maxWork ?? Infinity, opts.deadlineMs);
  const w = (k: number): number => p.weight[k] ?? 1;
  let deadlineHit = false;
  const cellRow = new Int32Array(p.n * m).fill(-1);
  const cellWeight: number[] = [];
  let rows = 0;
  for (let k = 0; k < p.n; k++) {
    for (const o of p.row[k] ?? []) {
      cellRow[k * m + o] = rows++;
      cellWeight.push(w(k));
    }
  }
  if (rows === 0) return { bound: 0, shapes: [], deadlineHit, work: 0 };
  const links: [number, number][] = linkPairs(p, rules).map((l) => [l.from, l.to]);
  const patterns: { s: number[]; t: number[] }[] = [];
  const seen = new Set<string>();
  const maxVisits = opts.maxVisits ?? 3_000_000;
  let best: number | null = null;
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
        const cost = pt.t.length + pt.s.reduce((a, k) => a + w(k), 0);
        lp.addCol(cost, 0, 1e30, { indices: Int32Array.from(idx), values: new Float64Array(idx.length).fill(1) });
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
    if (meter.checkClock()) break;
    for (let i = inModel; i < patterns.length; i++) nonzeros += (patterns[i]?.s.length ?? 0) * (patterns[i]?.t.length ?? 0);
    // A round the budget cannot pay for does not start.
    if (meter.work + nonzeros > meter.maxWork) break;
    meter.charge(nonzeros);
    const solved = solve();
    if (solved === null) break;
    const pi = solved.pi;
    lastUsed = solved.patternValue;
    // Largest dual-sum-to-cost ratio over every column, and new columns to add.
    let theta = 0;
    for (let r = 0; r < rows; r++) theta = Math.max(theta, (pi[r] ?? 0) / (cellWeight[r] ?? 1));
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
      // By state sets of two or more rows: for a fixed S the best outputs are those inside
      // every row of S, by the sum u_o of their duals over S (a prefix for the ratio, u_o > 1
      // for the reduced cost).
      const u = new Float64Array(m);
      const priceByStates = (): void => {
        const grow = (sm: number[], common: number[], weightS: number, next: number): void => {
          for (let k = next; k < p.n && complete; k++) {
            if (++visits > maxVisits || meter.charge(common.length + 1)) {
              complete = false;
              return;
            }
            const lk = p.lit[k];
            const c2 = common.filter((o) => lk?.[o] === true);
            if (c2.length === 0) continue;
            const s2 = [...sm, k];
            const w2 = weightS + w(k);
            if (s2.length >= 2) {
              for (const o of c2) {
                let x = 0;
                for (const q of s2) x += pi[cellRow[q * m + o] ?? 0] ?? 0;
                u[o] = x;
              }
              meter.charge(c2.length * s2.length);
              const byDual = [...c2].sort((a, b) => (u[b] ?? 0) - (u[a] ?? 0) || a - b);
              let sum = 0;
              byDual.forEach((o, i) => {
                sum += u[o] ?? 0;
                theta = Math.max(theta, sum / (w2 + i + 1));
              });
              const t = c2.filter((o) => (u[o] ?? 0) > 1 + 1e-9);
              const rc = w2 + t.reduce((a, o) => a + 1 - (u[o] ?? 0), 0);
              if (t.length > 0 && rc < -1e-7 && !seen.has(`${s2.join(",")}|${t.join(",")}`)) {
                fresh.push({ s: s2, t, rc });
                if (fresh.length >= 4000) {
                  fresh.sort((a, b) => a.rc - b.rc);
                  fresh.length = 500;
                }
              }
            }
            grow(s2, c2, w2, k + 1);
          }
        };
        grow(
          [],
          Array.from({ length: m }, (_, o) => o),
          0,
          0,
        );
      };
      const visit = (t: number[], sm: number[], next: number): void => {
        for (let o = next; o < m; o++) {
          if (++visits > maxVisits || meter.charge(sm.length + 1)) {
            complete = false;
            return;
          }
          const s2 = statesLighting(p, sm, o);
          // Buses of one row are priced below, row by row.
          if (s2.length < 2) continue;
          const t2 = [...t, o];
          if (t2.length >= 2) {
            for (const k of s2) {
              let x = 0;
              for (const q of t2) x += pi[cellRow[k * m + q] ?? 0] ?? 0;
              v[k] = x;
            }
            meter.charge(s2.length * t2.length);
            // Best ratio for this T: the rows with the largest dual sum per state, a prefix after sorting.
            const byRatio = [...s2].sort((x, y) => (v[y] ?? 0) / w(y) - (v[x] ?? 0) / w(x) || x - y);
            let sum = 0;
            let cost = t2.length;
            for (const k of byRatio) {
              sum += v[k] ?? 0;
              cost += w(k);
              theta = Math.max(theta, sum / cost);
            }
            let rc = t2.length;
            const chosen: number[] = [];
            for (const k of s2) {
              if ((v[k] ?? 0) > w(k) + 1e-9) {
                rc += w(k) - (v[k] ?? 0);
                chosen.push(k);
              }
            }
            if (rc < -1e-7 && chosen.length > 0 && !seen.has(`${chosen.join(",")}|${t2.join(",")}`)) {
              fresh.push({ s: chosen, t: t2, rc });
              // Only the 500 best are added a round: keep the list short as it grows.
              if (fresh.length >= 4000) {
                fresh.sort((a, b) => a.rc - b.rc);
                fresh.length = 500;
              }
            }
          }
          visit(t2, s2, o + 1);
          if (!complete) return;
        }
      };
      // Enumerate the smaller side: output sets T (each with its best states), or state sets S
      // (each with its best outputs); either way every bus column is looked at.
      if (p.n < m) priceByStates();
      else
        visit(
          [],
          Array.from({ length: p.n }, (_, k) => k),
          0,
        );
      // A bus of one row standing for w states (see reduce.ts): over T inside its row, the best
      // ratio takes the outputs with the largest duals, and the best reduced cost those above 1.
      for (let k = 0; k < p.n && complete; k++) {
        const wk = w(k);
        const row = p.row[k] ?? [];
        if (wk < 2 || row.length < 2) continue;
        if (meter.charge(row.length)) {
          complete = false;
          break;
        }
        const duals = row.map((o) => pi[cellRow[k * m + o] ?? 0] ?? 0).sort((x, y) => y - x);
        let sum = 0;
        duals.forEach((d, i) => {
          sum += d;
          theta = Math.max(theta, sum / (wk + i + 1));
        });
        const t = row.filter((o) => (pi[cellRow[k * m + o] ?? 0] ?? 0) > 1 + 1e-9);
        const rc = wk + t.reduce((a, o) => a + 1 - (pi[cellRow[k * m + o] ?? 0] ?? 0), 0);
        if (t.length > 0 && rc < -1e-7 && !seen.has(`${k}|${t.join(",")}`)) fresh.push({ s: [k], t, rc });
      }
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
  deadlineHit ||= meter.deadlineHit;
  try {
    lp?.dispose();
  } catch {
    // nothing to free after an abort
  }
  // Shapes the last LP used, then the rest in order of generation, at most 400.
  const order = patterns.map((_, i) => i).sort((a, b) => (lastUsed[b] ?? 0) - (lastUsed[a] ?? 0) || a - b);
  const keys = [...new Set(order.map((i) => (patterns[i]?.t ?? []).join(",")))].slice(0, 400);
  const shapes = keys.map((key) => key.split(",").map(Number));
  return { bound: best === null ? null : Math.ceil(best - 1e-6), shapes, deadlineHit, work: meter.work };
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
    const w = p.weight[k] ?? 1;
    for (const o of p.row[k] ?? []) {
      obj.push(w === 1 ? `+ z${c}` : `+ ${w} z${c}`);
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
