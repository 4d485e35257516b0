/**
 * The checks across sections that the decode polarity needs: which counter
 * lines a polarity uses, and whether the driver can take them. A combination
 * with no consistent circuit is a problem that names both fields and says
 * which change gives one. Messages follow fieldRules.ts: what was received,
 * then the fix.
 */
import type { Problem } from "../result/result.ts";
import type { CounterSection, DriverKind, SynthesisOptions } from "./project.ts";

/**
 * Adds a problem for each combination of `counter.drive`, `counter.code`,
 * `synthesis.decode` and `electrical.driver.kind` that has no consistent
 * circuit:
 * - dark cells are decoded onto active-low lines (`nS<k>`), which a source-drive
 *   counter does not have;
 * - lit cells on active-low lines need a driver that turns on when its node is
 *   pulled low (a PNP high-side switch), which diodeloom does not model;
 * - a coded counter is decoded by AND gates on its stage lines, lit only;
 * - direct drive takes the segment current from the line itself, which a
 *   pulled-up node cannot give.
 *
 * @example
 * checkPolarity({ states: 4, drive: "source", code: "one-hot", codes: [] }, { ...synthesis, decode: "dark" }, "current-sink", problems);
 * // problems: [{ path: "synthesis.decode", message: 'got "dark" with "counter.drive": "source"; ...' }]
 */
export function checkPolarity(counter: CounterSection, synthesis: SynthesisOptions, driver: DriverKind, problems: Problem[]): void {
  const { decode } = synthesis;
  const drive = counter.drive;
  if (decode === "lit" && drive === "sink") {
    problems.push({
      path: "synthesis.decode",
      message: `got "lit" with "counter.drive": "sink"; lit cells on active-low lines need a driver that turns on when its node is pulled low (a PNP high-side switch), which diodeloom does not model; use "decode": "dark" (a pull-up on each output, diodes on its dark cells down to the nS lines) or "counter.drive": "complementary"`,
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
      message: `got "either" with "counter.drive": "sink"; a sink-drive counter has only active-low lines, and a lit-decoded output on them needs a PNP high-side switch, which diodeloom does not model; use "decode": "dark" or "counter.drive": "complementary"`,
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
