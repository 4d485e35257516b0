/**
 * The Budget panel's words for the spread and the trim. A figure is never
 * set beside another as an improvement unless it is one: the trim's spread
 * is called narrower, wider or the same as the project's, by the numbers as
 * shown (one decimal), whichever of the two the design takes.
 */
import { percent } from "../../render/units.ts";

export interface SpreadFigures {
  /** The spread of the design in use, percent. */
  readonly spreadPct: number;
  /** Whether the design takes the trim. */
  readonly applied: boolean;
  /** The project's own resistors' spread, percent. */
  readonly spreadPctBefore: number;
  /** The trim's spread, percent. */
  readonly trimSpreadPct: number;
  readonly series: string;
}

/**
 * @example
 * spreadWords({ spreadPct: 11.9, applied: false, spreadPctBefore: 11.9, trimSpreadPct: 12.2, series: "E24" });
 * // "spread 11.9 % with the project's resistors; the E24 trim would give 12.2 %, wider, so it is not used"
 */
export function spreadWords(f: SpreadFigures): string {
  const before = percent(f.spreadPctBefore);
  const trim = percent(f.trimSpreadPct);
  const compare = Number(trim) < Number(before) ? "narrower" : Number(trim) > Number(before) ? "wider" : "the same";
  if (f.applied) {
    return `spread ${percent(f.spreadPct)} % with the ${f.series} trim (${compare} than the project's ${before} %)`;
  }
  const verdict = compare === "narrower" ? "narrower" : compare === "wider" ? "wider, so it is not used" : "no narrower";
  return `spread ${percent(f.spreadPct)} % with the project's resistors; the ${f.series} trim would give ${trim} %, ${verdict}`;
}
