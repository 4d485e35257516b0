/**
 * The instrument summary's totals: the parts summed over the decoders
 * (summaryRun.ts gives each decoder's), and the supplies' worst case from
 * the core's instrument budget (core/budget/instrumentBudget.ts): the sum
 * of each decoder's worst state, which every combination of the
 * independent counters' states stays within, at nominal and both
 * tolerance corners, as `diodeloom budget` gives it.
 */
import type { TotalBound } from "../../core/budget/instrumentBudget.ts";
import type { DecoderSummary, InstrumentSummary } from "../workers/summaryRun.ts";
import { logicDrawClause } from "../../render/logicDrawText.ts";

/** The supplies' worst totals, SI, with each decoder's share in the list's order. */
export interface SupplyTotals {
  readonly segmentA: number;
  readonly logicA: number;
  /** Both supplies together. */
  readonly powerW: number;
  readonly bound: TotalBound;
  readonly shares: readonly { readonly segmentA: number; readonly logicA: number; readonly powerW: number }[];
}

export interface InstrumentTotals {
  readonly decoders: number;
  readonly diodes: number;
  readonly transistors: number;
  readonly resistors: number;
  /** Decoders still being worked out: the part totals leave them out. */
  readonly computing: number;
  /** Decoders with no figures (invalid, no matrix): the part totals leave them out. */
  readonly failed: number;
  /** The supplies' totals, or null while the instrument's budget is not known. */
  readonly supply: SupplyTotals | null;
  /** Why there are no supply totals (a decoder without a budget, a failed solve), or null. */
  readonly supplyProblem: string | null;
}

/**
 * @example
 * instrumentTotals([{ status: "done", figures }, { status: "computing" }], { status: "computing" }).computing; // 1
 */
export function instrumentTotals(rows: readonly DecoderSummary[], ib: InstrumentSummary): InstrumentTotals {
  let diodes = 0;
  let transistors = 0;
  let resistors = 0;
  let computing = 0;
  let failed = 0;
  for (const r of rows) {
    if (r.status === "computing") computing++;
    else if (r.status === "failed") failed++;
    else {
      diodes += r.figures.diodes;
      transistors += r.figures.transistors;
      resistors += r.figures.resistors;
    }
  }
  let supply: SupplyTotals | null = null;
  let supplyProblem: string | null = null;
  if (ib.status === "failed") supplyProblem = ib.message;
  else if (ib.status === "done" && !ib.result.ok) {
    const e = ib.result.error;
    supplyProblem = `${e.decoder ? `${e.decoder}: ` : ""}${e.message}`;
  } else if (ib.status === "done" && ib.result.ok) {
    const b = ib.result.value;
    supply = {
      segmentA: b.segment.currentA.value,
      logicA: b.logic.currentA.value,
      powerW: b.totalPowerW.value,
      bound: b.bound,
      shares: b.decoders.map((_, i) => ({
        segmentA: b.segment.currentA.shares[i] ?? 0,
        logicA: b.logic.currentA.shares[i] ?? 0,
        powerW: b.totalPowerW.shares[i] ?? 0,
      })),
    };
  }
  return { decoders: rows.length, diodes, transistors, resistors, computing, failed, supply, supplyProblem };
}

/** What the summary says of totals that leave something out, or null when they are complete. */
export function totalsCaveat(t: InstrumentTotals): string | null {
  const parts: string[] = [];
  if (t.computing > 0) parts.push(`${t.computing} of ${t.decoders} decoders still being worked out`);
  if (t.failed > 0) parts.push(`${t.failed} with no figures (left out)`);
  if (t.computing === 0 && t.supply === null && t.supplyProblem === null) parts.push("the supplies' totals still being worked out");
  if (t.supplyProblem !== null) parts.push(`no supply totals: ${t.supplyProblem}`);
  return parts.length === 0 ? null : `Partial totals: ${parts.join("; ")}.`;
}

/**
 * Each decoder's note on its logic supply figure, where the figure needs
 * one (a decoder on high-side switches draws none: logicDrawText.ts), in
 * the list's order.
 *
 * @example
 * logicNotes([{ status: "done", figures }], ["round"]); // ["round: logic supply, nothing drawn: the high-side switches' ..."]
 */
export function logicNotes(rows: readonly DecoderSummary[], names: readonly string[]): string[] {
  return rows.flatMap((r, i) => {
    if (r.status !== "done" || !r.figures.budget.ok) return [];
    const b = r.figures.budget.value;
    const clause = logicDrawClause(b.kind, b.logic.maxCurrentA);
    return clause === null ? [] : [`${names[i] ?? ""}: logic supply, ${clause}.`];
  });
}
