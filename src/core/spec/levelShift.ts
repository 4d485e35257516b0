/**
 * The level-shift arithmetic of a dark-decoded output.
 *
 * A dark-decoded output node is pulled up by a resistor and pulled down
 * through diodes to an active-low counter line. Pulled down, it does not sit
 * at 0 V: it sits at the line's low level (its open-circuit low plus the drop
 * across its resistance) plus one forward drop for every diode on the path.
 * Two drops are already more than an NPN's base-emitter turn-on voltage. As
 * in diode-transistor logic, diodes in series with the driver's input take
 * the surplus off. Their current is the base's bleed: a switch's base-emitter
 * resistor, or else the pull-down (`electrical.pullDown`) that moves from the
 * node to the driver's input. The chain from the node is: the shift diodes,
 * the driver's base resistor (a switch's, a follower's), the base with its
 * bleed to ground, the junction, and a sink's emitter resistor. The output
 * stays dark when the collector current where that chain meets the node's
 * voltage is within the ghost limit.
 *
 * The estimate is on the safe side: a follower's emitter load is left out
 * (it would only lower the current), the path is the deepest the depth limit
 * allows, and every pull-up of the busiest line sinks its current through the
 * line's resistance at once.
 */
import type { ElectricalModel } from "../project/project.ts";
import { shockleyVoltage, thermalVoltage } from "../circuit/physics.ts";

/** Most level-shift diodes tried before dark decode is called impossible. */
export const MAX_LEVEL_SHIFT_DIODES = 4;

/** One number of shift diodes and where it leaves the driver. */
export interface LevelShiftStep {
  readonly diodes: number;
  /** The driver's base-emitter voltage, volts. */
  readonly junctionV: number;
  /** Its collector current, amperes. */
  readonly collectorA: number;
}

export interface LevelShift {
  /** Level-shift diodes in series with each dark-decoded output's driver input; null when even the most tried is not enough. */
  readonly diodes: number | null;
  /** Pull-up current of one output taken as the design value, amperes: the line's rating shared by the outputs it pulls down at once. */
  readonly pullUpA: number;
  /** The active-low line's level with every pull-up of its busiest state on it, volts. */
  readonly lineLowV: number;
  /** The node's level pulled down through `depth` diodes, volts. */
  readonly nodeLowV: number;
  /** Per number of shift diodes, 0 to MAX_LEVEL_SHIFT_DIODES. */
  readonly steps: readonly LevelShiftStep[];
  /** The ghost limit the collector current is held to, amperes. */
  readonly ghostA: number;
}

/**
 * Works out how many level-shift diodes a dark-decoded output needs.
 *
 * @param e the electrical model
 * @param depth most diodes on a pull-down path (the depth limit)
 * @param pulledPerLine most outputs one active-low line pulls down at once
 *
 * @example
 * levelShift(project.electrical, 2, 5).diodes; // 2 on the 5 V switch preset
 */
export function levelShift(e: ElectricalModel, depth: number, pulledPerLine: number): LevelShift {
  const vt = thermalVoltage(e.temperatureC);
  const line = e.lowLine;
  const outputs = Math.max(1, pulledPerLine);
  const pullUpA = line.maxCurrentA / outputs;
  const lineLowV = line.low + line.resistance * pullUpA * outputs;
  const d = e.diode;
  const vf = (i: number): number => (i <= 0 ? 0 : shockleyVoltage(i, d.is, d.n, vt) + i * d.rs);
  const nodeLowV = lineLowV + depth * vf(pullUpA);
  const dr = e.driver;
  const ghostA = e.ghostFraction * e.segment.targetA;
  const collector = (vbe: number): number => dr.is * Math.expm1(vbe / vt);
  const isSwitch = dr.kind === "low-side-switch";
  const bleed = isSwitch && dr.baseEmitterResistor !== null ? dr.baseEmitterResistor : e.pullDown;
  const series = isSwitch || dr.kind === "emitter-follower" ? dr.baseResistor : 0;
  const emitter = dr.kind === "current-sink" ? dr.emitterResistor : 0;
  /** The node voltage at which the junction sits at `vbe`, with `s` shift diodes. */
  const nodeFor = (vbe: number, s: number): number => {
    const ic = collector(vbe);
    const ib = ic / dr.betaF;
    const baseV = vbe + (ic + ib) * emitter;
    const chainA = ib + baseV / bleed;
    return baseV + chainA * series + s * vf(chainA);
  };
  const steps: LevelShiftStep[] = [];
  for (let s = 0; s <= MAX_LEVEL_SHIFT_DIODES; s++) {
    const junctionV = solveJunction(nodeLowV, (vbe) => nodeFor(vbe, s));
    steps.push({ diodes: s, junctionV, collectorA: collector(junctionV) });
  }
  const enough = steps.find((x) => x.collectorA <= ghostA);
  return { diodes: enough?.diodes ?? null, pullUpA, lineLowV, nodeLowV, steps, ghostA };
}

/** The junction voltage at which the chain needs exactly `nodeV` (bisection; `nodeFor` rises with the junction voltage). */
function solveJunction(nodeV: number, nodeFor: (vbe: number) => number): number {
  let lo = 0;
  let hi = Math.max(0, nodeV);
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (nodeFor(mid) > nodeV) hi = mid;
    else lo = mid;
  }
  return (lo + hi) / 2;
}
