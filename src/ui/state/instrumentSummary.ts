/**
 * The instrument summary's totals, from what is known of each decoder
 * (summaryRun.ts): the parts summed over the decoders, and the supplies'
 * worst case as the sum of each decoder's worst state. The decoders' counters
 * run independently, so every decoder can sit in its own worst state at
 * once, and no combination of states draws more than that sum (each
 * decoder's draw is at most its worst state's, whatever the others show):
 * the sum bounds the worst case without trying every combination, and is
 * reached.
 */
import type { DecoderSummary } from "../workers/summaryRun.ts";

export interface SupplyTotal {
  /** Sum of each decoder's largest current over its states, amperes. */
  readonly maxCurrentA: number;
  /** Sum of each decoder's largest power over its states, watts. */
  readonly maxPowerW: number;
}

export interface InstrumentTotals {
  readonly decoders: number;
  readonly diodes: number;
  readonly transistors: number;
  readonly resistors: number;
  /** The segment supply. */
  readonly supply: SupplyTotal;
  /** The logic supply (counter lines, tied-on outputs, gate pull-ups). */
  readonly logic: SupplyTotal;
  /** Decoders still being worked out: the totals leave them out. */
  readonly computing: number;
  /** Decoders with no figures (invalid, no matrix): the totals leave them out. */
  readonly failed: number;
  /** Decoders counted in the parts whose budget failed: the supply totals leave them out. */
  readonly noBudget: number;
}

/** True when every decoder is in the totals, supplies included. */
export function totalsComplete(t: InstrumentTotals): boolean {
  return t.computing === 0 && t.failed === 0 && t.noBudget === 0;
}

/**
 * @example
 * instrumentTotals([{ status: "done", figures }, { status: "computing" }]).computing; // 1
 */
export function instrumentTotals(rows: readonly DecoderSummary[]): InstrumentTotals {
  let diodes = 0;
  let transistors = 0;
  let resistors = 0;
  let computing = 0;
  let failed = 0;
  let noBudget = 0;
  const supply = { maxCurrentA: 0, maxPowerW: 0 };
  const logic = { maxCurrentA: 0, maxPowerW: 0 };
  for (const r of rows) {
    if (r.status === "computing") computing++;
    else if (r.status === "failed") failed++;
    else {
      diodes += r.figures.diodes;
      transistors += r.figures.transistors;
      resistors += r.figures.resistors;
      const b = r.figures.budget;
      if (!b.ok) noBudget++;
      else {
        supply.maxCurrentA += b.value.supply.maxCurrentA;
        supply.maxPowerW += b.value.supply.maxPowerW;
        logic.maxCurrentA += b.value.logic.maxCurrentA;
        logic.maxPowerW += b.value.logic.maxPowerW;
      }
    }
  }
  return { decoders: rows.length, diodes, transistors, resistors, supply, logic, computing, failed, noBudget };
}

/** What the summary says of totals that leave decoders out, or null when they are complete. */
export function totalsCaveat(t: InstrumentTotals): string | null {
  const parts: string[] = [];
  if (t.computing > 0) parts.push(`${t.computing} of ${t.decoders} decoders still being worked out`);
  if (t.failed > 0) parts.push(`${t.failed} with no figures`);
  if (t.noBudget > 0) parts.push(`${t.noBudget} without a budget (left out of the supply totals)`);
  return parts.length === 0 ? null : `Partial totals: ${parts.join(", ")}.`;
}
