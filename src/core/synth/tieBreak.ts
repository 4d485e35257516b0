/**
 * The order among plans, written once: fewer diodes first; among plans of
 * one count, fewer bus nodes (each is a node to wire and a place to fail),
 * then fewer long paths (links and bus outputs, each a second diode drop the
 * driver must make up for). The heuristic, the search and the exact stage
 * all rank by it, so a plan that wins in one wins in every one.
 */
import { planCost, planCount, type SharingPlan, type SharingProblem, type SharingRules } from "./plan.ts";
import { busPays } from "./rules.ts";

/** Long paths of a plan: links and bus outputs. */
function longPaths(plan: SharingPlan): number {
  return plan.links.length + plan.buses.reduce((a, b) => a + b.outputs.length, 0);
}

/**
 * Negative when `a` comes first, positive when `b` does, 0 on a full tie.
 * Diodes are counted as `planCost` counts them when the plans' problem `p`
 * is given (a reduced problem's rows stand for several states), else one a
 * row.
 *
 * @example
 * comparePlans(heuristic, exact) > 0; // the exact plan is better
 */
export function comparePlans(a: SharingPlan, b: SharingPlan, p?: SharingProblem): number {
  const count = (x: SharingPlan): number => (p ? planCost(p, x) : planCount(x));
  return count(a) - count(b) || a.buses.length - b.buses.length || longPaths(a) - longPaths(b);
}

/** The better of two plans under `comparePlans`; `a` on a full tie. */
export function betterPlan(a: SharingPlan, b: SharingPlan, p?: SharingProblem): SharingPlan {
  return comparePlans(b, a, p) < 0 ? b : a;
}

/**
 * Count-neutral clean-up of a solver plan: under the mixed policy a bus that
 * does not pay (see `busPays`) becomes direct diodes, for no more diodes,
 * one bus node and some long paths fewer.
 */
export function breakTies(p: SharingProblem, rules: SharingRules, plan: SharingPlan): SharingPlan {
  if (rules.policy !== "mixed") return plan;
  const direct: (readonly [number, number])[] = [...plan.direct];
  const have = new Set(direct.map(([k, o]) => k * p.m + o));
  const buses = plan.buses.filter((b) => {
    const states = b.states.reduce((a, k) => a + (p.weight[k] ?? 1), 0);
    if (busPays(states, b.outputs.length)) return true;
    for (const k of b.states) {
      for (const o of b.outputs) {
        if (!have.has(k * p.m + o)) {
          have.add(k * p.m + o);
          direct.push([k, o]);
        }
      }
    }
    return false;
  });
  return { direct, buses, links: plan.links };
}
