/**
 * The electrical presets: complete, coherent sets of values a project's
 * `electrical.preset` names, and the format-1 defaults a migrated file keeps.
 *
 * Every value is ours, from common practice and datasheet-typical parts
 * (a general-purpose small-signal NPN and PNP, a small-signal silicon switching
 * diode, red and InGaN LED dies); docs/electrical-model.md states each with
 * its source (docs/sources.md) or marks it as common practice. None is one
 * particular build's numbers.
 */
import type { ElectricalModel, PresetName } from "./project.ts";

/** What a preset is for, in a line, for the app's picker and the docs. */
export interface PresetInfo {
  readonly name: PresetName;
  readonly label: string;
}

/** A red indicator LED die: about 2.0 V at 10 mA (1.91 V at 2 mA, 2.07 V at 20 mA). */
const RED_LED = { is: 2e-19, n: 2, rs: 2 } as const;
/** An InGaN die: about 2.86 V at 1 mA (the format-1 fit). */
const INGAN_DIE = { is: 1e-27, n: 2, rs: 0 } as const;
/** A small-signal silicon switching diode: about 0.61 V at 1 mA, 0.72 V at 10 mA. */
const MATRIX_DIODE = { is: 4e-9, n: 1.9, rs: 0, maxForwardA: 0.1, maxReverseV: 75 } as const;
/** A general-purpose small-signal NPN (40 V, 0.5 W, 100 mA; hFE 100-300 at 10 mA). */
const SMALL_NPN = { is: 1e-14, betaF: 150, betaR: 3, maxVceV: 40, maxPowerW: 0.5, maxCollectorA: 0.1 } as const;
/** The same class of part as a PNP (40 V, 0.5 W, 100 mA; hFE 100-300 at 10 mA). */
const SMALL_PNP = { is: 1e-14, betaF: 150, betaR: 3, maxVceV: 40, maxPowerW: 0.5, maxCollectorA: 0.1 } as const;
/** A regulated 5 V rail, ±5 %. */
const RAIL_5V = { volts: 5, minVolts: 4.75, maxVolts: 5.25 } as const;
/**
 * A counter stage built from discrete transistors on a 5 V rail: its active
 * line is the rail through the stage's 470 Ω collector load, an idle line
 * the saturated transistor's 0.1 V. It may source half its short-circuit
 * current (5 mA), so that it still reads high to the next stage. Its idle
 * line sits behind the saturated transistor's few tens of ohms (20 Ω, a
 * small-signal NPN's Vce(sat) over its collector current, common practice).
 */
const DISCRETE_COUNTER = { high: 5, low: 0.1, resistance: 470, lowResistance: 20, maxCurrentA: 0.005 } as const;
/**
 * Pull-up of every AND gate node of a coded counter's decoder, ohms (a value
 * of diodeloom from common practice): high enough that a counter line held
 * low by a few gates stays low, low enough that a gate whose inputs are all
 * high still gives its drivers their base current.
 */
const GATE_PULL_UP = 4700;
/**
 * The same stage's complementary output, an active-low line: the stage's
 * saturated transistor (about 0.1 V behind some 20 Ω) when its state is on,
 * the 5 V rail through the collector load otherwise. It may sink 5 mA on top
 * of its own load current (common practice, no source).
 */
const DISCRETE_LOW_LINE = { low: 0.1, high: 5, resistance: 20, maxCurrentA: 0.005 } as const;
const TOLERANCE = { resistorPct: 5, betaMin: 100, betaMax: 300, temperatureC: [0, 50] as const } as const;

const base = {
  temperatureC: 27,
  ghostFraction: 0.01,
  counterOutput: DISCRETE_COUNTER,
  lowLine: DISCRETE_LOW_LINE,
  logicSupply: { volts: 5 },
  diode: MATRIX_DIODE,
  pullDown: 47_000,
  gatePullUp: GATE_PULL_UP,
  tolerance: TOLERANCE,
} as const;

