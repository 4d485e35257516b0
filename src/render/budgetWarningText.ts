/**
 * The budget's findings in words, for the command line, the web app and
 * budget.json alike. The core gives each finding's figures in SI; this is
 * where they become µA, mA, mW and volts.
 */
import type { BudgetWarning, SpreadCause, UnappliedWhy } from "../core/budget/budgetTypes.ts";
import { remedyText, shortOfText } from "./targetShortText.ts";
import { hazardousVoltageText, MAINS_SUPPLY_TEXT } from "../core/budget/safety.ts";
import { microampsText, milliampsText, milliwatts, ohmsText, percent, voltsText } from "./units.ts";

const NOT_APPLIED: Readonly<Record<UnappliedWhy, string>> = {
  "turned-off": "the trim is turned off",
  "widens-spread": "the trim is not applied because it would widen the brightness spread",
  "over-rating": "the trim is not applied because it would run a segment over its rating at the high corner",
  "no-help": "the trim is not applied because it would not bring the display nearer the target",
};

const CAUSE: Readonly<Record<SpreadCause, string>> = {
  "line-sag": "the active line's source resistance, shared by the segments lit together",
  "gate-sag": "the AND gate's pull-up, shared by the drivers of the outputs it feeds",
  "diode-depth": "the diode depth",
  "switch-unsaturated": "its switch leaving saturation",
};

/**
 * One finding as a sentence.
 *
 * @example
 * warningText({ level: "info", code: "counter-sag", line: "S8", sagV: 0.11, sourceCurrentA: 1.057e-4 });
 * // "the counter sags most in S8: 0.11 V below its high level while sourcing 105.7 µA"
 */
export function warningText(w: BudgetWarning): string {
  switch (w.code) {
    case "hazardous-voltage":
      return hazardousVoltageText(w.supplyV);
    case "mains-supply":
      return MAINS_SUPPLY_TEXT;
    case "diode-current":
      return `${w.diode} (${w.from} -> ${w.to}) carries ${milliampsText(w.currentA)}, over its ${milliampsText(w.ratedA)} rating`;
    case "diode-reverse":
      return `${w.diode} (${w.from} -> ${w.to}) sees ${voltsText(w.reverseV)} reverse, over its ${voltsText(w.ratedV)} rating`;
    case "driver-vce":
      return `driver ${w.transistor} (${w.output}) sees up to ${voltsText(w.vceV)} Vce, over its ${voltsText(w.ratedV)} rating`;
    case "driver-power":
      return `driver ${w.transistor} (${w.output}) dissipates up to ${milliwatts(w.powerW)} mW, over its ${milliwatts(w.ratedW, 0)} mW rating`;
    case "driver-current":
      return `driver ${w.transistor} (${w.output}) carries up to ${milliampsText(w.currentA)}, over its ${milliampsText(w.ratedA)} rating`;
    case "driver-saturation":
      return (
        `driver ${w.transistor} (${w.output}) saturates at the lowest supply (${voltsText(w.supplyV)}): ` +
        `its collector is ${voltsText(w.belowV)} below its base; raise the supply or put fewer LEDs in each segment`
      );
    case "corner-saturation":
      return `at the low corner a driver saturates (collector ${voltsText(w.belowV)} below its base); allow more supply headroom`;
    case "switch-unsaturated":
      if (w.forcedBeta === null) {
        return `switch ${w.transistor} (${w.output}) does not turn on at the low corner: it takes no base current; check the base resistor and the base-emitter resistor`;
      }
      return (
        `switch ${w.transistor} (${w.output}) is not saturated at the low corner: its forced beta Ic/Ib reaches ${w.forcedBeta.toFixed(0)}, ` +
        `not below the lowest beta ${w.betaMin}; give it more base current (a smaller base resistor; common practice is a forced beta of 10-20)`
      );
    case "segment-current":
      return `a segment carries up to ${milliampsText(w.currentA)}, over its ${milliampsText(w.ratedA)} rating`;
    case "line-current":
      return `counter line ${w.line} sources ${milliampsText(w.currentA)} in ${w.state}, more than the ${milliampsText(w.ratedA)} it may`;
    case "line-sink":
      return w.from === "switch-bases"
        ? `active-low line ${w.line} sinks ${milliampsText(w.currentA)} in ${w.state} from the bases and line pull-ups of the high-side switches it turns on, ` +
            `more than the ${milliampsText(w.ratedA)} it may; a larger driver.baseResistor lowers it, as long as every switch stays saturated at the low corner`
        : `counter line ${w.line} sinks ${milliampsText(w.currentA)} from the gate pull-ups it holds low in ${w.state}, more than the ${milliampsText(w.ratedA)} it may; a larger gatePullUp lowers it`;
    case "dark-network":
      return `the dark-decoded outputs' pull-ups and input network break ${w.where}; see the dark decode section of the budget`;
    case "ghost-segment":
      return (
        `${w.output} is unlit in ${w.state} but carries ${microampsText(w.currentA)}, above ${microampsText(w.limitA)} (the ghost limit); ` +
        `LEDs glow visibly at microamperes`
      );
    case "state-spread":
      return stateSpreadText(w);
    case "dim-segment": {
      const t = w.unappliedTrim;
      const trim = t
        ? `; the ${t.series} trim (${ohmsText(t.ohms)}) would bring it to ${currentText(t.minA)}-${currentText(t.maxA)}, but ${NOT_APPLIED[t.why]}`
        : "";
      return `${w.output} runs as low as ${currentText(w.minA)}, more than ${w.windowPct} % under the ${currentText(w.targetA)} target${trim}`;
    }
    case "corner-target":
      return (
        `over the tolerance corners the segments run from ${currentText(w.minA)} to ${currentText(w.maxA)} ` +
        `and miss the target (±${w.windowPct} % of ${currentText(w.targetA)}, under the rating, every driver in its working range): ${shortOfText(w.shortOf, w)}` +
        `${w.trimApplied ? "; the trim of the current-setting resistors is applied and does not bring them in" : ""}; ` +
        `what to change: ${remedyText(w.shortOf, w)}`
      );
    case "brightness-spread":
      return spreadText(w);
    case "states-unchecked":
      return statesUncheckedText(w);
    case "counter-sag":
      return `the counter sags most in ${w.line}: ${voltsText(w.sagV)} below its high level while sourcing ${currentText(w.sourceCurrentA)}`;
  }
}

