/**
 * The `electrical` section: the allowed range of every field, the two
 * spellings the files use (format 2, and format 1, migrated), the preset
 * the values start from, and the checks that tie fields together.
 *
 * Format 2: `preset` names a complete set of values (electricalPresets.ts,
 * `bench-5v-switch` when absent); every field given overrides it. Format 1:
 * the section describes a current sink under a string of `string.dies`
 * dies, with format 1's defaults for what it leaves out; it is turned into
 * the same strict model and keeps its meaning.
 *
 * The ranges are physically sensible bounds, wide enough for any small-signal
 * build and narrow enough that the DC solve and the resistor trim stay
 * finite: a target current of 5e-324 A asks for an infinite resistor, which
 * no budget can give. docs/project-format.md lists them; a test checks that
 * the table there matches `ELECTRICAL_RANGES`.
 */
import * as v from "valibot";
import { shockleyVoltage, thermalVoltage } from "../circuit/physics.ts";
import type { Problem } from "../result/result.ts";
import { DEFAULT_PRESET, ELECTRICAL_PRESETS, FORMAT1_ELECTRICAL, PRESET_NAMES } from "./electricalPresets.ts";
import { choiceField, gotMessage, mapField, numberField, objectField, type NumberRule } from "./fieldRules.ts";
import type { Cell, DriverKind, ElectricalModel, PresetName } from "./project.ts";
import { fieldPath } from "./valueText.ts";

/** The values a project without an `electrical` section gets: the default preset's. */
export const ELECTRICAL_DEFAULTS: ElectricalModel = ELECTRICAL_PRESETS[DEFAULT_PRESET];

export const DRIVER_KINDS: readonly DriverKind[] = ["current-sink", "low-side-switch", "emitter-follower", "high-side-switch", "direct"];

/** A number rule with both ends given. */
export type RangeRule = NumberRule & { readonly min: number; readonly max: number };

/** Keeps the keys of a table of ranges while typing each value as a `RangeRule`. */
const rangeTable = <K extends string>(table: Readonly<Record<K, RangeRule>>): Readonly<Record<K, RangeRule>> => table;

const temperature: RangeRule = { min: -55, max: 150, unit: "°C" };
const resistor: RangeRule = { min: 1, max: 10e6, unit: "Ω" };
const beta: RangeRule = { min: 1, max: 100_000 };
const emission: RangeRule = { min: 0.5, max: 10 };
const current: RangeRule = { min: 1e-6, max: 10, unit: "A" };
const supplyVolts: RangeRule = { min: 1, max: 1000, unit: "V" };

/**
 * The allowed range of every number in the section, by its path below
 * `electrical` (`driver.emitterResistors` and `segment.seriesResistors` hold
 * the range of each entry).
 */
export const ELECTRICAL_RANGES = rangeTable({
  temperatureC: temperature,
  ghostFraction: { min: 1e-6, max: 1 },
  "counterOutput.high": { min: -100, max: 100, unit: "V" },
  "counterOutput.low": { min: -100, max: 100, unit: "V" },
  "counterOutput.resistance": resistor,
  "counterOutput.lowResistance": resistor,
  "counterOutput.maxCurrentA": current,
  "lowLine.low": { min: -100, max: 100, unit: "V" },
  "lowLine.high": { min: -100, max: 100, unit: "V" },
  "lowLine.resistance": resistor,
  "lowLine.maxCurrentA": current,
  "logicSupply.volts": { min: 1, max: 100, unit: "V" },
  "diode.is": { min: 1e-18, max: 1e-3, unit: "A" },
  "diode.n": emission,
  "diode.rs": { min: 0, max: 10_000, unit: "Ω" },
  "diode.maxForwardA": { min: 1e-6, max: 100, unit: "A" },
  "diode.maxReverseV": { min: 1, max: 10_000, unit: "V" },
  pullDown: { min: 10, max: 100e6, unit: "Ω" },
  gatePullUp: { min: 100, max: 10e6, unit: "Ω" },
  "driver.is": { min: 1e-20, max: 1e-6, unit: "A" },
  "driver.betaF": beta,
  "driver.betaR": { min: 0.01, max: 1000 },
  "driver.emitterResistor": resistor,
  "driver.emitterResistors": resistor,
  "driver.baseResistor": { min: 0, max: 10e6, unit: "Ω" },
  "driver.baseEmitterResistor": resistor,
  "driver.maxVceV": { min: 1, max: 10_000, unit: "V" },
  "driver.maxPowerW": { min: 0.001, max: 1000, unit: "W" },
  "driver.maxCollectorA": { min: 1e-6, max: 100, unit: "A" },
  "segment.leds": { min: 1, max: 200, integer: true },
  "segment.is": { min: 1e-60, max: 1e-3, unit: "A" },
  "segment.n": emission,
  "segment.rs": { min: 0, max: 10_000, unit: "Ω" },
  "segment.seriesResistor": { min: 0, max: 10e6, unit: "Ω" },
  "segment.seriesResistors": resistor,
  "segment.targetA": current,
  "segment.maxA": current,
  "supply.volts": supplyVolts,
  "supply.minVolts": supplyVolts,
  "supply.maxVolts": supplyVolts,
  "tolerance.resistorPct": { min: 0, max: 50, unit: "%" },
  "tolerance.betaMin": beta,
  "tolerance.betaMax": beta,
  "tolerance.temperatureC": temperature,
});

