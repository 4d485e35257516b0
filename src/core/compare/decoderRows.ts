/**
 * A coded counter's decoders side by side: the two-level decoder, the
 * two-rank one (one gate per state, then the ring-counter matrix), and the
 * chosen one when shared OR nodes made it smaller than both. Each with its
 * diodes, resistors (one pull-up per AND gate; the output drivers are the
 * same for all) and gates.
 */
import type { CodedSynthesis } from "../logic/synthesizeCoded.ts";

export type DecoderKind = "two-level" | "two-rank" | "shared";

export interface DecoderRow {
  readonly decoder: DecoderKind;
  readonly diodes: number;
  /** Pull-up resistors, one per AND gate. */
  readonly resistors: number;
  readonly gates: number;
  /** Proven lower bound (two-level only), or null. */
  readonly lowerBound: number | null;
  readonly optimal: boolean;
  /** True for the decoder `synth` builds. */
  readonly chosen: boolean;
}

/**
 * @example
 * decoderRows(coded).map((r) => [r.decoder, r.diodes]);
 * // [["two-level", 36], ["two-rank", 54]] for 0-9 on a 5-stage Johnson counter
 */
export function decoderRows(coded: CodedSynthesis): DecoderRow[] {
  const two = coded.twoLevel.matrix;
  const rank = coded.twoRank.matrix;
  const rows: DecoderRow[] = [
    {
      decoder: "two-level",
      diodes: two.count,
      resistors: two.gates.length,
      gates: two.gates.length,
      lowerBound: two.lowerBound,
      optimal: two.optimal,
      chosen: coded.structure === "two-level",
    },
    {
      decoder: "two-rank",
      diodes: rank.count,
      resistors: rank.gates.length,
      gates: rank.gates.length,
      lowerBound: null,
      optimal: false,
      chosen: coded.structure === "two-rank",
    },
  ];
  if (coded.structure === "merged") {
    const m = coded.matrix;
    rows.push({
      decoder: "shared",
      diodes: m.count,
      resistors: m.gates.length,
      gates: m.gates.length,
      lowerBound: null,
      optimal: false,
      chosen: true,
    });
  }
  return rows;
}
