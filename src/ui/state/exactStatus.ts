/**
 * The exact optimizer's run as the result line tells it. A run that ends
 * without a proof says why (the time limit, or its work budget spent) with
 * its best count and bound; "proven minimum" only when it is one.
 */
import type { ExactProgress } from "../workers/exactProtocol.ts";

export type ExactState =
  | { readonly status: "idle" }
  | { readonly status: "off" }
  | { readonly status: "running"; readonly progress: ExactProgress; readonly startedAtMs: number }
  | {
      readonly status: "done";
      /** The exact matrix has fewer diodes than the one shown before it. */
      readonly improved: boolean;
      readonly optimal: boolean;
      /** The clock (the time limit) ended the run before its work budget. */
      readonly deadlineHit: boolean;
      readonly count: number;
      readonly lowerBound: number | null;
      /** Taken from an earlier run on the same glyph set (a comparison row, an earlier exact run), not run again. */
      readonly reused: boolean;
    }
  | { readonly status: "cancelled" }
  | { readonly status: "failed"; readonly message: string };

/**
 * What a finished run says.
 *
 * @example
 * doneText({ status: "done", optimal: false, deadlineHit: true, count: 221, lowerBound: 142, improved: false, reused: false });
 * // "exact: time limit reached: best 221, bound 142"
 */
export function doneText(s: Extract<ExactState, { status: "done" }>): string {
  const from = s.reused ? " (from an earlier run on these glyphs)" : "";
  const improved = s.improved ? ", improved" : "";
  if (s.optimal) return `exact: proven minimum ${s.count}${improved}${from}`;
  const figures = `best ${s.count}, bound ${s.lowerBound ?? "none"}`;
  const why = s.deadlineHit ? "time limit reached" : "no proof within its work budget";
  return `exact: ${why}: ${figures}${improved}${from}`;
}
