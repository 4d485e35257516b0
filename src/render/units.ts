/**
 * Pretty units for people: the one place where SI values from the core
 * become µA, mA, mW, kΩ text. The command line, the web app and the papers
 * all print through these, so a figure reads alike wherever it appears.
 *
 * The fixed-decimal forms (`microamps`...) give the number alone, for table
 * columns headed with their unit; the `...Text` forms add the unit.
 */

/** Amperes as microamperes, fixed decimals: 8.37e-5 -> "83.7". */
export function microamps(amperes: number, digits = 1): string {
  return (amperes * 1e6).toFixed(digits);
}

/** Amperes as milliamperes, fixed decimals: 5.1e-4 -> "0.51". */
export function milliamps(amperes: number, digits = 2): string {
  return (amperes * 1e3).toFixed(digits);
}

/** Amperes as nanoamperes, fixed decimals: 1.2e-10 -> "0.12". */
export function nanoamps(amperes: number, digits = 2): string {
  return (amperes * 1e9).toFixed(digits);
}

/** Watts as milliwatts, fixed decimals: 0.00433 -> "4.3". */
export function milliwatts(watts: number, digits = 1): string {
  return (watts * 1e3).toFixed(digits);
}

/** Volts, fixed decimals: 2.3123 -> "2.31". */
export function volts(v: number, digits = 2): string {
  return v.toFixed(digits);
}

/** Percent, one decimal: 11.853 -> "11.9". */
export function percent(pct: number): string {
  return pct.toFixed(1);
}

/** Amperes as microamperes to three significant figures, for axes and short readouts: 1.4e-4 -> "140". */
export function microampsShort(amperes: number): string {
  return String(Number((amperes * 1e6).toPrecision(3)));
}

/** Amperes as milliamperes without binary noise, for ratings: 0.00014 -> "0.14", 0.1 -> "100". */
export function milliampsExact(amperes: number): string {
  return String(Number((amperes * 1000).toPrecision(6)));
}

/**
 * Amperes with the prefix that puts them between 1 and 1000, three
 * significant figures, for currents from leakage up: 4.1537e-12 -> "4.15 pA",
 * 7.18e-5 -> "71.8 µA"; 0 -> "0 A".
 */
export function currentText(amperes: number): string {
  if (amperes === 0) return "0 A";
  const prefixes = [
    [1, "A"],
    [1e-3, "mA"],
    [1e-6, "µA"],
    [1e-9, "nA"],
    [1e-12, "pA"],
    [1e-15, "fA"],
  ] as const;
  const mag = Math.abs(amperes);
  // The first prefix at or below the value, where three significant figures do not round up to the next one.
  const [scale, unit] = prefixes.find(([f]) => Number((mag / f).toPrecision(3)) >= 1) ?? ([1e-15, "fA"] as const);
  return `${Number((amperes / scale).toPrecision(3))} ${unit}`;
}

/** Amperes with their unit, one decimal: "83.7 µA". */
export function microampsText(amperes: number): string {
  return `${microamps(amperes)} µA`;
}

/** Amperes with their unit, two decimals: "0.51 mA". */
export function milliampsText(amperes: number): string {
  return `${milliamps(amperes)} mA`;
}

/** Volts with their unit, two decimals: "2.31 V". */
export function voltsText(v: number): string {
  return `${volts(v)} V`;
}

/**
 * A resistance the way a BOM and a schematic print it, three significant
 * figures with a k or M multiplier and no unit: 470 -> "470", 4700 ->
 * "4.7k", 10000 -> "10k", 2200000 -> "2.2M".
 */
export function formatOhms(ohms: number): string {
  const fmt = (x: number): string => String(Number(x.toPrecision(3)));
  if (ohms >= 1e6) return `${fmt(ohms / 1e6)}M`;
  if (ohms >= 1e3) return `${fmt(ohms / 1e3)}k`;
  return fmt(ohms);
}

/** A resistance with its unit: 6200 -> "6.2 kΩ", 470 -> "470 Ω". */
export function ohmsText(ohms: number): string {
  const short = formatOhms(ohms);
  const multiplier = /[kM]$/.exec(short)?.[0] ?? "";
  return `${multiplier ? short.slice(0, -1) : short} ${multiplier}Ω`;
}
