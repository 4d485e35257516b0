/**
 * Exact reduction by identical rows, and restriction to a group of outputs.
 *
 * States with the same lit set can be merged into one row that stands for
 * all of them (its `weight`), with no loss: once the buses and links of a
 * depth-2 matrix are fixed, each state's cheapest way to light its outputs
 * depends on its lit set alone, so some minimum matrix gives identical
 * states identical diodes; their single-state padding buses then merge into
 * one bus fed by all of them, which costs no more. A plan of the merged rows
 * expands back (each row into its states) to a matrix of the same cost
 * (`planCost`). The same holds at depth 3, where the merged problem's plans
 * are still valid and no worse, though the exact optimizer claims less
 * there.
 *
 * Restricting to a group (one display position) keeps that group's outputs
 * and the states that light any of them, merged the same way: a tens digit's
 * ten states become one row of weight 10.
 */
import { problemFromLit, type PlanBus, type SharingPlan, type SharingProblem } from "./plan.ts";

export interface Reduction {
  /** The reduced problem. */
  readonly problem: SharingProblem;
  /** Per reduced row, the rows of the original it stands for, ascending. */
  readonly members: readonly (readonly number[])[];
  /** Per reduced output, the output of the original. */
  readonly outputs: readonly number[];
}

/**
 * Merges identical rows of `p`, keeping only `outputs` (all by default) and
 * the rows that light one of them. Rows keep the order of their first state.
 *
 * @example
 * const r = reduceRows(problemFromLit(litRows("10", "10", "01")));
 * r.problem.n; // 2
 * r.problem.weight; // [2, 1]
 */
export function reduceRows(p: SharingProblem, outputs: readonly number[] = p.col.map((_, o) => o)): Reduction {
  const index = new Map<string, number>();
  const members: number[][] = [];
  const lit: boolean[][] = [];
  const weight: number[] = [];
  for (let k = 0; k < p.n; k++) {
    const row = p.lit[k];
    const restricted = outputs.map((o) => row?.[o] === true);
    if (!restricted.some(Boolean)) continue;
    const key = restricted.map((x) => (x ? "1" : "0")).join("");
    const at = index.get(key);
    if (at === undefined) {
      index.set(key, members.length);
      members.push([k]);
      lit.push(restricted);
      weight.push(p.weight[k] ?? 1);
    } else {
      members[at]?.push(k);
      weight[at] = (weight[at] ?? 0) + (p.weight[k] ?? 1);
    }
  }
  const problem = problemFromLit(lit, { weight, group: outputs.map((o) => p.group[o] ?? 0) });
  return { problem, members, outputs: [...outputs] };
}

/**
 * A plan of the reduced problem as a plan of the original: every row becomes
 * the states it stands for, every output the original's.
 */
export function expandPlan(r: Reduction, plan: SharingPlan): SharingPlan {
  const rows = (k: number): readonly number[] => r.members[k] ?? [];
  const out = (o: number): number => r.outputs[o] ?? o;
  const direct: [number, number][] = [];
  for (const [k, o] of plan.direct) for (const s of rows(k)) direct.push([s, out(o)]);
  const buses: PlanBus[] = plan.buses.map((b) => ({
    states: b.states.flatMap(rows).sort((x, y) => x - y),
    outputs: b.outputs.map(out),
  }));
  return { direct, buses, links: plan.links.map((l) => ({ from: out(l.from), to: out(l.to) })) };
}

/** Several plans over disjoint output groups of one problem, as one plan. */
export function unionPlans(plans: readonly SharingPlan[]): SharingPlan {
  return {
    direct: plans.flatMap((x) => x.direct),
    buses: plans.flatMap((x) => x.buses),
    links: plans.flatMap((x) => x.links),
  };
}

/**
 * A plan of the original as a plan of the reduced problem, no dearer once
 * expanded: each merged row takes the cover of its cheapest state (its
 * direct diodes, the buses it feeds, and its own single-state buses, which
 * become the row's bus). Buses no chosen state feeds are dropped.
 */
export function contractPlan(r: Reduction, plan: SharingPlan): SharingPlan {
  const rowOf = new Map<number, number>();
  r.members.forEach((ms, i) => ms.forEach((k) => rowOf.set(k, i)));
  const outOf = new Map(r.outputs.map((o, i) => [o, i]));
  // Per state: its cost under this plan (its own diodes, and the outputs of its private buses).
  const cost = new Map<number, number>();
  const add = (k: number, c: number): void => void cost.set(k, (cost.get(k) ?? 0) + c);
  for (const [k] of plan.direct) add(k, 1);
  for (const b of plan.buses) for (const k of b.states) add(k, b.states.length === 1 ? 1 + b.outputs.length : 1);
  const chosen = r.members.map((ms) => {
    let best = ms[0] ?? 0;
    for (const k of ms) if ((cost.get(k) ?? 0) < (cost.get(best) ?? 0)) best = k;
    return best;
  });
  const pick = new Set(chosen);
  const mapOut = (o: number): number | undefined => outOf.get(o);
  const direct: [number, number][] = [];
  for (const [k, o] of plan.direct) {
    const j = mapOut(o);
    if (pick.has(k) && j !== undefined) direct.push([rowOf.get(k) ?? 0, j]);
  }
  const buses: PlanBus[] = [];
  for (const b of plan.buses) {
    const states = b.states.filter((k) => pick.has(k)).map((k) => rowOf.get(k) ?? 0);
    const outputs = b.outputs.flatMap((o) => {
      const j = mapOut(o);
      return j === undefined ? [] : [j];
    });
    if (states.length > 0 && outputs.length > 0) buses.push({ states: states.sort((x, y) => x - y), outputs });
  }
  const links = plan.links.flatMap((l) => {
    const from = mapOut(l.from);
    const to = mapOut(l.to);
    return from === undefined || to === undefined ? [] : [{ from, to }];
  });
  return { direct, buses, links };
}
