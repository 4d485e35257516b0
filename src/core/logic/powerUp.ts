/**
 * What the display shows for every code the counter never reaches in
 * counting: a counter of flip-flops can start in any code at power-up, or
 * land in one after a fault, and builders want to know what a counter in a
 * wrong state shows. The decoder is simulated for each unused code with the
 * same logic as the verifier (`litByCode`), and each position's lit
 * segments are named by a glyph of the project when one matches exactly.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import { outputName } from "../spec/decodeSpec.ts";
import { splitText } from "../project/projectSchema.ts";
import { litByCode } from "./verifyLogic.ts";

/** Counters of more stages than this list no table: 2^13 codes is past what anyone reads. */
export const POWER_UP_MAX_STAGES = 12;

export interface PowerUpEntry {
  /** The code, highest stage leftmost. */
  readonly code: string;
  /** Per position, its lit segments in the cell's order. */
  readonly segments: readonly (readonly string[])[];
  /** Per position, the character whose glyph lights exactly those segments (`.` added for a lit decimal point), or null. */
  readonly chars: readonly (string | null)[];
}

export interface PowerUpTable {
  /** Codes of the counter's stages that no state uses: 2^n - N. */
  readonly unusedCodes: number;
  /** Every unused code in numeric order; empty when the counter has more than `POWER_UP_MAX_STAGES` stages. */
  readonly entries: readonly PowerUpEntry[];
  /** False when the table was too long to list. */
  readonly listed: boolean;
}

/**
 * The power-up table of a verified coded decoder. `glyphs` is the project's
 * glyph table; characters the project shows are preferred when two glyphs
 * look alike (S and 5).
 *
 * @example
 * powerUpTable(spec, matrix, project.glyphs).entries[1];
 * // BCD 0-9: { code: "1011", segments: [[...]], chars: [...] }
 */
export function powerUpTable(spec: DecodeSpec, m: DiodeMatrix, glyphs: Readonly<Record<string, readonly string[]>>): PowerUpTable {
  const n = spec.counter.stages;
  const unusedCodes = 2 ** n - spec.counter.codes.length;
  if (spec.counter.kind === "one-hot" || n > POWER_UP_MAX_STAGES)
    return { unusedCodes: Math.max(0, unusedCodes), entries: [], listed: false };
  const used = new Set(spec.counter.codes);
  const namer = glyphNamer(spec, glyphs);
  const entries: PowerUpEntry[] = [];
  for (let c = 0; c < 2 ** n; c++) {
    const code = c.toString(2).padStart(n, "0");
    if (used.has(code)) continue;
    const lit = litByCode(m, code);
    const segments: string[][] = [];
    for (let pos = 1; pos <= spec.positions; pos++) segments.push(spec.cell.segments.filter((s) => lit.has(outputName(pos, s))));
    entries.push({ code, segments, chars: segments.map(namer) });
  }
  return { unusedCodes, entries, listed: true };
}

/**
 * Names a position's lit segments by a glyph: the project's shown characters
 * first, then the table's order; on a seg7dp cell a lit decimal point adds
 * `.`. A position with nothing lit is a blank.
 *
 * @example
 * glyphNamer(spec, project.glyphs)(["b", "c", "dp"]); // "1."
 */
export function glyphNamer(
  spec: DecodeSpec,
  glyphs: Readonly<Record<string, readonly string[]>>,
): (segments: readonly string[]) => string | null {
  const shown: string[] = [];
  for (const text of spec.texts) for (const pos of splitText(text, spec.cell)) if (!shown.includes(pos.char)) shown.push(pos.char);
  const order = [...shown, ...Object.keys(glyphs).filter((c) => !shown.includes(c))];
  const byShape = new Map<string, string>();
  for (const ch of order) {
    const key = [...(glyphs[ch] ?? [])].sort().join(" ");
    if (glyphs[ch] !== undefined && !byShape.has(key)) byShape.set(key, ch);
  }
  if (!byShape.has("")) byShape.set("", " ");
  return (segments) => {
    const dp = spec.cell.kind === "seg7dp" && segments.includes("dp");
    const body = segments.filter((s) => !(dp && s === "dp"));
    const ch = byShape.get([...body].sort().join(" "));
    if (ch === undefined) return null;
    return dp ? `${ch}.` : ch;
  };
}

/**
 * One entry in words: `code 1011 shows b`, `code 1111 lights nothing`,
 * `code 0110 shows "1?" (position 2 lights a b g, no glyph)`.
 */
export function powerUpText(e: PowerUpEntry): string {
  if (e.segments.every((s) => s.length === 0)) return `code ${e.code} lights nothing`;
  const text = e.chars.map((c) => c ?? "?").join("");
  const shown = e.chars.length === 1 && e.chars[0] !== null ? text : `"${text}"`;
  const unknown = e.chars.flatMap((c, i) => (c === null ? [`position ${i + 1} lights ${(e.segments[i] ?? []).join(" ")}, no glyph`] : []));
  return `code ${e.code} shows ${shown}${unknown.length > 0 ? ` (${unknown.join("; ")})` : ""}`;
}
