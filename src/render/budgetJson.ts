/**
 * A budget as the JSON document `diodeloom/budget@3`: the core's figures in
 * SI, and every warning with its message in words (budgetWarningText.ts).
 */
import type { Budget } from "../core/budget/budgetTypes.ts";
import { warningText } from "./budgetWarningText.ts";

/**
 * The budget JSON, pretty-printed, with a final newline.
 *
 * @example
 * JSON.parse(budgetJsonText(budget)).warnings[0]; // { level: "danger", code: "hazardous-voltage", message: "Hazardous voltage: ...", supplyV: 110 }
 */
export function budgetJsonText(b: Budget): string {
  return JSON.stringify(budgetJsonValue(b), null, 2) + "\n";
}

/** The budget JSON as a value (an instrument's budget holds one per decoder). */
export function budgetJsonValue(b: Budget): Omit<Budget, "warnings"> & { readonly warnings: readonly object[] } {
  // level and code first, then the words, then the figures.
  const warnings = b.warnings.map((w) => {
    const { level, code, ...figures } = w;
    return { level, code, message: warningText(w), ...figures };
  });
  return { ...b, warnings };
}