/** The presets, the default (`bench-5v-switch`) first. */
export const ELECTRICAL_PRESETS: Readonly<Record<PresetName, ElectricalModel>> = {
  "bench-5v-switch": {
    ...base,
    preset: "bench-5v-switch",
    driver: {
      ...SMALL_NPN,
      kind: "low-side-switch",
      emitterResistor: 220,
      emitterResistors: {},
      baseResistor: 3300,
      baseEmitterResistor: 47_000,
    },
    segment: { leds: 1, ...RED_LED, seriesResistor: 300, seriesResistors: {}, targetA: 0.01, maxA: 0.02 },
    supply: RAIL_5V,
  },
  "panel-12v-sink": {
    ...base,
    preset: "panel-12v-sink",
    pullDown: 100_000,
    driver: {
      ...SMALL_NPN,
      kind: "current-sink",
      emitterResistor: 180,
      emitterResistors: {},
      baseResistor: 0,
      baseEmitterResistor: null,
    },
    segment: { leds: 3, ...RED_LED, seriesResistor: 0, seriesResistors: {}, targetA: 0.015, maxA: 0.025 },
    supply: { volts: 12, minVolts: 11.4, maxVolts: 12.6 },
    // A sink's current is as good as its emitter resistor: 1 % metal film.
    tolerance: { ...TOLERANCE, resistorPct: 1 },
  },
  "cathode-5v-follower": {
    ...base,
    preset: "cathode-5v-follower",
    pullDown: 100_000,
    driver: {
      ...SMALL_NPN,
      kind: "emitter-follower",
      emitterResistor: 220,
      emitterResistors: {},
      baseResistor: 0,
      baseEmitterResistor: null,
    },
    segment: { leds: 1, ...RED_LED, seriesResistor: 110, seriesResistors: {}, targetA: 0.01, maxA: 0.02 },
    supply: RAIL_5V,
  },
  "bench-5v-high-side": {
    ...base,
    preset: "bench-5v-high-side",
    // Each line's pull-up to the segment supply, with Rbe holding the PNP off.
    pullDown: 100_000,
    driver: {
      ...SMALL_PNP,
      kind: "high-side-switch",
      emitterResistor: 220,
      emitterResistors: {},
      // Seven lit segments' base currents stay within the active-low line's 5 mA.
      baseResistor: 6800,
      baseEmitterResistor: 10_000,
    },
    segment: { leds: 1, ...RED_LED, seriesResistor: 300, seriesResistors: {}, targetA: 0.01, maxA: 0.02 },
    supply: RAIL_5V,
  },
  "line-direct": {
    ...base,
    preset: "line-direct",
    pullDown: 100_000,
    // A stage with an emitter-follower output, stiff enough to light segments itself.
    counterOutput: { high: 5, low: 0.1, resistance: 22, lowResistance: 20, maxCurrentA: 0.025 },
    driver: {
      ...SMALL_NPN,
      kind: "direct",
      emitterResistor: 220,
      emitterResistors: {},
      baseResistor: 0,
      baseEmitterResistor: null,
    },
    segment: { leds: 1, ...RED_LED, seriesResistor: 820, seriesResistors: {}, targetA: 0.002, maxA: 0.02 },
    supply: RAIL_5V,
  },
  "string-hv-sink": {
    ...base,
    preset: "string-hv-sink",
    pullDown: 100_000,
    driver: {
      is: 1e-14,
      betaF: 100,
      betaR: 3,
      maxVceV: 300,
      maxPowerW: 0.625,
      maxCollectorA: 0.5,
      kind: "current-sink",
      emitterResistor: 3300,
      emitterResistors: {},
      baseResistor: 0,
      baseEmitterResistor: null,
    },
    segment: { leds: 22, ...INGAN_DIE, seriesResistor: 0, seriesResistors: {}, targetA: 0.001, maxA: 0.015 },
    supply: { volts: 80, minVolts: 72, maxVolts: 88 },
    tolerance: { ...TOLERANCE, betaMin: 40, betaMax: 200 },
  },
};

/** The preset a project without an `electrical` section, or without a `preset`, gets. */
export const DEFAULT_PRESET: PresetName = "bench-5v-switch";

/** Every preset's name and one line on what it is, in the picker's order. */
export const PRESET_INFO: readonly PresetInfo[] = [
  { name: "bench-5v-switch", label: "5 V common-anode display, one red LED per segment at 10 mA, low-side NPN switches" },
  { name: "panel-12v-sink", label: "12 V display, three red LEDs per segment at 15 mA, NPN constant-current sinks" },
  { name: "cathode-5v-follower", label: "5 V common-cathode display, one red LED per segment at 10 mA, NPN emitter followers" },
  {
    name: "bench-5v-high-side",
    label: "5 V common-cathode display on active-low counter lines, one red LED per segment at 10 mA, PNP high-side switches",
  },
  { name: "line-direct", label: "5 V display driven straight from the counter lines, one red LED per segment at 2 mA" },
  { name: "string-hv-sink", label: "80 V display of 22-die LED strings at 1 mA, high-voltage NPN sinks (hazardous voltage)" },
];

export const PRESET_NAMES: readonly PresetName[] = PRESET_INFO.map((p) => p.name);

/**
 * The defaults of format 1 (`diodeloom/project@1`): a format-1 file's
 * `electrical` section keeps meaning what it meant, an NPN current sink under
 * a long string at 100 V with these values for what it leaves out. The
 * fields format 1 did not have take values that keep that circuit:
 * no collector resistor, LED dies without series resistance, the logic
 * supply (the tie-on net) at the counter's high level.
 */
export const FORMAT1_ELECTRICAL: ElectricalModel = {
  preset: null,
  temperatureC: 27,
  ghostFraction: 0.01,
  counterOutput: { high: 2.4, low: 0, resistance: 1000, lowResistance: 1000, maxCurrentA: 0.0004 },
  // Format 1 knows only source drive; these are never used by its files.
  lowLine: { low: 0, high: 2.4, resistance: 20, maxCurrentA: 0.0004 },
  logicSupply: { volts: 2.4 },
  diode: MATRIX_DIODE,
  pullDown: 100_000,
  gatePullUp: GATE_PULL_UP,
  driver: {
    kind: "current-sink",
    is: 1e-14,
    betaF: 150,
    betaR: 3,
    emitterResistor: 10_000,
    emitterResistors: {},
    baseResistor: 0,
    baseEmitterResistor: null,
    maxVceV: 300,
    maxPowerW: 0.5,
    maxCollectorA: 0.5,
  },
  segment: { leds: 19, is: 1e-27, n: 2, rs: 0, seriesResistor: 0, seriesResistors: {}, targetA: 0.00014, maxA: 0.015 },
  supply: { volts: 100, minVolts: 90, maxVolts: 110 },
  tolerance: { resistorPct: 5, betaMin: 80, betaMax: 300, temperatureC: [0, 50] },
};