const R = ELECTRICAL_RANGES;
const n = numberField;
const opt = v.optional;

const perOutput = (rule: RangeRule, example: string) => mapField(n(rule), `must map output names to ohms, e.g. {"1a": ${example}}`);
const temperatureRange = () =>
  v.tuple([n(R["tolerance.temperatureC"]), n(R["tolerance.temperatureC"])], gotMessage("must be [low, high] in °C"));

const shared = {
  temperatureC: opt(n(R.temperatureC)),
  diode: opt(
    objectField({
      is: opt(n(R["diode.is"])),
      n: opt(n(R["diode.n"])),
      rs: opt(n(R["diode.rs"])),
      maxForwardA: opt(n(R["diode.maxForwardA"])),
      maxReverseV: opt(n(R["diode.maxReverseV"])),
    }),
  ),
  pullDown: opt(n(R.pullDown)),
  supply: opt(
    objectField({
      volts: opt(n(R["supply.volts"])),
      minVolts: opt(n(R["supply.minVolts"])),
      maxVolts: opt(n(R["supply.maxVolts"])),
    }),
  ),
  tolerance: opt(
    objectField({
      resistorPct: opt(n(R["tolerance.resistorPct"])),
      betaMin: opt(n(R["tolerance.betaMin"])),
      betaMax: opt(n(R["tolerance.betaMax"])),
      temperatureC: opt(temperatureRange()),
    }),
  ),
};

/** The section as format 2 spells it: every field optional, on top of a preset. */
export const ElectricalSectionSchema = objectField({
  preset: opt(v.nullable(choiceField(PRESET_NAMES))),
  temperatureC: shared.temperatureC,
  ghostFraction: opt(n(R.ghostFraction)),
  counterOutput: opt(
    objectField({
      high: opt(n(R["counterOutput.high"])),
      low: opt(n(R["counterOutput.low"])),
      resistance: opt(n(R["counterOutput.resistance"])),
      lowResistance: opt(n(R["counterOutput.lowResistance"])),
      maxCurrentA: opt(n(R["counterOutput.maxCurrentA"])),
    }),
  ),
  lowLine: opt(
    objectField({
      low: opt(n(R["lowLine.low"])),
      high: opt(n(R["lowLine.high"])),
      resistance: opt(n(R["lowLine.resistance"])),
      maxCurrentA: opt(n(R["lowLine.maxCurrentA"])),
    }),
  ),
  logicSupply: opt(objectField({ volts: opt(n(R["logicSupply.volts"])) })),
  diode: shared.diode,
  pullDown: shared.pullDown,
  gatePullUp: opt(n(R.gatePullUp)),
  driver: opt(
    objectField({
      kind: opt(choiceField(DRIVER_KINDS)),
      is: opt(n(R["driver.is"])),
      betaF: opt(n(R["driver.betaF"])),
      betaR: opt(n(R["driver.betaR"])),
      emitterResistor: opt(n(R["driver.emitterResistor"])),
      emitterResistors: opt(perOutput(R["driver.emitterResistors"], "8200")),
      baseResistor: opt(n(R["driver.baseResistor"])),
      baseEmitterResistor: opt(v.nullable(n(R["driver.baseEmitterResistor"]))),
      maxVceV: opt(n(R["driver.maxVceV"])),
      maxPowerW: opt(n(R["driver.maxPowerW"])),
      maxCollectorA: opt(n(R["driver.maxCollectorA"])),
    }),
  ),
  segment: opt(
    objectField({
      leds: opt(n(R["segment.leds"])),
      is: opt(n(R["segment.is"])),
      n: opt(n(R["segment.n"])),
      rs: opt(n(R["segment.rs"])),
      seriesResistor: opt(n(R["segment.seriesResistor"])),
      seriesResistors: opt(perOutput(R["segment.seriesResistors"], "330")),
      targetA: opt(n(R["segment.targetA"])),
      maxA: opt(n(R["segment.maxA"])),
    }),
  ),
  supply: shared.supply,
  tolerance: shared.tolerance,
});

