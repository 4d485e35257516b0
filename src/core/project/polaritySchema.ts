/**
 * The checks across sections that the decode polarity needs: which counter
 * lines a polarity uses, and whether the driver can take them. A combination
 * with no consistent circuit is a problem that names both fields and says
 * which change gives one. Messages follow fieldRules.ts: what was received,
 * then the fix.
 */
import type { Problem } from "../result/result.ts";
import { highSideHold } from "../spec/highSideHold.ts";
import type { CounterSection, ElectricalModel, SynthesisOptions } from "./project.ts";

/**
 * Adds a problem for each combination of `counter.drive`, `counter.code`,
 * `synthesis.decode` and `electrical.driver.kind` that has no consistent
 * circuit. With the NPN kinds and direct drive (on while the node is high):
 * - dark cells are decoded onto active-low lines (`nS<k>`), which a source-drive
 *   counter does not have;
 * - lit cells on active-low lines alone (sink drive) need a driver that turns
 *   on when its node is pulled low: the high-side switch;
 * - a coded counter is decoded by AND gates on its stage lines, lit only;
 * - direct drive takes the segment current from the line itself, which a
 *   pulled-up node cannot give.
 * With the high-side switch (a PNP, on while its node is pulled low):
 * - its lit cells are decoded onto the active-low lines, so it needs sink or
 *   complementary drive and a one-hot counter;
 * - its dark cells would be raised from the active-high lines through
 *   diodes, to below the segment supply, which leaves it on: `dark` is
 *   refused, and `either` decodes every output lit;
 * - the idle lines must hold it off: with the highest supply above their
 *   high level the node sits a diode drop above them (highSideHold.ts), and
 *   the collector current there must be within the ghost limit.
 *
 * @example
 * checkPolarity({ states: 4, drive: "source", code: "one-hot", codes: [] }, { ...synthesis, decode: "dark" }, electrical, problems);
 * // problems: [{ path: "synthesis.decode", message: 'got "dark" with "counter.drive": "source"; ...' }]
 */
export function checkPolarity(
  counter: CounterSection,
  synthesis: SynthesisOptions,
  electrical: ElectricalModel,
  problems: Problem[],
): void {
  const { decode } = synthesis;
  const drive = counter.drive;
  const driver = electrical.driver.kind;
  if (driver === "high-side-switch") {
    checkHighSide(counter, decode, electrical, problems);
    return;
  }
  if (decode === "lit" && drive === "sink") {
    problems.push({
      path: "synthesis.decode",
      message: `got "lit" with "counter.drive": "sink"; lit cells on active-low lines need a driver that turns on when its node is pulled low; set electrical.driver.kind to "high-side-switch" (a PNP), or use "decode": "dark" (a pull-up on each output, diodes on its dark cells down to the nS lines) or "counter.drive": "complementary"`,
    });
    return;
  }
  if (decode === "lit") return;
  if (counter.code !== "one-hot") {
    problems.push({
      path: "synthesis.decode",
      message: `got "${decode}" with "counter.code": "${counter.code}"; a coded counter is decoded by AND gates on its stage lines, which decode lit cells only; use "decode": "lit"`,
    });
    return;
  }
  if (drive === "source") {
    problems.push({
      path: "synthesis.decode",
      message: `got "${decode}" with "counter.drive": "source"; dark cells are decoded onto active-low lines (nS<k>), which a source-drive counter does not have; set counter.drive to "complementary" (or "sink"${decode === "either" ? ", then decode dark" : ""}) or use "decode": "lit"`,
    });
    return;
  }
  if (decode === "either" && drive === "sink") {
    problems.push({
      path: "synthesis.decode",
      message: `got "either" with "counter.drive": "sink"; a sink-drive counter has only active-low lines, on which an NPN driver takes dark cells only (lit cells there need "electrical.driver.kind": "high-side-switch"); use "decode": "dark" or "counter.drive": "complementary"`,
    });
    return;
  }
  if (driver === "direct") {
    problems.push({
      path: "electrical.driver.kind",
      message: `got "direct" with "synthesis.decode": "${decode}"; direct drive takes each segment's current from the counter line, and a dark-decoded output's node is held high only by its pull-up; choose a transistor driver (current-sink, low-side-switch or emitter-follower) or use "decode": "lit"`,
    });
  }
}

/** The combinations a high-side switch has a consistent circuit for (see `checkPolarity`). */
function checkHighSide(counter: CounterSection, decode: SynthesisOptions["decode"], e: ElectricalModel, problems: Problem[]): void {
  if (counter.code !== "one-hot") {
    problems.push({
      path: "electrical.driver.kind",
      message: `got "high-side-switch" with "counter.code": "${counter.code}"; a coded counter's AND gates raise the node of the outputs they select, and a high-side switch turns on when its node is pulled low; choose an NPN driver (current-sink, low-side-switch or emitter-follower)`,
    });
    return;
  }
  if (counter.drive === "source") {
    problems.push({
      path: "counter.drive",
      message: `got "source" with "electrical.driver.kind": "high-side-switch"; a high-side switch turns on when its node is pulled low, so its lit cells are decoded onto active-low lines (nS<k>), which a source-drive counter does not have; set counter.drive to "sink" or "complementary", or choose an NPN driver (current-sink, low-side-switch or emitter-follower)`,
    });
    return;
  }
  if (decode === "dark") {
    problems.push({
      path: "synthesis.decode",
      message: `got "dark" with "electrical.driver.kind": "high-side-switch"; a high-side switch is on while its node is low, so its dark cells would have to be raised to the segment supply by the active-high lines through diodes, which leave the node a diode drop (or more) below the counter's high level and the PNP on; use "decode": "lit" (a diode from each node to the nS line of each state that lights it)`,
    });
    return;
  }
  const hold = highSideHold(e);
  if (!hold.holds) {
    problems.push({
      path: "electrical.supply.maxVolts",
      message:
        `got ${hold.supplyV} V with the idle nS lines at ${hold.lineHighV} V (lowLine.high); a high-side switch's node is then held a diode drop above an idle line (${hold.nodeV.toFixed(2)} V), ` +
        `which leaves its emitter-base junction at ${hold.junctionV.toFixed(2)} V and ${(hold.collectorA * 1e6).toFixed(1)} µA in the segment, above the ghost limit of ${(hold.ghostA * 1e6).toFixed(1)} µA; ` +
        `lower the segment supply to the lines' high level, raise lowLine.high (a counter run from the segment supply), lower driver.baseEmitterResistor, or use an NPN driver with "decode": "dark"`,
    });
  }
}
