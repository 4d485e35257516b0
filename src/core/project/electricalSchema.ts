/**
 * The `electrical` section: defaults, the allowed range of every field, and
 * the checks that tie fields together.
 *
 * The ranges are physically sensible bounds, wide enough for any small-signal
 * build and narrow enough that the DC solve and the resistor trim stay
 * finite: a target current of 5e-324 A asks for an infinite emitter
 * resistor, which no budget can give. docs/project-format.md lists them; a
 * test checks that the table there matches `ELECTRICAL_RANGES`.
 */
import * as v from "valibot";
import { shockleyVoltage, thermalVoltage } from "../circuit/physics.ts";
import type { Problem } from "../result/result.ts";
import { gotMessage, mapField, numberField, objectField, type NumberRule } from "./fieldRules.ts";
import type { Cell, ElectricalModel } from "./project.ts";
import { fieldPath } from "./valueText.ts";

/** Defaults of the `electrical` section (documented in docs/electrical-model.md). */
export const ELECTRICAL_DEFAULTS: ElectricalModel = {
  temperatureC: 27,
  counterOutput: { high: 2.4, low: 0, resistance: 1000 },
  diode: { is: 4e-9, n: 1.9, rs: 0, maxForwardA: 0.1, maxReverseV: 75 },
  pullDown: 100_000,
  driver: {
    is: 1e-14,
    betaF: 150,
    betaR: 3,
    emitterResistor: 10_000,
    emitterResistors: {},
    maxVceV: 300,
    maxPowerW: 0.5,
  },
  string: { dies: 19, is: 1e-27, n: 2, targetA: 0.00014, maxA: 0.015 },
  supply: { volts: 100, minVolts: 90, maxVolts: 110 },
  tolerance: { resistorPct: 5, betaMin: 80, betaMax: 300, temperatureC: [0, 50] },
};

/** A number rule with both ends given. */
export type RangeRule = NumberRule & { readonly min: number; readonly max: number };

/** Keeps the keys of a table of ranges while typing each value as a `RangeRule`. */
const rangeTable = <K extends string>(table: Readonly<Record<K, RangeRule>>): Readonly<Record<K, RangeRule>> => table;

const temperature: RangeRule = { min: -55, max: 150, unit: "°C" };
const resistor: RangeRule = { min: 1, max: 10e6, unit: "Ω" };
const beta: RangeRule = { min: 1, max: 100_000 };
const emission: RangeRule = { min: 0.5, max: 10 };

/**
 * The allowed range of every number in the section, by its path below
 * `electrical` (`driver.emitterResistors` holds the range of each entry).
 */
export const ELECTRICAL_RANGES = rangeTable({
  temperatureC: temperature,
  "counterOutput.high": { min: -100, max: 100, unit: "V" },
  "counterOutput.low": { min: -100, max: 100, unit: "V" },
  "counterOutput.resistance": resistor,
  "diode.is": { min: 1e-18, max: 1e-3, unit: "A" },
  "diode.n": emission,
  "diode.rs": { min: 0, max: 10_000, unit: "Ω" },
  "diode.maxForwardA": { min: 1e-6, max: 100, unit: "A" },
  "diode.maxReverseV": { min: 1, max: 10_000, unit: "V" },
  pullDown: { min: 10, max: 100e6, unit: "Ω" },
  "driver.is": { min: 1e-20, max: 1e-6, unit: "A" },
  "driver.betaF": beta,
  "driver.betaR": { min: 0.01, max: 1000 },
  "driver.emitterResistor": resistor,
  "driver.emitterResistors": resistor,
  "driver.maxVceV": { min: 1, max: 10_000, unit: "V" },
  "driver.maxPowerW": { min: 0.001, max: 1000, unit: "W" },
  "string.dies": { min: 1, max: 200, integer: true },
  "string.is": { min: 1e-60, max: 1e-3, unit: "A" },
  "string.n": emission,
  "string.targetA": { min: 1e-6, max: 10, unit: "A" },
  "string.maxA": { min: 1e-6, max: 10, unit: "A" },
  "supply.volts": { min: 1, max: 1000, unit: "V" },
  "supply.minVolts": { min: 1, max: 1000, unit: "V" },
  "supply.maxVolts": { min: 1, max: 1000, unit: "V" },
  "tolerance.resistorPct": { min: 0, max: 50, unit: "%" },
  "tolerance.betaMin": beta,
  "tolerance.betaMax": beta,
  "tolerance.temperatureC": temperature,
});

const R = ELECTRICAL_RANGES;
const d = ELECTRICAL_DEFAULTS;
const n = numberField;