/** The section as format 1 spelled it (a current sink under a string of dies), its keys in format 1's order. */
export const ElectricalSectionSchemaV1 = objectField({
  temperatureC: shared.temperatureC,
  counterOutput: opt(
    objectField({
      high: opt(n(R["counterOutput.high"])),
      low: opt(n(R["counterOutput.low"])),
      resistance: opt(n(R["counterOutput.resistance"])),
    }),
  ),
  diode: shared.diode,
  pullDown: shared.pullDown,
  driver: opt(
    objectField({
      is: opt(n(R["driver.is"])),
      betaF: opt(n(R["driver.betaF"])),
      betaR: opt(n(R["driver.betaR"])),
      emitterResistor: opt(n(R["driver.emitterResistor"])),
      emitterResistors: opt(perOutput(R["driver.emitterResistors"], "8200")),
      maxVceV: opt(n(R["driver.maxVceV"])),
      maxPowerW: opt(n(R["driver.maxPowerW"])),
    }),
  ),
  string: opt(
    objectField({
      dies: opt(n(R["segment.leds"])),
      is: opt(n(R["segment.is"])),
      n: opt(n(R["segment.n"])),
      targetA: opt(n(R["segment.targetA"])),
      maxA: opt(n(R["segment.maxA"])),
    }),
  ),
  supply: shared.supply,
  tolerance: shared.tolerance,
});

type Loose<T> = { readonly [K in keyof T]?: T[K] extends readonly unknown[] ? T[K] : T[K] extends object ? Loose<T[K]> : T[K] };
/** A format-2 section as read: any part of the model, a preset name (null: none named). */
export type LooseElectrical = Loose<Omit<ElectricalModel, "preset">> & { readonly preset?: PresetName | null };

/** The loose value over the base, section by section; a per-output map given replaces the base's whole. */
function merged(base: ElectricalModel, given: LooseElectrical, preset: PresetName | null): ElectricalModel {
  const g = given;
  return {
    preset,
    temperatureC: g.temperatureC ?? base.temperatureC,
    ghostFraction: g.ghostFraction ?? base.ghostFraction,
    counterOutput: { ...base.counterOutput, ...g.counterOutput },
    lowLine: { ...base.lowLine, ...g.lowLine },
    logicSupply: { ...base.logicSupply, ...g.logicSupply },
    diode: { ...base.diode, ...g.diode },
    pullDown: g.pullDown ?? base.pullDown,
    gatePullUp: g.gatePullUp ?? base.gatePullUp,
    driver: { ...base.driver, ...g.driver } as ElectricalModel["driver"],
    segment: { ...base.segment, ...g.segment } as ElectricalModel["segment"],
    supply: { ...base.supply, ...g.supply },
    tolerance: { ...base.tolerance, ...g.tolerance } as ElectricalModel["tolerance"],
  };
}

/**
 * The model a format-2 section describes: its preset (the default one when
 * the key is absent) with every given field on top. `"preset": null` names
 * none: the values are the file's own (a migrated format-1 file, written
 * again, spells every one out), the default preset filling any left out.
 *
 * @example
 * electricalOf({ preset: "panel-12v-sink", supply: { volts: 13.5, minVolts: 12.8, maxVolts: 14.2 } }).driver.kind; // "current-sink"
 */
