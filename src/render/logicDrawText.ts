/**
 * Why a decoder on PNP high-side switches draws nothing from the logic
 * supply, where the bare 0 would read as a fault: its counter lines are
 * active low and only sink current (the switches' base current and line
 * pull-ups, all from the segment supply), and no part of it hangs from the
 * logic supply (a tied-on switch is held on to ground). The model takes the
 * counter's lines as ideal sources behind their resistance, so what the
 * counter itself draws to sink that current is not in the figure.
 */
import type { DriverKind } from "../core/project/project.ts";

/** At or below this a logic draw reads as none, amperes (far below what the figures print). */
const NONE_A = 1e-12;

/**
 * The clause that follows a decoder's logic supply figure, or null where
 * the figure needs none.
 *
 * @example
 * logicDrawClause("high-side-switch", 0); // "nothing drawn: the high-side switches' active-low lines only sink current, the switches' base and pull-up currents from the segment supply"
 * logicDrawClause("low-side-switch", 0.004); // null
 */
export function logicDrawClause(kind: DriverKind, maxCurrentA: number): string | null {
  if (kind !== "high-side-switch" || maxCurrentA > NONE_A) return null;
  return "nothing drawn: the high-side switches' active-low lines only sink current, the switches' base and pull-up currents from the segment supply";
}
