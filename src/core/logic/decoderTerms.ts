/**
 * A decoder's terms as a builder reads them: every AND gate with its inputs,
 * then every stage line used straight, each with what it drives and the
 * states it is high in.
 */
import type { DiodeMatrix } from "../matrix/matrix.ts";
import { literalHigh, literalOf } from "../spec/counterCode.ts";

export interface DecoderTerm {
  /** `G1` for a gate, the line name (`Q3`, `nQ0`) for a stage line used straight. */
  readonly name: string;
  /** The stage lines it ANDs; one for a stage line. */
  readonly inputs: readonly string[];
  /** The outputs and buses its OR diodes drive. */
  readonly drives: readonly string[];
  /** The states (`S0`..) it is high in. */
  readonly highIn: readonly string[];
}

/**
 * @example
 * decoderTerms(matrix)[0]; // { name: "G1", inputs: ["nQ0", "nQ1"], drives: ["1b", "1f"], highIn: ["S0", "S4", "S8"] }
 */
export function decoderTerms(m: DiodeMatrix): DecoderTerm[] {
  const lines = new Set(m.lines);
  const drives = new Map<string, string[]>();
  for (const d of m.diodes) if (!lines.has(d.to)) drives.set(d.from, [...(drives.get(d.from) ?? []), d.to]);
  const highIn = (inputs: readonly string[]): string[] =>
    m.states.filter((_, k) => {
      const code = m.codes[k];
      return (
        code !== undefined &&
        inputs.every((i) => {
          const lit = literalOf(i);
          return lit !== undefined && literalHigh(lit, code);
        })
      );
    });
  return [
    ...m.gates.map((g) => ({ name: g.ref, inputs: g.inputs, drives: drives.get(g.ref) ?? [], highIn: highIn(g.inputs) })),
    ...m.lines.filter((l) => drives.has(l)).map((l) => ({ name: l, inputs: [l], drives: drives.get(l) ?? [], highIn: highIn([l]) })),
  ];
}
