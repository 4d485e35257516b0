/**
 * What the budget says, once, of a counter whose lines carry no current it
 * could list: where no diode meets a line the counter sources from (a
 * sink-drive ring counter has none; a complementary one whose every output
 * is decoded dark wires only its active-low lines), a table of its lines
 * would be all zeros. The command's report and the app's Budget panel both
 * print this sentence instead.
 */
import type { Budget } from "../core/budget/budgetTypes.ts";
import type { CounterDrive } from "../core/project/project.ts";

/**
 * The sentence, or null where the budget has counter lines to list (a
 * high-side switch's are its active-low lines, listed with what they sink).
 *
 * @example
 * noSourceLineText(budget, "complementary");
 * // "Counter lines: none sources current (every output is decoded dark: the diodes meet only the active-low lines nS<k>; what each sinks is in the ghost check)"
 */
export function noSourceLineText(b: Pick<Budget, "kind" | "counterLines" | "dark">, drive: CounterDrive): string | null {
  if (b.kind === "high-side-switch" || Object.keys(b.counterLines).length > 0) return null;
  const dark = b.dark !== null;
  const why =
    drive === "sink"
      ? "a sink-drive counter has only its active-low lines nS<k>"
      : dark
        ? "every output is decoded dark: the diodes meet only the active-low lines nS<k>"
        : "no diode meets a counter line: every segment is lit in every state or in none";
  return `Counter lines: none sources current (${why}${dark ? "; what each sinks is in the ghost check" : ""})`;
}