/**
 * Which states a budget left unchecked, and what checks them.
 *
 * @example
 * statesUncheckedText({ level: "warn", code: "states-unchecked", checked: 10, states: 256, timeLimitMs: 20_000 });
 * // "only S0-S9 of the 256 states are checked, as many as the 20 s time limit's work covers; S10-S255 are not, and ..."
 */
function statesUncheckedText(w: Extract<BudgetWarning, { code: "states-unchecked" }>): string {
  const range = (a: number, b: number): string => (a === b ? `S${a}` : `S${a}-S${b}`);
  const seconds = Number((w.timeLimitMs / 1000).toPrecision(3));
  return (
    `only ${range(0, w.checked - 1)} of the ${w.states} states ${w.checked === 1 ? "is" : "are"} checked, as many as the ${seconds} s time limit's work covers; ` +
    `${range(w.checked, w.states - 1)} ${w.states - w.checked === 1 ? "is" : "are"} not, and every figure here is of the checked states alone: ` +
    `a longer time limit checks more of them`
  );
}

/** A current as a person reads it: µA below 1 mA, mA above. */
function currentText(amperes: number): string {
  return Math.abs(amperes) < 1e-3 ? microampsText(amperes) : milliampsText(amperes);
}

function stateSpreadText(w: Extract<BudgetWarning, { code: "state-spread" }>): string {
  const why = w.causes.map((c) => {
    if (c === "line-sag")
      return `${CAUSE[c]} (${w.litMin} lit in ${w.minState} against ${w.litMax} in ${w.maxState}: the line sits ${voltsText(w.sagDeltaV)} lower)`;
    if (c === "gate-sag")
      return `${CAUSE[c]} (${w.gate ?? "the gate"} in ${w.minState} sits ${voltsText(w.sagDeltaV)} lower than the node that drives it in ${w.maxState})`;
    if (c === "diode-depth")
      return `${CAUSE[c]} (${w.depthMin} diode${w.depthMin === 1 ? "" : "s"} from the line in ${w.minState}, ${w.depthMax} in ${w.maxState})`;
    return CAUSE[c];
  });
  return (
    `${w.output} is ${percent(w.spreadPct)} % dimmer in ${w.minState} than in ${w.maxState}; the cause: ${why.join("; and ")}. ` +
    (w.causes.includes("gate-sag")
      ? "The trim cannot remove it; a smaller gatePullUp or drivers that take less base current would"
      : "The trim cannot remove it; a stiffer counter line, fewer diodes on the path or a switch would")
  );
}

function spreadText(w: Extract<BudgetWarning, { code: "brightness-spread" }>): string {
  const spread = `segment currents spread by ${percent(w.spreadPct)} % over the states and segments`;
  const other = `${percent(w.otherSpreadPct)} %`;
  const trim = `the ${w.series} trim`;
  const tail: Readonly<Record<typeof w.trim, string>> = {
    applied: ` with ${trim} (${other} with the project's resistors)`,
    "widens-spread": `; ${trim} would widen that to ${other}, so it is not applied`,
    "over-rating": `; ${trim} would give ${other} but run a segment over its rating, so it is not applied`,
    "no-help": `; ${trim} would give ${other} without bringing the display nearer the target, so it is not applied`,
    "turned-off": `; ${trim}, turned off, would give ${other}`,
    "no-change": `; ${trim} changes no resistor`,
  };
  return spread + tail[w.trim];
}
