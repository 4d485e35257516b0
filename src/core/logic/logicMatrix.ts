/**
 * A coded counter's decoder as a `DiodeMatrix`: its AND gates named G1..,
 * every diode named D1.. in assembly order (the AND plane gate by gate,
 * each gate's inputs in line order; then the OR plane by driving node:
 * gates, stage lines, buses, outputs), and its longest OR path.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { MATRIX_SCHEMA, type DiodeMatrix, type Diode, type Gate, type MatrixMeta } from "../matrix/matrix.ts";
import { diodeRef } from "../matrix/designators.ts";
import { literalHigh, literalOf } from "../spec/counterCode.ts";
import type { Cover } from "./cover.ts";
import { literalLine } from "./logicProblem.ts";

/** The driving end of an OR diode while a decoder is put together. */
export type LogicNode = { readonly gate: number } | { readonly node: string };

/** A decoder before naming: gates as literal-line lists, OR diodes between nodes. */
export interface LogicPlan {
  /** Each gate's input lines (`Q0`, `nQ2`), two or more. */
  readonly gates: readonly (readonly string[])[];
  /** OR diodes: from a gate (by index in `gates`) or a named node (stage line, bus, output) to a bus or output. */
  readonly edges: readonly { readonly from: LogicNode; readonly to: string }[];
}

/** The plan of a two-level cover: each gate or stage line to the outputs it feeds. */
export function coverPlan(spec: DecodeSpec, cover: Cover): LogicPlan {
  const gates: string[][] = [];
  const edges: { from: LogicNode; to: string }[] = [];
  for (const t of cover) {
    const inputs = t.literals.map(literalLine);
    let from: LogicNode;
    if (inputs.length >= 2) {
      from = { gate: gates.length };
      gates.push(inputs);
    } else from = { node: inputs[0] as string };
    for (const j of t.feeds) edges.push({ from, to: spec.outputs[j] as string });
  }
  return { gates, edges };
}

/**
 * Names and orders a plan into a matrix. Gates are numbered by the first
 * state they decode (then by their inputs); buses by first use.
 *
 * @example
 * const m = logicMatrix(spec, coverPlan(spec, cover), { lowerBound: 40, optimal: true, depthLimit: 2, policy: "per-segment", method: "exact" });
 * m.gates[0]; // { ref: "G1", inputs: ["nQ0", "nQ1", "nQ2", "nQ3"] }
 */
export function logicMatrix(spec: DecodeSpec, plan: LogicPlan, meta: MatrixMeta): DiodeMatrix {
  const codes = spec.counter.codes;
  const lineRank = new Map(spec.lines.map((l, i) => [l, i]));
  const firstState = (inputs: readonly string[]): number => {
    const k = codes.findIndex((c) => inputs.every((i) => literalHigh(literalOf(i)!, c)));
    return k < 0 ? codes.length : k;
  };
  const gateOrder = plan.gates
    .map((inputs, i) => ({ i, inputs: [...inputs].sort((a, b) => (lineRank.get(a) ?? 0) - (lineRank.get(b) ?? 0)) }))
    .sort((a, b) => firstState(a.inputs) - firstState(b.inputs) || a.inputs.join().localeCompare(b.inputs.join()));
  const gateRef = new Map<number, string>();
  const gates: Gate[] = gateOrder.map((g, n) => {
    const ref = `G${n + 1}`;
    gateRef.set(g.i, ref);
    return { ref, inputs: g.inputs };
  });

  const outputs = new Set(spec.outputs);
  const gateRank = new Map(gates.map((g, i) => [g.ref, i]));
  const edges = plan.edges.map((e) => ({ from: "gate" in e.from ? (gateRef.get(e.from.gate) as string) : e.from.node, to: e.to }));
  const isBus = (n: string): boolean => !outputs.has(n) && !lineRank.has(n) && !gateRank.has(n);
  const buses = [...new Set(edges.flatMap((e) => [e.from, e.to]).filter(isBus))].sort((a, b) => busNumber(a) - busNumber(b));
  const busRank = new Map(buses.map((b, i) => [b, i]));
  const rank = (n: string): number => gateRank.get(n) ?? 1e6 + (lineRank.get(n) ?? 1e6 + (busRank.get(n) ?? 1e6 + spec.outputs.indexOf(n)));
  edges.sort((a, b) => rank(a.from) - rank(b.from) || rank(a.to) - rank(b.to));

  const diodes: Diode[] = [];
  for (const g of gates) for (const input of g.inputs) diodes.push({ ref: diodeRef(diodes.length), from: g.ref, to: input });
  for (const e of edges) diodes.push({ ref: diodeRef(diodes.length), from: e.from, to: e.to });
  return {
    schema: MATRIX_SCHEMA,
    states: spec.states,
    codes,
    lines: spec.lines,
    gates,
    outputs: spec.outputs,
    buses,
    diodes,
    tiedOn: spec.tiedOn,
    count: diodes.length,
    lowerBound: meta.lowerBound,
    optimal: meta.optimal,
    longestPath: longestOrPath(edges, [...gates.map((g) => g.ref), ...spec.lines]),
    depthLimit: meta.depthLimit,
    policy: meta.policy,
    method: meta.method,
    deadlineHit: meta.deadlineHit ?? false,
  };
}

/** The number of a bus name (`B3` -> 3). */
function busNumber(name: string): number {
  return Number(name.replace(/^\D+/, "")) || 0;
}

/** Longest run of OR diodes from a gate node or stage line; the plane is acyclic. */
function longestOrPath(edges: readonly { from: string; to: string }[], sources: readonly string[]): number {
  const out = new Map<string, string[]>();
  for (const e of edges) out.set(e.from, [...(out.get(e.from) ?? []), e.to]);
  const memo = new Map<string, number>();
  const depth = (n: string, guard: number): number => {
    const known = memo.get(n);
    if (known !== undefined) return known;
    let best = 0;
    if (guard <= edges.length) for (const t of out.get(n) ?? []) best = Math.max(best, 1 + depth(t, guard + 1));
    memo.set(n, best);
    return best;
  };
  return Math.max(0, ...sources.map((s) => depth(s, 0)));
}
