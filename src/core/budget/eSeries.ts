/**
 * IEC 60063 preferred values, as the standard's tables (not a formula: the
 * rounded geometric series would give 2.6 where E12 and E24 have 2.7).
 * Source: IEC 60063 Table 1 (E24) and Table 2 (E96); listing at
 * qsl.net/g4usp "Component preferred values".
 */

export type ESeriesName = "E24" | "E96";

/** E24 significands (two digits), tolerance 5 %. */
export const E24: readonly number[] = [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91];

/** E96 significands (three digits), tolerance 1 %. */
export const E96: readonly number[] = [
  100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143, 147, 150, 154, 158, 162, 165, 169, 174, 178, 182, 187,
  191, 196, 200, 205, 210, 215, 221, 226, 232, 237, 243, 249, 255, 261, 267, 274, 280, 287, 294, 301, 309, 316, 324, 332, 340, 348, 357,
  365, 374, 383, 392, 402, 412, 422, 432, 442, 453, 464, 475, 487, 499, 511, 523, 536, 549, 562, 576, 590, 604, 619, 634, 649, 665, 681,
  698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953, 976,
];

/** The significands of a series and the power of ten that makes them 1.0-9.99. */
function table(series: ESeriesName): { readonly values: readonly number[]; readonly digits: number } {
  return series === "E24" ? { values: E24, digits: 1 } : { values: E96, digits: 2 };
}

/** `significand x 10^exp`, built so that 4.7k is exactly 4700. */
function scaled(significand: number, exp: number): number {
  return exp >= 0 ? significand * 10 ** exp : significand / 10 ** -exp;
}

/**
 * The two preferred values around a resistance: the largest at or below it
 * and the smallest at or above it (equal when it is itself preferred).
 *
 * @param ohms > 0
 * @example
 * preferredNeighbours(5000, "E24"); // [4700, 5100]
 */
export function preferredNeighbours(ohms: number, series: ESeriesName): readonly [number, number] {
  if (!(ohms > 0) || !Number.isFinite(ohms)) throw new RangeError(`preferredNeighbours needs a positive resistance, got ${ohms}`);
  const { values, digits } = table(series);
  const decade = Math.floor(Math.log10(ohms)) - digits;
  // Candidates from the decade below to the decade above, to absorb rounding in log10.
  const candidates: number[] = [];
  for (let e = decade - 1; e <= decade + 1; e++) for (const v of values) candidates.push(scaled(v, e));
  const eps = ohms * 1e-12;
  let lower = candidates[0] as number;
  let upper = candidates[candidates.length - 1] as number;
  for (const c of candidates) {
    if (c <= ohms + eps && c > lower) lower = c;
    if (c >= ohms - eps && c < upper) upper = c;
  }
  return [lower, upper];
}

/** The preferred value nearest a resistance on a logarithmic scale. */
export function nearestPreferred(ohms: number, series: ESeriesName): number {
  const [lo, hi] = preferredNeighbours(ohms, series);
  return Math.log(ohms / lo) <= Math.log(hi / ohms) ? lo : hi;
}
