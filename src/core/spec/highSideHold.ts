/**
 * Whether the idle active-low lines hold a high-side switch off.
 *
 * A lit-decoded output of a high-side switch (a PNP, emitter on the segment
 * supply) is a node with a diode to the line `nS<k>` of each state that
 * lights it (anode at the node), its pull-up to the segment supply, and the
 * driver's base resistor up to the base, which the base-emitter resistor
 * ties to the emitter. In a state that leaves it dark every one of its lines
 * idles at `lowLine.high`. Where the supply is above that level, current
 * flows from the supply through the pull-up, and through the base-emitter
 * resistor, the junction and the base resistor, into the node and down a
 * diode into the idle line: the node sits one diode drop above the line,
 * and the junction's share of the difference turns the PNP partly on. The
 * output stays dark when that collector current is within the ghost limit.
 *
 * The estimate is on the safe side: the highest supply (`supply.maxVolts`),
 * one diode (the shortest path; a bus adds a drop), and the idle line taken
 * stiff (its resistance would lift it further). The budget then checks every
 * state at both tolerance corners with the full circuit.
 */
import type { ElectricalModel } from "../project/project.ts";
import { shockleyVoltage, thermalVoltage } from "../circuit/physics.ts";

export interface HighSideHold {
  /** The supply the estimate takes (the highest), volts. */
  readonly supplyV: number;
  /** The idle line's level, volts. */
  readonly lineHighV: number;
  /** The node's level, one diode drop above the idle line (or at the supply when it is not above the line), volts. */
  readonly nodeV: number;
  /** The PNP's emitter-base voltage, volts. */
  readonly junctionV: number;
  /** Its collector current, amperes. */
  readonly collectorA: number;
  /** The ghost limit the collector current is held to, amperes. */
  readonly ghostA: number;
  /** True when the collector current is within the ghost limit. */
  readonly holds: boolean;
}

/**
 * Works out how far the idle active-low lines leave a high-side switch on.
 *
 * @example
 * highSideHold(electricalOf({ preset: "bench-5v-high-side" })).holds; // true: a 5 V supply, lines idling at 5 V
 */
export function highSideHold(e: ElectricalModel): HighSideHold {
  const vt = thermalVoltage(e.temperatureC);
  const supplyV = e.supply.maxVolts;
  const lineHighV = e.lowLine.high;
  const ghostA = e.ghostFraction * e.segment.targetA;
  const dr = e.driver;
  const d = e.diode;
  const rbe = dr.baseEmitterResistor ?? Infinity;
  const vf = (i: number): number => (i <= 0 ? 0 : shockleyVoltage(i, d.is, d.n, vt) + i * d.rs);
  const collector = (veb: number): number => dr.is * Math.expm1(veb / vt);
  /** The node's level when the junction sits at `veb`, and what then flows into the idle line. */
  const at = (veb: number): { nodeV: number; lineA: number } => {
    const baseA = collector(veb) / dr.betaF + veb / rbe;
    const nodeV = supplyV - veb - baseA * dr.baseResistor;
    return { nodeV, lineA: baseA + (supplyV - nodeV) / e.pullDown };
  };
  if (supplyV <= lineHighV) return { supplyV, lineHighV, nodeV: supplyV, junctionV: 0, collectorA: 0, ghostA, holds: true };
  // The node falls and the diode's drop grows as the junction opens: bisect for where they meet.
  let lo = 0;
  let hi = supplyV - lineHighV;
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    const x = at(mid);
    if (x.nodeV - lineHighV - vf(x.lineA) > 0) lo = mid;
    else hi = mid;
  }
  const junctionV = (lo + hi) / 2;
  const collectorA = collector(junctionV);
  return { supplyV, lineHighV, nodeV: at(junctionV).nodeV, junctionV, collectorA, ghostA, holds: collectorA <= ghostA };
}
