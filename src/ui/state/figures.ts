/**
 * The figures the screen shows for a glyph set: one diode count with its
 * status (heuristic, best found, proven) and bound, whichever run found it.
 *
 * Every run on the same lit matrix under the same rules (the same
 * `rowKey`) finds a valid matrix and, maybe, a valid lower bound, so the
 * figures of several runs combine: the smallest count, the largest bound,
 * proven when they meet. The header and the comparison row in use show the
 * same combination, so they can never disagree.
 */
import type { FigureStatus } from "../../core/compare/glyphStyles.ts";
import { matrixObjective, type DiodeMatrix } from "../../core/matrix/matrix.ts";

export interface Figure {
  readonly count: number;
  readonly lowerBound: number | null;
  readonly status: FigureStatus;
}

const RANK: Readonly<Record<FigureStatus, number>> = { heuristic: 0, "best found": 1, proven: 2 };

/** The figure of a matrix: `proven` when optimal, `best found` from the exact optimizer, otherwise `heuristic`. */
export function matrixFigure(m: Pick<DiodeMatrix, "count" | "inputNetwork" | "lowerBound" | "optimal" | "method">): Figure {
  const status: FigureStatus = m.optimal ? "proven" : m.method === "exact" ? "best found" : "heuristic";
  // With dark-decoded outputs the optimizer, and so the bound, counts their level-shift diodes too.
  return { count: matrixObjective(m), lowerBound: m.lowerBound, status };
}

/**
 * Combines figures of the same glyph set: the smallest count (on a tie the
 * better-worked status), the largest bound, and `proven` once they meet.
 *
 * @example
 * combineFigures([{ count: 54, lowerBound: null, status: "heuristic" }, { count: 52, lowerBound: 52, status: "proven" }]);
 * // { count: 52, lowerBound: 52, status: "proven" }
 */
export function combineFigures(figures: readonly (Figure | null | undefined)[]): Figure | null {
  const all = figures.filter((f): f is Figure => f !== null && f !== undefined);
  if (all.length === 0) return null;
  const best = all.reduce((a, b) => (b.count < a.count || (b.count === a.count && RANK[b.status] > RANK[a.status]) ? b : a));
  const bounds = all.map((f) => f.lowerBound).filter((b): b is number => b !== null);
  const lowerBound = bounds.length > 0 ? Math.min(best.count, Math.max(...bounds)) : null;
  const status: FigureStatus = lowerBound !== null && lowerBound >= best.count ? "proven" : best.status;
  return { count: best.count, lowerBound, status };
}

/**
 * The figure of the matrix on screen, with the best bound known for its
 * glyph set (from any run): its own count, `proven` once a bound meets it.
 *
 * @example
 * shownFigure({ count: 53, lowerBound: null, status: "heuristic" }, { count: 51, lowerBound: 51, status: "proven" });
 * // { count: 53, lowerBound: 51, status: "heuristic" }
 */
export function shownFigure(own: Figure, known: Figure | undefined): Figure {
  const bounds = [own.lowerBound, known?.lowerBound].filter((b): b is number => b !== null && b !== undefined);
  const lowerBound = bounds.length > 0 ? Math.min(own.count, Math.max(...bounds)) : null;
  return { count: own.count, lowerBound, status: lowerBound !== null && lowerBound >= own.count ? "proven" : own.status };
}

/** True when `a` says more than `b`: a smaller count, or the same count better worked out or better bounded. */
export function isBetter(a: Figure, b: Figure): boolean {
  if (a.count !== b.count) return a.count < b.count;
  if (RANK[a.status] !== RANK[b.status]) return RANK[a.status] > RANK[b.status];
  return (a.lowerBound ?? -1) > (b.lowerBound ?? -1);
}

/** The figure as the table cell reads: "52 proven", "53 best found (bound 49)", "54 heuristic". */
export function figureText(f: Figure): string {
  if (f.status === "proven") return `${f.count} proven`;
  const bound = f.lowerBound !== null ? ` (bound ${f.lowerBound})` : "";
  return `${f.count} ${f.status}${bound}`;
}

/**
 * The comparison table's caption: "heuristic counts" only while every row
 * is a heuristic figure, "proven minimums" when every row is proven,
 * otherwise it says that each row has its own status.
 */
export function tableCaption(statuses: readonly FigureStatus[]): string {
  if (statuses.length > 0 && statuses.every((s) => s === "heuristic")) return "heuristic counts";
  if (statuses.length > 0 && statuses.every((s) => s === "proven")) return "proven minimums";
  return "figures of mixed status";
}
