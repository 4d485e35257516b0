/**
 * Lower bounds on the diode count that hold for every matrix, whatever its
 * depth and structure.
 *
 * Every driven output needs a diode into it and every state that lights
 * something needs a diode out of it, so the count is at least the larger of
 * the two numbers. It is weak, but it is the bound that stays honest where
 * the exact model does not cover every structure (depth 3, or a candidate
 * family cut short for size); the MILP's dual bound is used everywhere else.
 */
import type { SharingProblem } from "./synthPlan.ts";

/** max(driven outputs, states that light something). */
export function trivialLowerBound(p: SharingProblem): number {
  const outputs = p.col.filter((c) => c.length > 0).length;
  const states = p.row.filter((r) => r.length > 0).length;
  return Math.max(outputs, states);
}
