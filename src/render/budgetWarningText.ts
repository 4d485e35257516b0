/**
 * The budget's findings in words, for the command line, the web app and
 * budget.json alike. The core gives each finding's figures in SI; this is
 * where they become µA, mA, mW and volts.
 */
import type { BudgetWarning, UnappliedWhy } from "../core/budget/budgetTypes.ts";
import { hazardousVoltageText, MAINS_SUPPLY_TEXT } from "../core/budget/safety.ts";
import { microampsText, milliampsText, milliwatts, ohmsText, percent, voltsText } from "./units.ts";

const NOT_APPLIED: Readonly<Record<UnappliedWhy, string>> = {
  "turned-off": "the trim is turned off",
  "widens-spread": "the trim is not applied because it would widen the brightness spread",
  "moves-off-target": "the trim is not applied because it would move other strings further from the target",
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
    case "driver-saturation":
      return (
        `driver ${w.transistor} (${w.output}) saturates at the lowest supply (${voltsText(w.supplyV)}): ` +
        `its collector is ${voltsText(w.belowV)} below its base; raise the supply or use fewer dies`
      );
    case "corner-saturation":
      return `at the low corner a driver saturates (collector ${voltsText(w.belowV)} below its base); allow more supply headroom`;
    case "string-current":
      return `a string carries up to ${milliampsText(w.currentA)}, over its ${milliampsText(w.ratedA)} rating`;
    case "dim-segment": {
      const t = w.unappliedTrim;
      const trim = t
        ? `; the ${t.series} trim (a ${ohmsText(t.ohms)} emitter resistor) would bring it to ${microampsText(t.minA)}-${microampsText(t.maxA)}, but ${NOT_APPLIED[t.why]}`
        : "";
      return `${w.output} runs as low as ${microampsText(w.minA)}, more than ${w.windowPct} % under the ${microampsText(w.targetA)} target${trim}`;
    }
    case "corner-target":
      return (
        `over the tolerance corners the strings run from ${microampsText(w.minA)} to ${microampsText(w.maxA)}, ` +
        `outside ±${w.windowPct} % of the ${microampsText(w.targetA)} target (or over the rating, or saturating)`
      );
    case "brightness-spread":
      return spreadText(w);
    case "counter-sag":
      return `the counter sags most in ${w.line}: ${voltsText(w.sagV)} below its high level while sourcing ${microampsText(w.sourceCurrentA)}`;
  }
}

function spreadText(w: Extract<BudgetWarning, { code: "brightness-spread" }>): string {
  const spread = `string currents spread by ${percent(w.spreadPct)} % over the states`;
  const other = `${percent(w.otherSpreadPct)} %`;
  const trim = `the ${w.series} emitter trim`;
  const tail: Readonly<Record<typeof w.trim, string>> = {
    applied: ` with ${trim} (${other} with the project's emitter resistors)`,
    "widens-spread": `; ${trim} would widen that to ${other}, so it is not applied`,
    "moves-off-target": `; ${trim} would give ${other} but move strings further from the target, so it is not applied`,
    "turned-off": `; ${trim}, turned off, would give ${other}`,
    "no-change": `; ${trim} changes no resistor`,
  };
  return spread + tail[w.trim];
}
