/**
 * The candidate terms of two-level decoding: every product of stage lines
 * that can feed some output, at its fewest literals.
 *
 * What a term can do depends only on the used states it is high in (codes
 * the counter never reaches are don't-cares) and on its literal count (its
 * cost). So terms are found by a breadth-first walk over those state sets:
 * from the set of all states, adding a literal intersects the set with the
 * literal's states. The first time a set is met it is met at its fewest
 * literals; a literal that removes no state adds nothing. The walk reaches
 * every set a product of literals can have (induction on the literals), so
 * when it ends by itself the family is complete: it holds a cheapest term
 * for every set of states any term can have.
 *
 * Two prunings keep it small and are exact:
 * - a set that lights no output's on-set has no useful subset, so it is not
 *   expanded;
 * - a term is dropped when removing one of its literals gives a term (one
 *   literal cheaper, high in more states) that may still feed every output
 *   this one may: the multi-output prime implicant rule of Quine-McCluskey
 *   (docs/sources.md, "Two-level diode logic").
 *
 * A walk cut short by its node cap or work budget is incomplete; then the
 * terms every state needs (its cheapest isolating term, found greedily, and
 * for every output one expansion of each of its states) are added so that a
 * decoder always exists, and no bound is claimed from the family.
 */
import { WorkMeter } from "../synth/workMeter.ts";
import type { LogicProblem } from "./logicProblem.ts";
import {
  disjoint,
  fullSet,
  hasState,
  intersect,
  isEmpty,
  sameSet,
  setKey,
  setOf,
  setSize,
  statesOf,
  union,
  type StateSet,
} from "./stateSet.ts";

/** A product term: an AND gate of two or more literals, or one stage line. */
export interface Term {
  /** Literal indices (see `literalIndex`), ascending. */
  readonly literals: readonly number[];
  /** The used states the term is high in. */
  readonly states: StateSet;
  /** Outputs (indices) it may feed: high in some state that lights it and in none that leaves it dark. */
  readonly outputs: readonly number[];
}

export interface TermFamily {
  readonly terms: readonly Term[];
  /** True when the walk ended by itself: the family holds a cheapest term for every reachable state set. */
  readonly complete: boolean;
  /** State sets the walk visited. */
  readonly visited: number;
}

/** Diodes of a term's AND gate: one per literal for two or more literals; a single literal is the stage line itself. */
export function termCost(t: { readonly literals: readonly number[] }): number {
  return t.literals.length >= 2 ? t.literals.length : 0;
}

/** Most state sets the walk visits before it stops and calls the family incomplete. */
export const FAMILY_MAX_SETS = 60_000;

export interface FamilyOptions {
  readonly meter?: WorkMeter;
  /** Default `FAMILY_MAX_SETS`. */
  readonly maxSets?: number;
}

/**
 * The candidate terms of a problem, in walk order (fewest literals first,
 * then literal order), so the same problem always gives the same family.
 *
 * @example
 * const family = termFamily(logicProblem(spec));
 * family.complete; // true for every counter up to 8 stages
 */
export function termFamily(p: LogicProblem, opts: FamilyOptions = {}): TermFamily {
  const walk = walkStateSets(p, opts);
  const terms = primeTerms(p, walk.nodes);
  if (walk.complete) return { terms, complete: true, visited: walk.nodes.length };
  return { terms: withRescueTerms(p, terms), complete: false, visited: walk.nodes.length };
}

/** A state set a product of literals can have, with one product of fewest literals that has it. */
export interface StateSetNode {
  readonly literals: readonly number[];
  readonly states: StateSet;
}

/**
 * The breadth-first walk over state sets (see the file comment): every set
 * a product of literals can have that meets some output's on-set, each at
 * its fewest literals, in walk order.
 */
export function walkStateSets(
  p: LogicProblem,
  opts: FamilyOptions = {},
): { readonly nodes: readonly StateSetNode[]; readonly complete: boolean } {
  const meter = opts.meter ?? new WorkMeter(Infinity);
  const maxSets = opts.maxSets ?? FAMILY_MAX_SETS;
  const anyOn = union(p.size, p.on);
  const seen = new Set<string>();
  const nodes: StateSetNode[] = [];
  let frontier: StateSetNode[] = [{ literals: [], states: fullSet(p.size) }];
  seen.add(setKey(frontier[0]!.states));
  let complete = true;
  walk: while (frontier.length > 0) {
    const next: StateSetNode[] = [];
    for (const node of frontier) {
      if (disjoint(node.states, anyOn)) continue;
      const used = new Set(node.literals.map((l) => l >> 1));
      for (let li = 0; li < p.literalSets.length; li++) {
        if (used.has(li >> 1)) continue;
        const s = intersect(node.states, p.literalSets[li] as StateSet);
        if (meter.charge(s.length)) {
          complete = false;
          break walk;
        }
        if (isEmpty(s) || sameSet(s, node.states)) continue;
        const key = setKey(s);
        if (seen.has(key)) continue;
        seen.add(key);
        const child = { literals: [...node.literals, li].sort((a, b) => a - b), states: s };
        nodes.push(child);
        next.push(child);
        if (nodes.length >= maxSets) {
          complete = false;
          break walk;
        }
      }
    }
    frontier = next;
  }
  return { nodes, complete };
}

