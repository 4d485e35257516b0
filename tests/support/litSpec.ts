/**
 * Decode specs straight from a lit matrix, for synthesis tests: rows are
 * states, columns outputs. Columns lit in no state or in every state are
 * dropped, as compileSpec does (no driver, or tied on).
 */
import { litPolarity, type DecodeSpec } from "../../src/core/spec/decodeSpec.ts";
import { builtinCell } from "../../src/core/glyphs/glyphs.ts";

export function specFromLit(lit: readonly (readonly boolean[])[]): DecodeSpec {
  const n = lit.length;
  const m = lit[0]?.length ?? 0;
  const names = Array.from({ length: m }, (_, j) => `1o${j}`);
  const count = (j: number): number => lit.filter((r) => r[j]).length;
  const keep = names.map((_, j) => j).filter((j) => count(j) > 0 && count(j) < n);
  const states = lit.map((_, k) => `S${k}`);
  const kept = lit.map((r) => keep.map((j) => r[j] === true));
  return {
    states,
    counter: { kind: "one-hot", stages: 0, codes: [] },
    lines: states,
    texts: lit.map((_, k) => `t${k}`),
    allOutputs: names,
    outputs: keep.map((j) => names[j] as string),
    lit: kept,
    neverLit: names.filter((_, j) => count(j) === 0),
    tiedOn: names.filter((_, j) => n > 0 && count(j) === n),
    positions: 1,
    cell: builtinCell("seg7"),
    polarity: litPolarity(kept, states),
  };
}

/** Parses rows like "1101" into a lit matrix. */
export function litRows(...rows: string[]): boolean[][] {
  return rows.map((r) => [...r].map((c) => c === "1"));
}
