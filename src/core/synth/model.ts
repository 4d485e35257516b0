/**
 * The MILP model of the minimum matrix, written as CPLEX LP-format text for
 * HiGHS.
 *
 * Variables (all binary):
 * - `d_k_o` direct diode state k -> output o, one per lit cell;
 * - `y_i` bus candidate i used (it drives every output of its T), `x_i_k`
 *   state k feeds it;
 * - `q_k` state k feeds its own padding bus, `p_k_o` that bus drives o
 *   (under the mixed policy only for a row that stands for two or more
 *   states: a single-state bus is never better than direct diodes);
 * - `l_a_b` link output a -> output b, only where every state lighting a
 *   lights b;
 * - levels: per-segment `v_o_L` (output o sits at level L, exactly one);
 *   mixed `g_o_L` (some path into o has at least L diodes). Under the
 *   uniform policy the model has no direct diodes and no links: it is the
 *   all-bus matrix, which the caller weighs against the all-direct one.
 *
 * A row that stands for w identical states (see reduce.ts) costs w for each
 * direct diode and bus input (`d`, `x`, `q`); bus outputs, padding-bus
 * outputs and links cost 1.
 *
 * Every lit cell must be covered by a direct diode, a bus, a padding bus or a
 * link; structures never reach an unlit cell by construction, so the matrix
 * is exact. The objective counts diodes and nothing else: with whole-number
 * costs HiGHS rounds its bound up and prunes far more (measured on the bench:
 * 0-9 uniform 2.4 s instead of 7.6 s, and a better bound on 0-F), so ties
 * are broken after the solve (see tieBreak.ts).
 */
import type { CandidateFamily } from "./candidates.ts";
import type { PlanBus, SharingPlan, SharingProblem, SharingRules } from "./plan.ts";
import { linkPairs as allowedLinks, statesToPay } from "./rules.ts";
import type { MilpModel } from "./highsRun.ts";
import { lpNameLines, lpSum } from "./lpText.ts";

/** The sharing MILP: its columns decode to a plan. */
export type SharingModel = MilpModel<SharingPlan>;

/**
 * A choice between columns, for the decode polarity (see polarityProblem.ts):
 * of each pair exactly one column is covered, a binary `z_j` (1: the second)
 * choosing which, at `secondCost` when it takes the second. No structure may
 * touch the column not chosen.
 */
export interface ModelChoice {
  readonly pairs: readonly (readonly [number, number])[];
  readonly secondCost: number;
}

/** The name of pair j's choice variable (1: its second column is covered). */
export function choiceName(j: number): string {
  return `z_${j}`;
}

