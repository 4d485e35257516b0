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
import { WorkMeter } from "./workMeter.ts";

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

/** Most output sets the enumeration visits when the family overflows (each visit narrows a state list). */
const MAX_VISITS = 2_000_000;

/**
 * Enumerates bus shapes by depth-first search over outputs, shrinking Smax as
 * outputs join T. `minOutputs` is 2 under the mixed policy, else 1.
 * `extra` shapes (the heuristic's, for the warm start) are always kept.
 *
 * When the shapes overflow the limits, the search goes on (up to
 * `MAX_VISITS` output sets, or until `meter` stops it) keeping only the
 * `maxBuses` shapes that save the most diodes as full blocks, so its memory
 * stays proportional to the family it returns; with `whenTooMany` "stop" it
 * ends there instead (for a caller that needs only a complete family).
 */
export function candidateFamily(
  p: SharingProblem,
  minOutputs: number,
  limits: FamilyLimits = DEFAULT_FAMILY_LIMITS,
  extra: readonly (readonly number[])[] = [],
  meter: WorkMeter = new WorkMeter(Infinity),
  whenTooMany: "best" | "stop" = "best",
): CandidateFamily {
  const weightOf = (states: readonly number[]): number => states.reduce((a, k) => a + (p.weight[k] ?? 1), 0);
  // A bus of one row is that row's padding bus, which the engines model on their own (see model.ts, search.ts).
  const enough = (states: readonly number[]): boolean => states.length >= 2;
  const worth = (s: number, t: number): boolean => t >= minOutputs && (minOutputs < 2 || busPays(s, t));
  // Diodes a full block saves, and the shape's key, worked out once per shape for the ranking.
  const saves = new Map<BusCandidate, number>();
  const keys = new Map<BusCandidate, string>();
  const note = (b: BusCandidate): BusCandidate => {
    const w = weightOf(b.states);
    saves.set(b, w * b.outputs.length - w - b.outputs.length);
    keys.set(b, b.outputs.join(","));
    return b;
  };
  const rank = (a: BusCandidate, b: BusCandidate): number =>
    (saves.get(b) ?? 0) - (saves.get(a) ?? 0) || (keys.get(a) ?? "").localeCompare(keys.get(b) ?? "");

  let found: BusCandidate[] = [];
  let inputs = 0;
  let overflow = false;
  let visits = 0;
  let stopped = false;
  const keepBest = (): void => {
    found.sort(rank);
    for (const b of found.slice(limits.maxBuses)) {
      saves.delete(b);
      keys.delete(b);
    }
    found = found.slice(0, limits.maxBuses);
  };
  const visit = (t: number[], s: number[], next: number): void => {
    for (let o = next; o < p.m && !stopped; o++) {
      const s2 = statesLighting(p, s, o);
      if (++visits > MAX_VISITS || meter.charge(s.length + 1)) {
        stopped = true;
        return;
      }
      if (!enough(s2)) continue;
      const t2 = [...t, o];
      // Past the limits only shapes of two or more outputs that pay count (the most promising).
      if (overflow ? t2.length >= 2 && busPays(weightOf(s2), t2.length) : worth(weightOf(s2), t2.length)) {
        found.push(note({ outputs: t2, states: s2 }));
        inputs += s2.length;
        if (!overflow && (found.length > limits.maxBuses || inputs > limits.maxInputs)) {
          overflow = true;
          if (whenTooMany === "stop") {
            stopped = true;
            return;
          }
          found = found.filter((b) => b.outputs.length >= 2 && busPays(weightOf(b.states), b.outputs.length));
        }
        if (overflow && found.length >= 2 * limits.maxBuses) keepBest();
      }
      visit(t2, s2, o + 1);
    }
  };
  visit(
    [],
    Array.from({ length: p.n }, (_, k) => k),
    0,
  );
  if (!overflow && !stopped) return { buses: withExtra(p, found, extra, enough), complete: true };

  // Too many shapes, or the search stopped: keep the most promising ones, by diodes a full block saves.
  keepBest();
  const kept: BusCandidate[] = [];
  let used = 0;
  for (const b of found) {
    if (kept.length >= limits.maxBuses || used + b.states.length > limits.maxInputs) break;
    kept.push(b);
    used += b.states.length;
  }
  return { buses: withExtra(p, kept, extra, enough), complete: false };
}

function withExtra(
  p: SharingProblem,
  found: BusCandidate[],
  extra: readonly (readonly number[])[],
  enough: (states: readonly number[]) => boolean,
): BusCandidate[] {
  const keys = new Set(found.map((b) => b.outputs.join(",")));
  const out = [...found];
  for (const t of extra) {
    const key = t.join(",");
    if (keys.has(key) || t.length === 0) continue;
    const s = busStates(p, t);
    if (!enough(s)) continue;
    keys.add(key);
    out.push({ outputs: [...t], states: s });
  }
  return out;
}
