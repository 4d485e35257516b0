/**
 * Safety cautions for builds whose string supply is above the extra-low
 * voltage range. The web app and the reports show these same words.
 *
 * Threshold: 60 V DC, the usual touch-safe limit for SELV (IEC 61140 allows
 * up to 120 V ripple-free DC as extra-low voltage; IEC 60335-1 and the IEC
 * IEV take 60 V DC as the SELV limit). Source: docs/sources.md "Safety
 * thresholds for the cautions".
 */

import type { ElectricalModel } from "../project/project.ts";

/** Above this DC voltage a build gets the hazardous-voltage caution, volts. */
export const SELV_DC_LIMIT_V = 60;

export type WarningLevel = "info" | "warn" | "danger";

export interface SafetyCaution {
  readonly level: "danger";
  readonly code: "hazardous-voltage" | "mains-supply";
  readonly message: string;
}

/** The hazardous-voltage caution for a supply of `volts`. */
export function hazardousVoltageText(volts: number): string {
  return (
    `Hazardous voltage: the string supply reaches ${volts} V DC, above the ${SELV_DC_LIMIT_V} V DC limit usually taken as safe to touch (SELV). ` +
    "Treat the supply, every display string and every driver collector as dangerous: wire and probe only with the supply off and its capacitors discharged, " +
    "and follow your local electrical codes and licensed practice."
  );
}

/** The cautions for a supply made from the mains through a transformer. */
export const MAINS_SUPPLY_TEXT =
  "If the supply is made from the mains through a transformer and rectifier: fuse the live lead, insulate and shroud every mains and high-voltage terminal, " +
  "earth all exposed metal parts, and discharge the filter capacitors before touching the circuit. " +
  "Mains wiring must follow your local electrical codes; where they require it, have it done or checked by a licensed electrician.";

/**
 * The cautions a design needs, given every supply value it may see (nominal,
 * lowest, highest), volts. None when all stay at or below 60 V DC.
 *
 * @example
 * safetyCautions([100, 90, 110]).map((c) => c.code); // ["hazardous-voltage", "mains-supply"]
 */
export function safetyCautions(supplyVolts: readonly number[]): SafetyCaution[] {
  const highest = Math.max(...supplyVolts);
  if (!(highest > SELV_DC_LIMIT_V)) return [];
  return [
    { level: "danger", code: "hazardous-voltage", message: hazardousVoltageText(highest) },
    { level: "danger", code: "mains-supply", message: MAINS_SUPPLY_TEXT },
  ];
}

/**
 * Every DC voltage a build carries, volts: the segment supply's range
 * (where the driver kind uses it), the logic supply and the counter's levels.
 *
 * @example
 * Math.max(...carriedVoltages(project.electrical)); // 88 for the string-hv-sink preset
 */
export function carriedVoltages(e: ElectricalModel): number[] {
  const s = e.supply;
  const segment = e.driver.kind === "direct" ? [] : [s.volts, s.minVolts, s.maxVolts];
  return [...segment, e.logicSupply.volts, Math.abs(e.counterOutput.high), Math.abs(e.counterOutput.low)];
}
