/**
 * An instrument's budget in words and as JSON (`diodeloom/instrument-budget@1`):
 * the supplies' worst totals over every combination of the decoders'
 * states, how they are bounded, and each decoder's budget as
 * `diodeloom/budget@3` has it. The command line prints it; the app's
 * instrument summary reads the same figures.
 */
import type { Budget } from "../core/budget/budgetTypes.ts";
import type { InstrumentBudget, SupplyCaseName, WorstTotal } from "../core/budget/instrumentBudget.ts";
import { budgetJsonValue } from "./budgetJson.ts";
import { milliamps, milliwatts } from "./units.ts";

const CASE_WORDS: Readonly<Record<SupplyCaseName, string>> = {
  nominal: "nominal values",
  low: "low corner",
  high: "high corner",
};

/** How many combinations of states the counters have: the product of their lengths, written exactly. */
export function combinationCount(states: readonly number[]): string {
  return states.reduce((a, n) => a * BigInt(n), 1n).toString();
}

/** How the totals are bounded, in one paragraph. */
export function boundText(ib: InstrumentBudget): string {
  const common =
    "The counters run independently, so any state of one may meet any state of another. The decoders share only the supplies, " +
    "ideal sources in the model, so under one set of conditions each decoder's draw depends on its own state alone, and the worst " +
    "total is the sum of each decoder's worst state: found without trying every combination.";
  return ib.bound === "per-case-sum"
    ? `${common} Every decoder has the same supplies and temperature at nominal and at each tolerance corner, so each case is summed and the largest case is the worst total, reached by the states named.`
    : `${common} The decoders' supplies or temperature ranges differ, so no corner is one set of conditions for all of them: the totals add each decoder's worst over nominal and both corners, a bound no combination exceeds.`;
}

function whereText(t: WorstTotal, names: readonly string[], bound: InstrumentBudget["bound"]): string {
  const states = names.map((n, i) => `${n} ${t.states[i] ?? ""}${bound === "sum-of-maxima" ? ` (${t.cases[i] ?? ""})` : ""}`).join(", ");
  return bound === "per-case-sum" ? `${CASE_WORDS[t.cases[0] ?? "nominal"]}; ${states}` : states;
}

/**
 * The totals section of `budget` on an instrument.
 *
 * @param stateCounts each decoder's number of counter states, in file order
 */
export function describeInstrumentTotals(ib: InstrumentBudget, stateCounts: readonly number[]): string {
  const names = ib.decoders;
  const L: string[] = [];
  L.push(
    `Instrument totals: ${names.length} decoders (${names.join(", ")}), ${stateCounts.join(" x ")} = ${combinationCount(stateCounts)} combinations of states`,
  );
  L.push(`  ${boundText(ib)}`);
  const row = (what: string, t: WorstTotal, unit: "mA" | "mW"): string =>
    `  ${what.padEnd(22)} ${(unit === "mA" ? milliamps(t.value) : milliwatts(t.value)).padStart(10)} ${unit}  (${whereText(t, names, ib.bound)})`;
  L.push(row("Segment supply current", ib.segment.currentA, "mA"));
  L.push(row("Segment supply power", ib.segment.powerW, "mW"));
  L.push(row("Logic supply current", ib.logic.currentA, "mA"));
  L.push(row("Logic supply power", ib.logic.powerW, "mW"));
  L.push(row("Both supplies, power", ib.totalPowerW, "mW"));
  L.push(
    `  Per case (each decoder in its worst state in that case${ib.bound === "per-case-sum" ? "" : "; the decoders' cases are not one set of conditions"}):`,
  );
  L.push(
    `    ${"case".padEnd(15)} ${"segment mA".padStart(10)} ${"segment mW".padStart(10)} ${"logic mA".padStart(9)} ${"logic mW".padStart(9)} ${"total mW".padStart(9)}`,
  );
  for (const c of ["nominal", "low", "high"] as const) {
    const t = ib.cases[c];
    L.push(
      `    ${CASE_WORDS[c].padEnd(15)} ${milliamps(t.segmentA).padStart(10)} ${milliwatts(t.segmentW).padStart(10)} ${milliamps(t.logicA).padStart(9)} ${milliwatts(t.logicW).padStart(9)} ${milliwatts(t.totalW).padStart(9)}`,
    );
  }
  L.push(
    `  Shares of the segment supply current: ${names.map((n, i) => `${n} ${milliamps(ib.segment.currentA.shares[i] ?? 0)} mA`).join(", ")}`,
  );
  L.push(`  Warnings: ${ib.warningCount === 0 ? "none" : `${ib.warningCount} in all, in the decoders' sections above`}`);
  return L.join("\n") + "\n";
}

/** `budget --json` on an instrument: the totals, how they are bounded, every case's draws, and each decoder's budget keyed by name. */
export function instrumentBudgetJsonText(ib: InstrumentBudget, budgets: readonly Budget[]): string {
  const { schema, title, decoders, bound, segment, logic, totalPowerW, warningCount, draws, cases } = ib;
  const doc = {
    schema,
    title,
    order: decoders,
    bound,
    boundText: boundText(ib),
    totals: { segment, logic, totalPowerW, warningCount, cases },
    draws: Object.fromEntries(Object.entries(draws).map(([c, ds]) => [c, Object.fromEntries(ds.map((d, i) => [decoders[i], d]))])),
    decoders: Object.fromEntries(budgets.map((b, i) => [decoders[i], budgetJsonValue(b)])),
  };
  return JSON.stringify(doc, null, 2) + "\n";
}