/** Builds the model; `rules.depthLimit` must be 2 or 3 (depth 1 needs no model). */
export function buildSharingModel(p: SharingProblem, rules: SharingRules, family: CandidateFamily, choice?: ModelChoice): SharingModel {
  const L = Math.min(3, rules.depthLimit);
  const mixed = rules.policy === "mixed";
  const uniform = rules.policy === "uniform";
  // Padding buses: under per-segment and uniform for every row; under mixed only for a merged row
  // (weight 2 or more, see reduce.ts), the one case where a single-row bus can beat direct diodes.
  const weight = (k: number): number => p.weight[k] ?? 1;
  const padRow = (k: number): boolean => rules.buses && (!mixed || weight(k) >= 2) && (p.row[k] ?? []).length > 0;
  const pads = p.row.some((_, k) => padRow(k));
  const buses = rules.buses ? family.buses : [];
  const linkPairs = allowedLinks(p, rules);

  const obj: string[] = [];
  const rows: string[] = [];
  const binaries: string[] = [];
  const bin = (name: string, cost: number): string => {
    binaries.push(name);
    if (cost !== 0) obj.push(`${fmt(cost)} ${name}`);
    return name;
  };
  const row = (terms: string[], sense: string, rhs: number): void => {
    rows.push(`${lpSum(terms)} ${sense} ${rhs}`);
  };

  // Cover terms per lit cell.
  const cover = new Map<number, string[]>();
  const cell = (k: number, o: number): string[] => {
    const key = k * p.m + o;
    let t = cover.get(key);
    if (!t) cover.set(key, (t = []));
    return t;
  };
  const dName = (k: number, o: number): string => `d_${k}_${o}`;
  // Uniform: the model covers everything through buses; the caller compares it with the direct matrix.
  // A row standing for w states pays w for each direct diode and bus input.
  if (!uniform) for (let k = 0; k < p.n; k++) for (const o of p.row[k] ?? []) cell(k, o).push(bin(dName(k, o), weight(k)));
  buses.forEach((b, i) => {
    const y = bin(`y_${i}`, b.outputs.length);
    const xs: string[] = [];
    for (const k of b.states) {
      const x = bin(`x_${i}_${k}`, weight(k));
      xs.push(weight(k) === 1 ? x : `${weight(k)} ${x}`);
      row([x, `- ${y}`], "<=", 0);
      for (const o of b.outputs) cell(k, o).push(x);
    }
    // Mixed: a bus must beat the direct diodes it replaces (see busPays in rules.ts).
    if (mixed) row([...xs, `- ${statesToPay(b.outputs.length)} ${y}`], ">=", 0);
  });
  if (pads) {
    for (let k = 0; k < p.n; k++) {
      const r = p.row[k] ?? [];
      if (!padRow(k)) continue;
      const q = bin(`q_${k}`, weight(k));
      for (const o of r) {
        const pv = bin(`p_${k}_${o}`, 1);
        row([pv, `- ${q}`], "<=", 0);
        cell(k, o).push(pv);
      }
    }
  }
  for (const l of linkPairs) {
    const name = bin(`l_${l.from}_${l.to}`, 1);
    for (const k of p.col[l.from] ?? []) cell(k, l.to).push(name);
  }
  // Without a choice every cell is covered; with one, a cell of column c only when c is chosen.
  const chooser = new Map<number, { z: string; second: boolean }>();
  choice?.pairs.forEach(([a, b], j) => {
    const z = bin(choiceName(j), choice.secondCost);
    chooser.set(a, { z, second: false });
    chooser.set(b, { z, second: true });
  });
  for (const [key, terms] of [...cover.entries()].sort((a, b) => a[0] - b[0])) {
    const c = chooser.get(key % p.m);
    if (c === undefined) row(terms, ">=", 1);
    else if (c.second) row([...terms, `- ${c.z}`], ">=", 0);
    else row([...terms, c.z], ">=", 1);
  }
  // A structure touching a column only while that column is chosen.
  const only = (name: string, col: number): void => {
    const c = chooser.get(col);
    if (c === undefined) return;
    if (c.second) row([name, `- ${c.z}`], "<=", 0);
    else row([name, c.z], "<=", 1);
  };
  if (chooser.size > 0) {
    if (!uniform) for (let k = 0; k < p.n; k++) for (const o of p.row[k] ?? []) only(dName(k, o), o);
    buses.forEach((b, i) => b.outputs.forEach((o) => only(`y_${i}`, o)));
    if (pads) for (let k = 0; k < p.n; k++) if (padRow(k)) for (const o of p.row[k] ?? []) only(`p_${k}_${o}`, o);
    for (const l of linkPairs) {
      only(`l_${l.from}_${l.to}`, l.from);
      only(`l_${l.from}_${l.to}`, l.to);
    }
  }

  // Depth policy.
  if (uniform) {
    // Nothing to add: without direct diodes or links every path has two diodes.
  } else if (mixed) {
    const g = (o: number, l: number): string => `g_${o}_${l}`;
    for (let o = 0; o < p.m; o++) {
      for (let l = 2; l <= L; l++) bin(g(o, l), 0);
      for (let l = 3; l <= L; l++) row([g(o, l), `- ${g(o, l - 1)}`], "<=", 0);
    }
    buses.forEach((b, i) => {
      for (const o of b.outputs) row([`y_${i}`, `- ${g(o, 2)}`], "<=", 0);
    });
    for (let k = 0; k < p.n; k++) if (padRow(k)) for (const o of p.row[k] ?? []) row([`p_${k}_${o}`, `- ${g(o, 2)}`], "<=", 0);
    for (const lk of linkPairs) {
      const ln = `l_${lk.from}_${lk.to}`;
      row([ln, `- ${g(lk.to, 2)}`], "<=", 0);
      for (let l = 2; l < L; l++) row([ln, `+ ${g(lk.from, l)}`, `- ${g(lk.to, l + 1)}`], "<=", 1);
      row([ln, `+ ${g(lk.from, L)}`], "<=", 1);
    }
  } else {
    const v = (o: number, l: number): string => `v_${o}_${l}`;
    for (let o = 0; o < p.m; o++) {
      const vs: string[] = [];
      for (let l = 1; l <= L; l++) vs.push(bin(v(o, l), 0));
      row(vs, "=", 1);
    }
    for (let k = 0; k < p.n; k++) for (const o of p.row[k] ?? []) row([dName(k, o), `- ${v(o, 1)}`], "<=", 0);
    buses.forEach((b, i) => {
      for (const o of b.outputs) row([`y_${i}`, `- ${v(o, 2)}`], "<=", 0);
    });
    for (let k = 0; k < p.n; k++) if (padRow(k)) for (const o of p.row[k] ?? []) row([`p_${k}_${o}`, `- ${v(o, 2)}`], "<=", 0);
    for (const lk of linkPairs) {
      const ln = `l_${lk.from}_${lk.to}`;
      for (let l = 1; l < L; l++) row([ln, `+ ${v(lk.from, l)}`, `- ${v(lk.to, l + 1)}`], "<=", 1);
      row([ln, `+ ${v(lk.from, L)}`], "<=", 1);
    }
  }

  const text = [
    "Minimize",
    ` obj: ${lpSum(obj)}`,
    "Subject To",
    ...rows.map((r, i) => ` c${i}: ${r}`),
    "Binary",
    ...lpNameLines(binaries),
    "End",
    "",
  ].join("\n");

  const busIndex = new Map(buses.map((b, i) => [b.outputs.join(","), i]));
  return {
    text,
    columns: binaries,
    rows: rows.length,
    decode(value) {
      const on = (name: string): boolean => value(name) > 0.5;
      const direct: [number, number][] = [];
      for (let k = 0; k < p.n; k++) for (const o of p.row[k] ?? []) if (on(dName(k, o))) direct.push([k, o]);
      const planBuses: PlanBus[] = [];
      buses.forEach((b, i) => {
        if (!on(`y_${i}`)) return;
        const states = b.states.filter((k) => on(`x_${i}_${k}`));
        if (states.length > 0) planBuses.push({ states, outputs: b.outputs });
      });
      if (pads) {
        for (let k = 0; k < p.n; k++) {
          if (!padRow(k) || !on(`q_${k}`)) continue;
          const outs = (p.row[k] ?? []).filter((o) => on(`p_${k}_${o}`));
          if (outs.length > 0) planBuses.push({ states: [k], outputs: outs });
        }
      }
      const links = linkPairs.filter((l) => on(`l_${l.from}_${l.to}`));
      return { direct, buses: planBuses, links };
    },
    warmStart(plan) {
      const vals = new Map<string, number>(binaries.map((b) => [b, 0]));
      for (const [k, o] of plan.direct) vals.set(dName(k, o), 1);
      for (const b of plan.buses) {
        const i = busIndex.get(b.outputs.join(","));
        if (i !== undefined && rules.buses) {
          vals.set(`y_${i}`, 1);
          for (const k of b.states) vals.set(`x_${i}_${k}`, 1);
        } else if (b.states.length === 1 && padRow(b.states[0] as number)) {
          const k = b.states[0] as number;
          vals.set(`q_${k}`, 1);
          for (const o of b.outputs) vals.set(`p_${k}_${o}`, 1);
        } else return null;
      }
      for (const l of plan.links) vals.set(`l_${l.from}_${l.to}`, 1);
      // The choice follows from the columns the plan reaches.
      if (choice) {
        const reached = new Set<number>([
          ...plan.direct.map(([, o]) => o),
          ...plan.buses.flatMap((b) => b.outputs),
          ...plan.links.flatMap((l) => [l.from, l.to]),
        ]);
        choice.pairs.forEach(([, b], j) => vals.set(choiceName(j), reached.has(b) ? 1 : 0));
      }
      // Levels follow from the structures.
      const level = levelsOf(p, plan);
      if (uniform) {
        if (plan.direct.length > 0) return null;
      } else if (mixed) {
        for (let o = 0; o < p.m; o++) for (let l = 2; l <= L; l++) vals.set(`g_${o}_${l}`, (level[o] ?? 1) >= l ? 1 : 0);
      } else {
        for (let o = 0; o < p.m; o++) for (let l = 1; l <= L; l++) vals.set(`v_${o}_${l}`, (level[o] ?? 1) === l ? 1 : 0);
      }
      const known = new Set(binaries);
      for (const k of vals.keys()) if (!known.has(k)) return null;
      return vals;
    },
  };
}

/** Longest path into each output of a plan (1 when only direct diodes feed it). */
function levelsOf(p: SharingProblem, plan: SharingPlan): number[] {
  const level = Array(p.m).fill(1) as number[];
  for (const b of plan.buses) for (const o of b.outputs) level[o] = Math.max(level[o] ?? 1, 2);
  // Links can chain; relax until stable (at most m rounds, the graph is acyclic).
  for (let round = 0; round < p.m; round++) {
    let changed = false;
    for (const l of plan.links) {
      const want = (level[l.from] ?? 1) + 1;
      if (want > (level[l.to] ?? 1)) {
        level[l.to] = want;
        changed = true;
      }
    }
    if (!changed) break;
  }
  return level;
}

function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toPrecision(12);
}
