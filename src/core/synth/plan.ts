/**
 * The sharing problem and its plans, in index form, shared by the heuristic
 * and the exact optimizer.
 *
 * A plan is the matrix before naming: direct diodes (state -> output), bus
 * nodes (a state set in, an output set out) and segment links (output ->
 * output). `planEdges` turns it into the bare edges `buildMatrix` takes.
 *
 * Which structures are exact and which a depth policy allows are the rules
 * of rules.ts; the order among plans is tieBreak.ts's.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { Edge } from "../matrix/matrix.ts";
import type { DepthPolicy } from "../project/project.ts";

/** The lit matrix in index form. */
export interface SharingProblem {
  /** Number of states (rows). */
  readonly n: number;
  /** Number of driven outputs (columns). */
  readonly m: number;
  /** `lit[k][o]`. */
  readonly lit: readonly (readonly boolean[])[];
  /** Per output, the states that light it, ascending. */
  readonly col: readonly (readonly number[])[];
  /** Per state, the outputs it lights, ascending. */
  readonly row: readonly (readonly number[])[];
  /** `within[a][b]`: every state lighting output a lights output b (a != b). */
  readonly within: readonly (readonly boolean[])[];
  /**
   * Per row, the number of states it stands for: 1, or in a reduced problem
   * (see reduce.ts) the number of identical states merged into it. A direct
   * diode or a bus input at row k costs `weight[k]` diodes; a bus output or
   * a link costs 1.
   */
  readonly weight: readonly number[];
  /** Per output, its group (the display position, 0-based); outputs of one group share a digit. */
  readonly group: readonly number[];
}

export interface PlanBus {
  /** States feeding the bus, ascending. */
  readonly states: readonly number[];
  /** Outputs the bus drives, ascending. */
  readonly outputs: readonly number[];
}

export interface PlanLink {
  readonly from: number;
  readonly to: number;
}

export interface SharingPlan {
  /** Direct diodes as `[state, output]`. */
  readonly direct: readonly (readonly [number, number])[];
  readonly buses: readonly PlanBus[];
  readonly links: readonly PlanLink[];
}

/** What the limits allow, filled out once. */
export interface SharingRules {
  readonly depthLimit: number;
  readonly policy: DepthPolicy;
  readonly buses: boolean;
  readonly links: boolean;
}

/** Builds the index form of a decode spec; outputs are grouped by display position. */
export function sharingProblem(spec: DecodeSpec): SharingProblem {
  const perPosition = Math.max(1, spec.cell.segments.length);
  const position = new Map(spec.allOutputs.map((name, i) => [name, Math.floor(i / perPosition)]));
  return problemFromLit(spec.lit, {
    group: spec.outputs.map((name) => position.get(name) ?? 0),
  });
}

/**
 * Builds the index form of a bare lit matrix (rows = states). By default
 * every row stands for one state and every output is in group 0.
 */
export function problemFromLit(
  lit: readonly (readonly boolean[])[],
  extra: { readonly weight?: readonly number[]; readonly group?: readonly number[] } = {},
): SharingProblem {
  const n = lit.length;
  const m = lit[0]?.length ?? 0;
  const col: number[][] = Array.from({ length: m }, () => []);
  const row: number[][] = [];
  for (let k = 0; k < n; k++) {
    const r: number[] = [];
    for (let o = 0; o < m; o++) {
      if (lit[k]?.[o]) {
        r.push(o);
        col[o]?.push(k);
      }
    }
    row.push(r);
  }
  const within = col.map((ca, a) => col.map((_, b) => a !== b && ca.length > 0 && ca.every((k) => lit[k]?.[b] === true)));
  const weight = extra.weight ?? Array<number>(n).fill(1);
  const group = extra.group ?? Array<number>(m).fill(0);
  return { n, m, lit, col, row, within, weight, group };
}

/** Number of diodes a plan places (every row standing for one state). */
export function planCount(plan: SharingPlan): number {
  let c = plan.direct.length + plan.links.length;
  for (const b of plan.buses) c += b.states.length + b.outputs.length;
  return c;
}

/** Number of diodes a plan of `p` places once its rows are expanded into their states (see `SharingProblem.weight`). */
export function planCost(p: SharingProblem, plan: SharingPlan): number {
  const w = p.weight;
  let c = plan.links.length;
  for (const [k] of plan.direct) c += w[k] ?? 1;
  for (const b of plan.buses) {
    c += b.outputs.length;
    for (const k of b.states) c += w[k] ?? 1;
  }
  return c;
}

/** Number of lit cells, each row counted for the states it stands for: the direct count. */
export function litCount(p: SharingProblem): number {
  return p.row.reduce((a, r, k) => a + r.length * (p.weight[k] ?? 1), 0);
}

/** The direct plan: one diode per lit cell. */
export function directPlan(p: SharingProblem): SharingPlan {
  const direct: [number, number][] = [];
  p.row.forEach((r, k) => r.forEach((o) => direct.push([k, o])));
  return { direct, buses: [], links: [] };
}

/**
 * Turns a plan into bare edges. Bus placeholders are named `~bus<i>` so they
 * cannot clash with a line name; `buildMatrix` renumbers them B1...
 */
export function planEdges(spec: DecodeSpec, plan: SharingPlan): Edge[] {
  const s = (k: number): string => spec.states[k] as string;
  const o = (j: number): string => spec.outputs[j] as string;
  const edges: Edge[] = [];
  for (const [k, j] of plan.direct) edges.push({ from: s(k), to: o(j) });
  plan.buses.forEach((b, i) => {
    const name = `~bus${i}`;
    for (const k of b.states) edges.push({ from: s(k), to: name });
    for (const j of b.outputs) edges.push({ from: name, to: o(j) });
  });
  for (const l of plan.links) edges.push({ from: o(l.from), to: o(l.to) });
  return edges;
}
