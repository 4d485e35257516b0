/**
 * Tolerance corners: the electrical model pushed to the ends of its
 * tolerances, so that the budget can say how low and how high a segment
 * current can go, whatever the driver kind.
 *
 * Temperature relations (textbook; named so that a reader can check them):
 * - thermal voltage VT = kT/q with the exact SI constants;
 * - silicon saturation current as SPICE scales it,
 *   Is(T) = Is(T0) (T/T0)^(XTI/N) exp((T/T0 - 1) EG / (N VT(T))), with the
 *   SPICE defaults EG = 1.11 eV and XTI = 3 (matrix diodes with their N,
 *   driver transistors with N = 1); this gives the familiar fall of about
 *   2 mV per °C of a silicon junction at constant current (Sedra and Smith,
 *   Microelectronic Circuits);
 * - LED dies: no temperature model is given for them, so each die's forward
 *   voltage at the target current moves by that same -2 mV per °C, and Is is
 *   set to match;
 * - beta: not scaled with temperature (SPICE's XTB = 0); the beta range
 *   `tolerance.betaMin`..`betaMax` stands for spread and temperature alike.
 */
import { currentOhmsOf, currentRole, type CircuitModel } from "../matrix/designators.ts";
import { shockleyVoltage, thermalVoltage, ZERO_CELSIUS_K } from "../circuit/physics.ts";
import type { ElectricalModel } from "../project/project.ts";

/** SPICE default energy gap for silicon, electron-volts. */
export const SILICON_EG_EV = 1.11;
/** SPICE default saturation-current temperature exponent. */
export const SILICON_XTI = 3;
/** Junction voltage change at constant current, volts per kelvin (about -2 mV/°C). */
export const JUNCTION_TEMPCO_V_PER_K = -0.002;

/** A junction's saturation current `isA` (amperes), which holds at `fromC`, and its emission coefficient `n`. */
export interface JunctionAt {
  readonly isA: number;
  readonly n: number;
  readonly fromC: number;
}

/**
 * Saturation current at `toC` of a junction, scaled as SPICE does, with
 * SPICE's silicon defaults EG = 1.11 eV and XTI = 3 unless given.
 *
 * @example
 * siliconSaturationCurrent({ isA: 1e-14, n: 1, fromC: 27 }, 50); // about 1.5e-13
 */
export function siliconSaturationCurrent(j: JunctionAt & { readonly egEv?: number; readonly xti?: number }, toC: number): number {
  const { isA, n, fromC, egEv = SILICON_EG_EV, xti = SILICON_XTI } = j;
  const ratio = (toC + ZERO_CELSIUS_K) / (fromC + ZERO_CELSIUS_K);
  return isA * Math.exp((ratio - 1) * (egEv / (n * thermalVoltage(toC))) + (xti / n) * Math.log(ratio));
}

/**
 * Saturation current at `toC` of an LED die, chosen so that its forward
 * voltage at `atA` amperes moves by -2 mV per °C from its value at `fromC`.
 *
 * @example
 * ledSaturationCurrent({ isA: 1e-27, n: 2, fromC: 27, atA: 1.4e-4 }, 50);
 */
export function ledSaturationCurrent(die: JunctionAt & { readonly atA: number }, toC: number): number {
  const { isA, n, fromC, atA } = die;
  const v0 = shockleyVoltage(atA, isA, n, thermalVoltage(fromC));
  const v1 = v0 + JUNCTION_TEMPCO_V_PER_K * (toC - fromC);
  return atA / Math.expm1(v1 / (n * thermalVoltage(toC)));
}

export type CornerName = "low" | "high";

/** What a corner changes. */
export interface CornerConditions {
  readonly name: CornerName;
  readonly supplyV: number;
  readonly temperatureC: number;
  readonly betaF: number;
  /**
   * Factors applied to the resistors' nominal values: `currentFactor` to
   * the resistors in the segment's path (emitter, series and base
   * resistors), `shuntFactor` to those that take current away from it
   * (pull-downs, base-emitter resistors). A dark-decoded output's pull-up
   * and divider are in the lit segment's path (`currentFactor`).
   */
  readonly currentFactor: number;
  readonly shuntFactor: number;
  readonly counterFactor: number;
}

