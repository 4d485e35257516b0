/**
 * A switch's forced beta Ic/Ib as the budget prints it, to a tenth. A
 * saturated switch's is rounded down: it lies below the lowest beta the
 * switch is judged against, and rounding to the nearest tenth could print
 * that very beta (99.97 as "100.0" against a lowest beta of 100), which
 * reads as a switch not saturated.
 *
 * @param saturated whether the budget judges the switch saturated
 * @example
 * forcedBetaText(99.97, true); // "99.9"
 * forcedBetaText(100.000001, false); // "100.0"
 */
export function forcedBetaText(forcedBeta: number, saturated: boolean): string {
  return (saturated ? Math.floor(forcedBeta * 10) / 10 : forcedBeta).toFixed(1);
}
