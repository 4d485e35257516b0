/**
 * The dark-decoded outputs' part of the budget in words: the input network
 * as sized, why, and the ghost check's worst figures. The `budget` command
 * and the app's Budget panel both print these lines.
 */
import type { DarkBudget } from "../core/budget/budgetTypes.ts";
import { formatOhms, microamps, milliamps } from "./units.ts";

/** Where a figure of the ghost check was found: `1d in S1, high corner`. */
export function darkWhere(f: { readonly output: string; readonly state: string; readonly corner: string }): string {
  return `${f.output} in ${f.state}, ${f.corner === "nominal" ? "nominal" : `${f.corner} corner`}`;
}

/** The network in one line: `pull-ups 4.3k from the logic supply, 2 level-shift diodes each, bled by the 47k pull-down`. */
export function darkNetworkText(d: DarkBudget): string {
  const net =
    d.input === "divider"
      ? `dividers ${formatOhms(d.dividerOhms ?? 0)} over ${formatOhms(d.bleedOhms)}`
      : `${d.shiftDiodes} level-shift diode${d.shiftDiodes === 1 ? "" : "s"} each, bled by the ${formatOhms(d.bleedOhms)} pull-down`;
  return `pull-ups ${formatOhms(d.pullUpOhms)} from the logic supply, ${net}`;
}

/**
 * The ghost check's figures, one per line: the worst unlit segment against
 * the ghost limit, the lit range against the window, the most an active-low
 * line sinks against its rating, and the verdict.
 *
 * @param unit the unit the rest of the report gives segment currents in
 */
export function darkFigureLines(d: DarkBudget, unit: "mA" | "µA"): string[] {
  const amps = (a: number): string => (unit === "mA" ? milliamps(a, 3) : microamps(a));
  return [
    `worst unlit ${microamps(d.worstUnlit.currentA)} µA (${darkWhere(d.worstUnlit)}) against the ${microamps(d.ghostLimitA)} µA ghost limit`,
    `lit ${amps(d.weakestLit.currentA)}-${amps(d.strongestLit.currentA)} ${unit} (weakest ${darkWhere(d.weakestLit)}, strongest ${darkWhere(d.strongestLit)}) in the ${amps(d.litWindowA[0])}-${amps(d.litWindowA[1])} ${unit} window`,
    `most sunk by an active-low line ${milliamps(d.mostSunk.currentA, 3)} mA (${darkWhere(d.mostSunk)}) of ${milliamps(d.lineRatedA)} mA`,
    d.passes ? "every limit holds" : `FAILS: ${d.verdict}`,
  ];
}

/** The figures of a ghost check the margins are worked out from (a `GhostCheck` or the budget's `DarkBudget`). */
export interface GhostFigures {
  readonly ghostLimitA: number;
  readonly lineRatedA: number;
  readonly litWindowA: readonly [number, number];
  readonly worstUnlit: { readonly output: string; readonly state: string; readonly corner: string; readonly currentA: number };
  readonly mostSunk: { readonly output: string; readonly state: string; readonly corner: string; readonly currentA: number };
  readonly weakestLit: { readonly currentA: number };
  readonly strongestLit: { readonly currentA: number };
  readonly passes: boolean;
}

/** Each limit's margin, as a share of the limit (negative when broken). */
export function darkMargins(g: GhostFigures): { ghost: number; lineSink: number; litLow: number; litHigh: number } {
  const [low, high] = g.litWindowA;
  return {
    ghost: (g.ghostLimitA - g.worstUnlit.currentA) / g.ghostLimitA,
    lineSink: (g.lineRatedA - g.mostSunk.currentA) / g.lineRatedA,
    litLow: (g.weakestLit.currentA - low) / low,
    litHigh: (high - g.strongestLit.currentA) / high,
  };
}

/**
 * Each limit's margin in one line: `margins: 12.4 % below the ghost limit,
 * 41.0 % below the active-low line's rating, lit window 4.7 % above its low
 * end and 6.1 % below its high end`.
 */
export function darkMarginsText(g: GhostFigures): string {
  const m = darkMargins(g);
  const pct = (share: number): string => `${(100 * share).toFixed(1)} %`;
  return `margins: ${pct(m.ghost)} below the ghost limit, ${pct(m.lineSink)} below the active-low line's rating, lit window ${pct(m.litLow)} above its low end and ${pct(m.litHigh)} below its high end`;
}