/**
 * The two corners. `low` has everything that lowers a segment current: the
 * lowest supply, the emitter, series, base and counter resistances at
 * +tolerance (and a coded counter's gate pull-ups, the active-low lines'
 * resistance and a dark-decoded output's pull-up and divider), pull-downs and base-emitter resistors at -tolerance (more
 * current away from the base, a bigger drop), the lowest beta (the weakest
 * switch) and the lowest temperature (higher junction drops). `high` is the
 * mirror image.
 */
export function cornerConditions(e: ElectricalModel): readonly [CornerConditions, CornerConditions] {
  const t = e.tolerance.resistorPct / 100;
  const [cold, hot] = e.tolerance.temperatureC;
  return [
    {
      name: "low",
      supplyV: e.supply.minVolts,
      temperatureC: cold,
      betaF: e.tolerance.betaMin,
      currentFactor: 1 + t,
      shuntFactor: 1 - t,
      counterFactor: 1 + t,
    },
    {
      name: "high",
      supplyV: e.supply.maxVolts,
      temperatureC: hot,
      betaF: e.tolerance.betaMax,
      currentFactor: 1 - t,
      shuntFactor: 1 + t,
      counterFactor: 1 - t,
    },
  ];
}

/**
 * The electrical model at a corner. The resistors that set the current,
 * including any in `design`, are written out per output so the corner's
 * factor applies to each.
 *
 * @param outputs the driven outputs, to write their resistors out
 */
export function cornerModel(
  e: CircuitModel,
  c: CornerConditions,
  outputs: readonly string[],
  design?: ReadonlyMap<string, number>,
): CircuitModel {
  const t0 = e.temperatureC;
  const perOutput: Record<string, number> = {};
  for (const o of outputs) perOutput[o] = currentOhmsOf(e, o, design) * c.currentFactor;
  const sink = currentRole(e.driver.kind) === "emitter";
  const sinkSeries: Record<string, number> = {};
  if (sink) for (const [o, ohms] of Object.entries(e.segment.seriesResistors)) sinkSeries[o] = ohms * c.currentFactor;
  const net = e.darkNetwork;
  return {
    ...e,
    ...(net === undefined
      ? {}
      : {
          darkNetwork: {
            ...net,
            pullUpOhms: net.pullUpOhms * c.currentFactor,
            dividerOhms: net.dividerOhms === null ? null : net.dividerOhms * c.currentFactor,
            dividerLowerOhms: net.dividerLowerOhms === null ? null : net.dividerLowerOhms * c.shuntFactor,
          },
        }),
    lowLine: { ...e.lowLine, resistance: e.lowLine.resistance * c.counterFactor },
    temperatureC: c.temperatureC,
    counterOutput: { ...e.counterOutput, resistance: e.counterOutput.resistance * c.counterFactor },
    diode: { ...e.diode, is: siliconSaturationCurrent({ isA: e.diode.is, n: e.diode.n, fromC: t0 }, c.temperatureC) },
    pullDown: e.pullDown * c.shuntFactor,
    // A gate's pull-up drives its outputs like a counter line's source resistance.
    gatePullUp: e.gatePullUp * c.counterFactor,
    driver: {
      ...e.driver,
      is: siliconSaturationCurrent({ isA: e.driver.is, n: 1, fromC: t0 }, c.temperatureC),
      betaF: c.betaF,
      emitterResistor: e.driver.emitterResistor * c.currentFactor,
      emitterResistors: sink ? perOutput : e.driver.emitterResistors,
      baseResistor: e.driver.baseResistor * c.currentFactor,
      baseEmitterResistor: e.driver.baseEmitterResistor === null ? null : e.driver.baseEmitterResistor * c.shuntFactor,
    },
    segment: {
      ...e.segment,
      is: ledSaturationCurrent({ isA: e.segment.is, n: e.segment.n, fromC: t0, atA: e.segment.targetA }, c.temperatureC),
      seriesResistor: e.segment.seriesResistor * c.currentFactor,
      seriesResistors: sink ? sinkSeries : perOutput,
    },
    supply: { ...e.supply, volts: c.supplyV },
  };
}