export const ElectricalSectionSchema = objectField({
  temperatureC: v.optional(n(R.temperatureC), d.temperatureC),
  counterOutput: v.optional(
    objectField({
      high: v.optional(n(R["counterOutput.high"]), d.counterOutput.high),
      low: v.optional(n(R["counterOutput.low"]), d.counterOutput.low),
      resistance: v.optional(n(R["counterOutput.resistance"]), d.counterOutput.resistance),
    }),
    d.counterOutput,
  ),
  diode: v.optional(
    objectField({
      is: v.optional(n(R["diode.is"]), d.diode.is),
      n: v.optional(n(R["diode.n"]), d.diode.n),
      rs: v.optional(n(R["diode.rs"]), d.diode.rs),
      maxForwardA: v.optional(n(R["diode.maxForwardA"]), d.diode.maxForwardA),
      maxReverseV: v.optional(n(R["diode.maxReverseV"]), d.diode.maxReverseV),
    }),
    d.diode,
  ),
  pullDown: v.optional(n(R.pullDown), d.pullDown),
  driver: v.optional(
    objectField({
      is: v.optional(n(R["driver.is"]), d.driver.is),
      betaF: v.optional(n(R["driver.betaF"]), d.driver.betaF),
      betaR: v.optional(n(R["driver.betaR"]), d.driver.betaR),
      emitterResistor: v.optional(n(R["driver.emitterResistor"]), d.driver.emitterResistor),
      emitterResistors: v.optional(mapField(n(R["driver.emitterResistors"]), 'must map output names to ohms, e.g. {"1a": 8200}'), {}),
      maxVceV: v.optional(n(R["driver.maxVceV"]), d.driver.maxVceV),
      maxPowerW: v.optional(n(R["driver.maxPowerW"]), d.driver.maxPowerW),
    }),
    d.driver,
  ),
  string: v.optional(
    objectField({
      dies: v.optional(n(R["string.dies"]), d.string.dies),
      is: v.optional(n(R["string.is"]), d.string.is),
      n: v.optional(n(R["string.n"]), d.string.n),
      targetA: v.optional(n(R["string.targetA"]), d.string.targetA),
      maxA: v.optional(n(R["string.maxA"]), d.string.maxA),
    }),
    d.string,
  ),
  supply: v.optional(
    objectField({
      volts: v.optional(n(R["supply.volts"]), d.supply.volts),
      minVolts: v.optional(n(R["supply.minVolts"]), d.supply.minVolts),
      maxVolts: v.optional(n(R["supply.maxVolts"]), d.supply.maxVolts),
    }),
    d.supply,
  ),
  tolerance: v.optional(
    objectField({
      resistorPct: v.optional(n(R["tolerance.resistorPct"]), d.tolerance.resistorPct),
      betaMin: v.optional(n(R["tolerance.betaMin"]), d.tolerance.betaMin),
      betaMax: v.optional(n(R["tolerance.betaMax"]), d.tolerance.betaMax),
      temperatureC: v.optional(
        v.tuple([n(R["tolerance.temperatureC"]), n(R["tolerance.temperatureC"])], gotMessage("must be [low, high] in °C")),
        d.tolerance.temperatureC as [number, number],
      ),
    }),
    d.tolerance,
  ),
});

/**
 * The checks that tie fields together: the supply range, the string's drop
 * against the lowest supply, the counter levels, the beta and temperature
 * ranges, the target against the rating, and the names of the per-output
 * emitter resistors.
 */
export function checkElectrical(e: ElectricalModel, cell: Cell, positions: number, problems: Problem[]): void {
  const at = (...p: string[]): string => fieldPath(["electrical", ...p]);
  const s = e.supply;
  if (!(s.minVolts <= s.volts && s.volts <= s.maxVolts)) {
    problems.push({
      path: at("supply"),
      message: `got minVolts ${s.minVolts}, volts ${s.volts}, maxVolts ${s.maxVolts}; needs minVolts <= volts <= maxVolts`,
    });
  }
  const vt = thermalVoltage(e.temperatureC);
  const stringV = e.string.dies * shockleyVoltage(e.string.targetA, e.string.is, e.string.n, vt);
  if (s.minVolts <= stringV) {
    problems.push({
      path: at("supply", "minVolts"),
      message: `${s.minVolts} V is below the ${stringV.toFixed(1)} V that ${e.string.dies} dies drop at the target current; raise the supply or use fewer dies`,
    });
  }
  if (e.counterOutput.high <= e.counterOutput.low) {
    problems.push({
      path: at("counterOutput", "high"),
      message: `got ${e.counterOutput.high} V; must be above counterOutput.low (${e.counterOutput.low} V) for source drive`,
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
  if (e.string.targetA > e.string.maxA) {
    problems.push({
      path: at("string", "targetA"),
      message: `got ${e.string.targetA} A; must not exceed string.maxA (${e.string.maxA} A)`,
    });
  }
  for (const name of Object.keys(e.driver.emitterResistors)) {
    const m = /^(\d+)(.+)$/.exec(name);
    const pos = m ? Number(m[1]) : NaN;
    if (!m || !(pos >= 1 && pos <= positions) || !cell.segments.includes(m[2] ?? "")) {
      problems.push({
        path: at("driver", "emitterResistors", name),
        message: `not an output of this display; outputs are named like "1${cell.segments[0] ?? "a"}" (position, then segment)`,
      });
    }
  }
}
