/**
 * The exact two-level model: a set-covering MILP over the candidate terms,
 * written as CPLEX LP-format text for HiGHS (covering by integer
 * programming, docs/sources.md "Two-level diode logic").
 *
 * Variables (binary): `x<t>` term t's AND gate is built (only for terms of
 * two or more literals; a single literal is a stage line, free), `y<t>_<j>`
 * term t feeds output j (one OR diode). Rows: every lit cell (output j,
 * state k) is fed by a term high in k (`y` sum >= 1); a gate's OR diodes
 * need the gate (`y<t>_<j> <= x<t>`). Terms never feed an output they would
 * light in a wrong state (the family only offers such pairs), so every
 * solution is exact.
 *
 * The first solve minimises diodes; the second keeps the diodes at the
 * proven minimum and minimises gates (`gatesWithin`).
 */
import type { LogicProblem } from "./logicProblem.ts";
import { termCost, type Term } from "./implicants.ts";
import type { Cover } from "./cover.ts";
import type { MilpModel } from "../synth/highsRun.ts";
import { hasState, setKey, statesOf } from "./stateSet.ts";
import { lpNameLines, lpSum } from "../synth/lpText.ts";

/** The covering MILP: its columns decode to a cover. */
export type CoverModel = MilpModel<Cover>;

export interface CoverModelOptions {
  /**
   * When given, the model minimises AND gates among decoders of at most
   * this many diodes (the second solve).
   */
  readonly gatesWithin?: number;
}

/**
 * Builds the model over `terms`.
 *
 * @example
 * const m = coverModel(p, family.terms);
 * m.text.startsWith("Minimize"); // true
 */
export function coverModel(p: LogicProblem, terms: readonly Term[], opts: CoverModelOptions = {}): CoverModel {
  const x = (t: number): string => `x${t}`;
  const y = (t: number, j: number): string => `y${t}_${j}`;
  const columns: string[] = [];
  const diodeTerms: string[] = [];
  const gateTerms: string[] = [];
  terms.forEach((term, t) => {
    const cost = termCost(term);
    if (cost > 0) {
      columns.push(x(t));
      diodeTerms.push(`${cost} ${x(t)}`);
      gateTerms.push(x(t));
    }
    for (const j of term.outputs) {
      columns.push(y(t, j));
      diodeTerms.push(y(t, j));
    }
  });

  const rows: string[] = [];
  const seenRows = new Set<string>();
  p.outputs.forEach((_, j) => {
    for (const k of statesOf(p.on[j]!)) {
      const feeders = terms.flatMap((term, t) => (term.outputs.includes(j) && hasState(term.states, k) ? [y(t, j)] : []));
      if (feeders.length === 0) throw new Error(`bug: no term feeds output ${j} in state ${k}`);
      const text = `${lpSum(feeders)} >= 1`;
      if (seenRows.has(text)) continue;
      seenRows.add(text);
      rows.push(text);
    }
  });
  terms.forEach((term, t) => {
    if (termCost(term) > 0) for (const j of term.outputs) rows.push(`${y(t, j)} - ${x(t)} <= 0`);
  });
  const objective = opts.gatesWithin === undefined ? diodeTerms : gateTerms;
  if (opts.gatesWithin !== undefined) rows.push(`${lpSum(diodeTerms)} <= ${opts.gatesWithin}`);

  const text = [
    "Minimize",
    ` obj: ${objective.length > 0 ? lpSum(objective) : `0 ${columns[0] ?? "x0"}`}`,
    "Subject To",
    ...rows.map((r, i) => ` c${i}: ${r}`),
    "Binary",
    ...lpNameLines(columns),
    "End",
    "",
  ].join("\n");

  const termIndex = new Map(terms.map((t, i) => [setKey(t.states), i]));
  return {
    text,
    columns,
    rows: rows.length,
    decode(value) {
      const cover: Cover[number][] = [];
      terms.forEach((term, t) => {
        const feeds = term.outputs.filter((j) => value(y(t, j)) > 0.5);
        if (feeds.length > 0) cover.push({ literals: term.literals, states: term.states, feeds });
      });
      return cover;
    },
    warmStart(cover) {
      const vals = new Map<string, number>(columns.map((c) => [c, 0]));
      for (const ct of cover) {
        const t = termIndex.get(setKey(ct.states));
        const term = t === undefined ? undefined : terms[t];
        if (t === undefined || term === undefined || termCost(term) > termCost(ct)) return null;
        if (!ct.feeds.every((j) => term.outputs.includes(j))) return null;
        if (termCost(term) > 0) vals.set(x(t), 1);
        for (const j of ct.feeds) vals.set(y(t, j), 1);
      }
      return vals;
    },
  };
}