export function electricalOf(given: LooseElectrical): ElectricalModel {
  const preset = given.preset === undefined ? DEFAULT_PRESET : given.preset;
  return merged(ELECTRICAL_PRESETS[preset ?? DEFAULT_PRESET], given, preset);
}

/** A format-1 section as read. */
export interface LooseElectricalV1 {
  readonly temperatureC?: number;
  readonly counterOutput?: { readonly high?: number; readonly low?: number; readonly resistance?: number };
  readonly diode?: Partial<ElectricalModel["diode"]>;
  readonly pullDown?: number;
  readonly driver?: Partial<
    Pick<ElectricalModel["driver"], "is" | "betaF" | "betaR" | "emitterResistor" | "emitterResistors" | "maxVceV" | "maxPowerW">
  >;
  readonly string?: {
    readonly dies?: number;
    readonly is?: number;
    readonly n?: number;
    readonly targetA?: number;
    readonly maxA?: number;
  };
  readonly supply?: Partial<ElectricalModel["supply"]>;
  readonly tolerance?: Partial<ElectricalModel["tolerance"]>;
}

/**
 * The model a format-1 section describes: today's current sink under a
 * string, format 1's defaults for what it leaves out. The tie-on net (the
 * logic supply) sits at the counter's high level, as format 1's tie-on did.
 *
 * @example
 * electricalOfV1({ string: { dies: 12 } }).segment.leds; // 12, on a 100 V supply
 */
export function electricalOfV1(given: LooseElectricalV1): ElectricalModel {
  const s = given.string ?? {};
  const segment: LooseElectrical["segment"] = {
    ...(s.dies !== undefined ? { leds: s.dies } : {}),
    ...(s.is !== undefined ? { is: s.is } : {}),
    ...(s.n !== undefined ? { n: s.n } : {}),
    ...(s.targetA !== undefined ? { targetA: s.targetA } : {}),
    ...(s.maxA !== undefined ? { maxA: s.maxA } : {}),
  };
  const m = merged(
    FORMAT1_ELECTRICAL,
    {
      ...(given.temperatureC !== undefined ? { temperatureC: given.temperatureC } : {}),
      ...(given.pullDown !== undefined ? { pullDown: given.pullDown } : {}),
      // Format 1 had one source resistance for both levels.
      counterOutput: {
        ...given.counterOutput,
        ...(given.counterOutput?.resistance !== undefined ? { lowResistance: given.counterOutput.resistance } : {}),
      },
      diode: given.diode ?? {},
      driver: given.driver ?? {},
      segment,
      supply: given.supply ?? {},
      tolerance: given.tolerance ?? {},
    },
    null,
  );
  return { ...m, logicSupply: { volts: m.counterOutput.high } };
}

/** The drop of one segment's LEDs at a current, volts (without the series resistor). */
export function segmentDropV(e: ElectricalModel, currentA: number): number {
  const s = e.segment;
  return s.leds * (shockleyVoltage(currentA, s.is, s.n, thermalVoltage(e.temperatureC)) + currentA * s.rs);
}

/** A silicon junction's drop taken for the checks below (a matrix diode, a forward-biased base-emitter), volts. */
const VBE_CHECK_V = 0.6;

/**
 * The checks that tie fields together: the supply range, the segment's drop
 * against what feeds it, the resistors each driver kind needs, the counter
 * levels, the beta and temperature ranges, the target against the rating,
 * and the names in the per-output resistor maps.
 */
