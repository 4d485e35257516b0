/**
 * The decode polarity as sharing problems the existing engines solve.
 *
 * Decoding an output's dark cells onto the active-low lines is the same
 * covering problem as decoding lit cells from the active-high lines, on the
 * dark-cell matrix: a diode from the output node (anode) to the line
 * (cathode) pulls the node down in that line's state, a bus is a node that
 * the outputs' diodes reach and that reaches the lines, and a link from
 * output a to output b (anode on b) pulls b down whenever a is down, which
 * is exact when b is dark in every state a is dark. Followed from the line
 * (the driving end, as a matrix's `from` always is), every structure is the
 * lit one with the line's level inverted.
 *
 * For a chosen polarity per output the whole decoder is one problem with
 * 2N rows: rows 0..N-1 are the active-high lines `S<k>`, rows N..2N-1 the
 * active-low lines `nS<k>`; an output's column holds its lit cells in the
 * first half or its dark cells in the second (a high-side switch, on while
 * its node is low, turns that round: its lit cells in the second half). A bus or a link between the
 * two halves is never exact (no row lights both), so the two sides share
 * none by construction.
 *
 * `bothProblem` holds both polarities of every output side by side (column
 * o lit, column M+o dark), for the covering model that chooses.
 */
import type { Edge } from "../matrix/matrix.ts";
import type { DecodeSpec, OutputPolarity } from "../spec/decodeSpec.ts";
import { activeLowName, outputSide, stateName } from "../spec/decodeSpec.ts";
import { problemFromLit, type SharingPlan, type SharingProblem } from "./plan.ts";

/** Per output (as `spec.outputs`), its display position (0-based). */
export function outputGroups(spec: DecodeSpec): number[] {
  const perPosition = Math.max(1, spec.cell.segments.length);
  const position = new Map(spec.allOutputs.map((name, i) => [name, Math.floor(i / perPosition)]));
  return spec.outputs.map((name) => position.get(name) ?? 0);
}

/**
 * The problem of one choice: 2N rows (active-high lines, then active-low),
 * one column per output holding its cells in its chosen polarity.
 *
 * @example
 * choiceProblem(spec, spec.outputs.map(() => "dark")).n; // 2 * spec.states.length
 */
export function choiceProblem(spec: DecodeSpec, choice: readonly OutputPolarity[]): SharingProblem {
  const n = spec.states.length;
  const rows: boolean[][] = [];
  for (let k = 0; k < 2 * n; k++) rows.push(spec.outputs.map((_, o) => inRow(spec, k, o, choice[o] ?? "lit")));
  return problemFromLit(rows, { group: outputGroups(spec) });
}

/**
 * True when row `k` of a 2N-row problem holds output `o` decoded in
 * `polarity`: the row's half is the output's side (`outputSide`: the
 * active-low half for dark cells of a driver on while its node is high, or
 * for lit cells of one on while it is low), and the state's cell is of that
 * polarity.
 */
function inRow(spec: DecodeSpec, k: number, o: number, polarity: OutputPolarity): boolean {
  const n = spec.states.length;
  const low = k >= n;
  const s = low ? k - n : k;
  if ((outputSide(polarity, spec.polarity.inverting) === "low") !== low) return false;
  const lit = spec.lit[s]?.[o] === true;
  return polarity === "lit" ? lit : !lit;
}

/** Both polarities side by side: 2N rows as `choiceProblem`, column o the lit cells of output o, column M+o its dark cells. */
export function bothProblem(spec: DecodeSpec): SharingProblem {
  const n = spec.states.length;
  const m = spec.outputs.length;
  const rows: boolean[][] = [];
  for (let k = 0; k < 2 * n; k++) {
    const row: boolean[] = [];
    for (let c = 0; c < 2 * m; c++) row.push(inRow(spec, k, c % m, c >= m ? "dark" : "lit"));
    rows.push(row);
  }
  const g = outputGroups(spec);
  return problemFromLit(rows, { group: [...g, ...g] });
}

/** The line of a row of a choice problem: `S<k>`, or `nS<k>` in the second half. */
export function rowLine(n: number, row: number): string {
  return row < n ? stateName(row) : activeLowName(row - n);
}

/**
 * A plan of `bothProblem` as a plan of the choice it makes (column M+o
 * becomes o) and that choice: an output is dark-decoded when a structure
 * reaches its dark column.
 */
export function planOfBoth(m: number, plan: SharingPlan): { readonly plan: SharingPlan; readonly choice: OutputPolarity[] } {
  const choice: OutputPolarity[] = Array.from({ length: m }, () => "lit");
  const col = (c: number): number => {
    if (c >= m) choice[c - m] = "dark";
    return c % m;
  };
  const direct = plan.direct.map(([k, c]) => [k, col(c)] as const);
  const buses = plan.buses.map((b) => ({ states: b.states, outputs: b.outputs.map(col) }));
  const links = plan.links.map((l) => ({ from: col(l.from), to: col(l.to) }));
  return { plan: { direct, buses, links }, choice };
}

/** A plan of a choice problem as a plan of `bothProblem`. */
export function bothOfPlan(m: number, plan: SharingPlan, choice: readonly OutputPolarity[]): SharingPlan {
  const col = (o: number): number => (choice[o] === "dark" ? m + o : o);
  return {
    direct: plan.direct.map(([k, o]) => [k, col(o)] as const),
    buses: plan.buses.map((b) => ({ states: b.states, outputs: b.outputs.map(col) })),
    links: plan.links.map((l) => ({ from: col(l.from), to: col(l.to) })),
  };
}

/**
 * A choice problem's plan as bare edges, each from its driving end (the
 * line, then bus, then output, as the matrix spells diodes): on the dark
 * side the driving end is the cathode. Bus placeholders are `~bus<i>`.
 */
export function choiceEdges(spec: DecodeSpec, plan: SharingPlan): Edge[] {
  const n = spec.states.length;
  const line = (k: number): string => rowLine(n, k);
  const out = (j: number): string => spec.outputs[j] as string;
  const edges: Edge[] = [];
  for (const [k, j] of plan.direct) edges.push({ from: line(k), to: out(j) });
  plan.buses.forEach((b, i) => {
    const name = `~bus${i}`;
    for (const k of b.states) edges.push({ from: line(k), to: name });
    for (const j of b.outputs) edges.push({ from: name, to: out(j) });
  });
  for (const l of plan.links) edges.push({ from: out(l.from), to: out(l.to) });
  return edges;
}
