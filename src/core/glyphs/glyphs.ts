/**
 * Built-in glyph tables for seven-segment cells, and the cell definitions.
 *
 * Segment a is the top bar, b to f run clockwise (b upper right, c lower
 * right, d bottom, e lower left, f upper left), g is the middle bar; `dp` is
 * the decimal point of a `seg7dp` cell.
 */
import type { Cell, CellKind } from "../project/project.ts";

export const SEG7_SEGMENTS: readonly string[] = ["a", "b", "c", "d", "e", "f", "g"];
export const SEG7DP_SEGMENTS: readonly string[] = [...SEG7_SEGMENTS, "dp"];

/** Segment lists of the built-in cells; custom cells bring their own. */
export function builtinCell(kind: Exclude<CellKind, "custom">): Cell {
  return { kind, segments: kind === "seg7" ? SEG7_SEGMENTS : SEG7DP_SEGMENTS };
}

/**
 * The default seven-segment glyphs, as lit-segment strings. Digits and hex
 * letters follow the common table (6 with its top bar, 7 as abc, 9 with its
 * bottom bar); the other letters are the usual readable forms.
 */
export const SEG7_GLYPHS: Readonly<Record<string, string>> = {
  " ": "",
  "0": "abcdef",
  "1": "bc",
  "2": "abdeg",
  "3": "abcdg",
  "4": "bcfg",
  "5": "acdfg",
  "6": "acdefg",
  "7": "abc",
  "8": "abcdefg",
  "9": "abcdfg",
  A: "abcefg",
  b: "cdefg",
  C: "adef",
  c: "deg",
  d: "bcdeg",
  E: "adefg",
  F: "aefg",
  G: "acdef",
  H: "bcefg",
  h: "cefg",
  I: "ef",
  J: "bcde",
  L: "def",
  n: "ceg",
  o: "cdeg",
  P: "abefg",
  q: "abcfg",
  r: "eg",
  S: "acdfg",
  t: "defg",
  U: "bcdef",
  u: "cde",
  y: "bcdfg",
  "-": "g",
  _: "d",
  "=": "dg",
};

/**
 * Built-in alternative shapes. The first entry of each list is the default in
 * `SEG7_GLYPHS`; the rest are the common variants that glyph-style comparison
 * tries.
 */
export const SEG7_VARIANTS: Readonly<Record<string, readonly string[]>> = {
  "6": ["acdefg", "cdefg"],
  "7": ["abc", "abcf"],
  "9": ["abcdfg", "abcfg"],
};

/** Splits a lit-segment string such as `"abcdefg"` into names (`.` stands for `dp`). */
export function segmentsOfString(lit: string): string[] {
  return [...lit].map((ch) => (ch === "." ? "dp" : ch));
}

/** The built-in glyph table for a cell, as segment-name lists. Custom cells get only the blank. */
export function builtinGlyphs(cell: Cell): Record<string, readonly string[]> {
  const table: Record<string, readonly string[]> = { " ": [] };
  if (cell.kind === "custom") return table;
  for (const [ch, lit] of Object.entries(SEG7_GLYPHS)) table[ch] = segmentsOfString(lit);
  if (cell.kind === "seg7dp") table["."] = ["dp"];
  return table;
}

/** Hex code of a seven-segment glyph in gfedcba bit order (a = bit 0), as display drivers use. */
export function seg7Code(segments: readonly string[]): number {
  let code = 0;
  for (const s of segments) {
    const bit = SEG7_SEGMENTS.indexOf(s);
    if (bit >= 0) code |= 1 << bit;
    else if (s === "dp") code |= 0x80;
  }
  return code;
}