export function checkElectrical(e: ElectricalModel, cell: Cell, positions: number, problems: Problem[]): void {
  const at = (...p: string[]): string => fieldPath(["electrical", ...p]);
  const s = e.supply;
  const kind = e.driver.kind;
  if (!(s.minVolts <= s.volts && s.volts <= s.maxVolts)) {
    problems.push({
      path: at("supply"),
      message: `got minVolts ${s.minVolts}, volts ${s.volts}, maxVolts ${s.maxVolts}; needs minVolts <= volts <= maxVolts`,
    });
  }
  const dropV = segmentDropV(e, e.segment.targetA);
  const leds = `${e.segment.leds} LED${e.segment.leds === 1 ? "" : "s"}`;
  if ((kind === "current-sink" || kind === "low-side-switch" || kind === "high-side-switch") && s.minVolts <= dropV) {
    problems.push({
      path: at("supply", "minVolts"),
      message: `${s.minVolts} V is below the ${dropV.toFixed(1)} V that ${leds} drop at the target current; raise the supply or put fewer LEDs in each segment (segment.leds)`,
    });
  }
  const co = e.counterOutput;
  // What reaches the segment: the line less one matrix diode (and a follower's Vbe), about 0.6 V each.
  const feedV = kind === "emitter-follower" ? Math.min(co.high, s.minVolts) - 2 * VBE_CHECK_V : co.high - VBE_CHECK_V;
  if ((kind === "emitter-follower" || kind === "direct") && feedV <= dropV) {
    const what =
      kind === "direct"
        ? `the counter's ${co.high} V high level, less a matrix diode (about ${feedV.toFixed(1)} V),`
        : `a follower's emitter (about ${feedV.toFixed(1)} V, a diode and a Vbe below the line)`;
    problems.push({
      path: at("segment", "leds"),
      message: `${what} cannot light ${leds} (${dropV.toFixed(1)} V at the target current); put fewer LEDs in each segment or choose another driver kind`,
    });
  }
  if (kind !== "current-sink" && e.segment.seriesResistor <= 0) {
    problems.push({
      path: at("segment", "seriesResistor"),
      message: `got ${e.segment.seriesResistor}; a ${kind} segment needs a series resistor (above 0 Ω) to set its current`,
    });
  }
  if ((kind === "low-side-switch" || kind === "high-side-switch") && e.driver.baseResistor <= 0) {
    problems.push({
      path: at("driver", "baseResistor"),
      message: `got ${e.driver.baseResistor}; a switch needs a base resistor (above 0 Ω) to set its base current`,
    });
  }
  if (kind === "high-side-switch" && e.driver.baseEmitterResistor === null) {
    problems.push({
      path: at("driver", "baseEmitterResistor"),
      message: `got null; a high-side switch needs a base-emitter resistor (from the segment supply to the base, e.g. 10000 Ω) to hold the PNP off while its node is not pulled low`,
    });
  }
  if (co.high <= co.low) {
    problems.push({
      path: at("counterOutput", "high"),
      message: `got ${co.high} V; must be above counterOutput.low (${co.low} V) for source drive`,
    });
  }
  if (e.lowLine.high <= e.lowLine.low) {
    problems.push({
      path: at("lowLine", "high"),
      message: `got ${e.lowLine.high} V; an idle active-low line must sit above the active one (lowLine.low, ${e.lowLine.low} V)`,
    });
  }
  if (e.tolerance.betaMin > e.tolerance.betaMax) {
    problems.push({
      path: at("tolerance", "betaMin"),
      message: `got ${e.tolerance.betaMin}; must not exceed tolerance.betaMax (${e.tolerance.betaMax})`,
    });
  }
  const [lo, hi] = e.tolerance.temperatureC;
  if (lo > hi) {
    problems.push({ path: at("tolerance", "temperatureC"), message: `got [${lo}, ${hi}]; must be [low, high] with low <= high` });
  }
  if (e.segment.targetA > e.segment.maxA) {
    problems.push({
      path: at("segment", "targetA"),
      message: `got ${e.segment.targetA} A; must not exceed segment.maxA (${e.segment.maxA} A)`,
    });
  }
  const outputNames = (section: "driver" | "segment", key: string, map: Readonly<Record<string, number>>): void => {
    for (const name of Object.keys(map)) {
      const m = /^(\d+)(.+)$/.exec(name);
      const pos = m ? Number(m[1]) : NaN;
      if (!m || !(pos >= 1 && pos <= positions) || !cell.segments.includes(m[2] ?? "")) {
        problems.push({
          path: at(section, key, name),
          message: `not an output of this display; outputs are named like "1${cell.segments[0] ?? "a"}" (position, then segment)`,
        });
      }
    }
  };
  outputNames("driver", "emitterResistors", e.driver.emitterResistors);
  outputNames("segment", "seriesResistors", e.segment.seriesResistors);
}