/** The outputs a set of states may feed. */
export function feedableOutputs(p: LogicProblem, states: StateSet): number[] {
  const out: number[] = [];
  p.outputs.forEach((_, j) => {
    if (disjoint(states, p.off[j] as StateSet) && !disjoint(states, p.on[j] as StateSet)) out.push(j);
  });
  return out;
}

/** The states of a product of literals. */
export function statesOfLiterals(p: LogicProblem, literals: readonly number[]): StateSet {
  let s = fullSet(p.size);
  for (const l of literals) s = intersect(s, p.literalSets[l] as StateSet);
  return s;
}

/** Keeps the useful terms that pass the prime rule (see the file comment). */
function primeTerms(p: LogicProblem, nodes: readonly StateSetNode[]): Term[] {
  const terms: Term[] = [];
  for (const node of nodes) {
    const outputs = feedableOutputs(p, node.states);
    if (outputs.length === 0) continue;
    const dominated =
      node.literals.length >= 2 &&
      node.literals.some((drop) => {
        const parent = statesOfLiterals(
          p,
          node.literals.filter((l) => l !== drop),
        );
        return outputs.every((j) => disjoint(parent, p.off[j] as StateSet));
      });
    if (!dominated) terms.push({ literals: node.literals, states: node.states, outputs });
  }
  return terms;
}

/** Most literal combinations `isolatingLiterals` tries per state before it settles for the greedy choice. */
const ISOLATING_TRIES = 20_000;

/**
 * The fewest literals whose product is high in state k and in no other used
 * state: the one-state decode. Combinations of k's own literals are tried by
 * size, lowest literals first (so for a Johnson counter it finds the two
 * adjacent stages of the textbook decode); past `ISOLATING_TRIES`
 * combinations the greedy choice stands.
 *
 * @example
 * isolatingLiterals(p, 1); // 5-stage Johnson, state 00001: [0, 3], i.e. Q0 nQ1
 */
export function isolatingLiterals(p: LogicProblem, k: number): number[] {
  const own = p.literalSets.map((_, li) => li).filter((li) => hasState(p.literalSets[li] as StateSet, k));
  const target = setOf(p.size, [k]);
  let tries = 0;
  for (let size = 1; size <= own.length; size++) {
    const pick: number[] = [];
    const found = (function search(from: number, states: StateSet): boolean {
      if (pick.length === size) return ++tries > ISOLATING_TRIES ? false : sameSet(states, target);
      for (let i = from; i < own.length && tries <= ISOLATING_TRIES; i++) {
        pick.push(own[i] as number);
        if (search(i + 1, intersect(states, p.literalSets[own[i] as number] as StateSet))) return true;
        pick.pop();
      }
      return false;
    })(0, fullSet(p.size));
    if (found) return pick;
    if (tries > ISOLATING_TRIES) break;
  }
  return greedyIsolating(p, k);
}

/** Literals of k's code, each chosen to rule out the most states still in (ties to the lowest literal). */
function greedyIsolating(p: LogicProblem, k: number): number[] {
  const own = p.literalSets.map((_, li) => li).filter((li) => hasState(p.literalSets[li] as StateSet, k));
  let states = fullSet(p.size);
  const chosen: number[] = [];
  const target = setOf(p.size, [k]);
  while (!sameSet(states, target)) {
    let best = -1;
    let bestLeft = Infinity;
    for (const li of own) {
      if (chosen.includes(li)) continue;
      const left = setSize(intersect(states, p.literalSets[li] as StateSet));
      if (left < bestLeft) {
        best = li;
        bestLeft = left;
      }
    }
    if (best < 0) throw new Error(`bug: state ${k} shares its code with another state`);
    chosen.push(best);
    states = intersect(states, p.literalSets[best] as StateSet);
  }
  return chosen.sort((a, b) => a - b);
}

/**
 * Expands state k's full code for output j: drops literals, highest stage
 * first, while the term stays dark in every state that leaves j dark.
 */
function expandFor(p: LogicProblem, k: number, j: number): number[] {
  const lits = p.literalSets.map((_, li) => li).filter((li) => hasState(p.literalSets[li] as StateSet, k));
  for (let i = lits.length - 1; i >= 0; i--) {
    const without = lits.filter((_, x) => x !== i);
    if (without.length > 0 && disjoint(statesOfLiterals(p, without), p.off[j] as StateSet)) lits.splice(i, 1);
  }
  return lits;
}

/** Adds every state's isolating term and each output's expansions to an incomplete family. */
function withRescueTerms(p: LogicProblem, terms: readonly Term[]): Term[] {
  const byKey = new Map<string, Term>();
  const add = (literals: readonly number[]): void => {
    const states = statesOfLiterals(p, literals);
    const key = setKey(states);
    const old = byKey.get(key);
    if (old && old.literals.length <= literals.length) return;
    const outputs = feedableOutputs(p, states);
    if (outputs.length > 0) byKey.set(key, { literals: [...literals].sort((a, b) => a - b), states, outputs });
  };
  for (const t of terms) add(t.literals);
  for (let k = 0; k < p.size; k++) add(isolatingLiterals(p, k));
  p.outputs.forEach((_, j) => {
    for (const k of statesOf(p.on[j] as StateSet)) add(expandFor(p, k, j));
  });
  return [...byKey.values()];
}

/** True when the term may feed output j and is high in state k. */
export function termCovers(t: Term, j: number, k: number): boolean {
  return t.outputs.includes(j) && hasState(t.states, k);
}
