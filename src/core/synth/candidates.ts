/**
 * Candidate bus structures for the exact optimizer.
 *
 * A bus is named by its output set T; the states that may feed it are
 * Smax(T), those lighting every output of T. One bus per T is enough: two
 * buses with the same T merge into one that costs |T| fewer diodes. So the
 * family "every T with |Smax(T)| >= 2" is complete; single-state buses are
 * modelled separately, one padding bus per state (see model.ts).
 *
 * Dominance pruning under the mixed policy: a bus with one output, or one
 * whose |S| x |T| block is 2 x 2 or smaller, is never better than direct
 * diodes, and swapping it for them only shortens paths, so such shapes are
 * left out (and a bus must then take enough states to be worth it).
 */
import type { SharingProblem } from "./plan.ts";
import { busPays, busStates, statesLighting } from "./rules.ts";

export interface BusCandidate {
  /** Output set T, ascending. */
  readonly outputs: readonly number[];
  /** Smax(T): every state lighting all of T, ascending. */
  readonly states: readonly number[];
}

export interface CandidateFamily {
  readonly buses: readonly BusCandidate[];
  /** True when no useful shape was left out because of the size limit. */
  readonly complete: boolean;
}

/** Limits that keep the model small enough for the WebAssembly solver. */
export interface FamilyLimits {
  /** Most candidate buses. */
  readonly maxBuses: number;
  /** Most bus-input variables (sum of |Smax(T)|). */
  readonly maxInputs: number;
}

export const DEFAULT_FAMILY_LIMITS: FamilyLimits = { maxBuses: 1500, maxInputs: 5000 };

/**
 * Enumerates bus shapes by depth-first search over outputs, shrinking Smax as
 * outputs join T. `minOutputs` is 2 under the mixed policy, else 1.
 * `extra` shapes (the heuristic's, for the warm start) are always kept.
 */
export function candidateFamily(
  p: SharingProblem,
  minOutputs: number,
  limits: FamilyLimits = DEFAULT_FAMILY_LIMITS,
  extra: readonly (readonly number[])[] = [],
): CandidateFamily {
  const found: BusCandidate[] = [];
  let inputs = 0;
  let overflow = false;
  const worth = (s: number, t: number): boolean => t >= minOutputs && (minOutputs < 2 || busPays(s, t));
  const visit = (t: number[], s: number[], next: number): void => {
    if (overflow) return;
    for (let o = next; o < p.m; o++) {
      const s2 = statesLighting(p, s, o);
      if (s2.length < 2) continue;
      const t2 = [...t, o];
      if (worth(s2.length, t2.length)) {
        found.push({ outputs: t2, states: s2 });
        inputs += s2.length;
        if (found.length > limits.maxBuses || inputs > limits.maxInputs) {
          overflow = true;
          return;
        }
      }
      visit(t2, s2, o + 1);
      if (overflow) return;
    }
  };
  visit(
    [],
    Array.from({ length: p.n }, (_, k) => k),
    0,
  );
  if (!overflow) return { buses: withExtra(p, found, extra), complete: true };

  // Too many shapes: keep the most promising ones, by diodes a full block saves.
  const scored: BusCandidate[] = [];
  const all = new Map<string, BusCandidate>();
  const collect = (t: number[], s: number[], next: number, budget: { left: number }): void => {
    for (let o = next; o < p.m && budget.left > 0; o++) {
      const s2 = statesLighting(p, s, o);
      if (s2.length < 2) continue;
      const t2 = [...t, o];
      budget.left--;
      if (t2.length >= 2 && busPays(s2.length, t2.length)) all.set(t2.join(","), { outputs: t2, states: s2 });
      collect(t2, s2, o + 1, budget);
    }
  };
  collect(
    [],
    Array.from({ length: p.n }, (_, k) => k),
    0,
    { left: 2_000_000 },
  );
  scored.push(...all.values());
  const save = (b: BusCandidate): number => b.states.length * b.outputs.length - b.states.length - b.outputs.length;
  scored.sort((a, b) => save(b) - save(a) || a.outputs.join(",").localeCompare(b.outputs.join(",")));
  const kept: BusCandidate[] = [];
  let used = 0;
  for (const b of scored) {
    if (kept.length >= limits.maxBuses || used + b.states.length > limits.maxInputs) break;
    kept.push(b);
    used += b.states.length;
  }
  return { buses: withExtra(p, kept, extra), complete: false };
}

function withExtra(p: SharingProblem, found: BusCandidate[], extra: readonly (readonly number[])[]): BusCandidate[] {
  const keys = new Set(found.map((b) => b.outputs.join(",")));
  const out = [...found];
  for (const t of extra) {
    const key = t.join(",");
    if (keys.has(key) || t.length === 0) continue;
    const s = busStates(p, t);
    if (s.length < 2) continue;
    keys.add(key);
    out.push({ outputs: [...t], states: s });
  }
  return out;
}
