/**
 * Edits of the draft: pure functions from a draft to the next draft.
 *
 * Each keeps the draft as close to valid as the edit allows (resizing the
 * text list with the state count, padding texts with the positions), so a
 * single change in the form rarely leaves the project unusable.
 */
import { builtinCell, builtinGlyphs } from "../../core/glyphs/glyphs.ts";
import type { CellFigure, CellKind, CounterCodeKind, CounterDrive, SynthesisFields } from "../../core/project/project.ts";
import { figureOf } from "../../core/project/figureSchema.ts";
import type { Problem } from "../../core/result/result.ts";
import { binaryCodes } from "../../core/spec/counterCode.ts";
import { LIMITS } from "../../core/project/limits.ts";
import { splitText } from "../../core/project/projectSchema.ts";
import type { Draft, FigureFields } from "./draft.ts";

/**
 * The draft's custom-cell figure as the core reads it, or undefined when the
 * cell gives none or the one it gives does not check out yet (being edited).
 */
export function draftFigure(d: Draft): CellFigure | undefined {
  const f = d.display.figure;
  if (d.display.cell !== "custom" || !f) return undefined;
  const problems: Problem[] = [];
  return figureOf(f, draftSegments(d), problems);
}

/**
 * A seven-segment cell drawn as a custom cell's figure (the bars the app
 * draws for a built-in cell, in the same 60 x 100 box), so a cell switched
 * to custom keeps looking like what it was.
 */
const SEG7_FIGURE: FigureFields = {
  box: [60, 100],
  shapes: {
    a: {
      bar: [
        [12, 10],
        [48, 10],
      ],
      width: 8,
    },
    b: {
      bar: [
        [50, 12],
        [50, 48],
      ],
      width: 8,
    },
    c: {
      bar: [
        [50, 52],
        [50, 88],
      ],
      width: 8,
    },
    d: {
      bar: [
        [12, 90],
        [48, 90],
      ],
      width: 8,
    },
    e: {
      bar: [
        [10, 52],
        [10, 88],
      ],
      width: 8,
    },
    f: {
      bar: [
        [10, 12],
        [10, 48],
      ],
      width: 8,
    },
    g: {
      bar: [
        [12, 50],
        [48, 50],
      ],
      width: 8,
    },
    dp: { dot: [56, 94], r: 3.5 },
  },
};

/** Segment names of the draft's cell. */
export function draftSegments(d: Draft): readonly string[] {
  return d.display.cell === "custom" ? (d.display.segments ?? []) : builtinCell(d.display.cell).segments;
}

/** The lit segments of every character: the built-in table with the draft's own entries on top. */
export function effectiveGlyphs(d: Draft): Record<string, readonly string[]> {
  const cell = d.display.cell === "custom" ? { kind: "custom" as const, segments: draftSegments(d) } : builtinCell(d.display.cell);
  return { ...builtinGlyphs(cell), ...d.glyphs };
}

/** The characters the texts use, in order of first appearance, blank excluded. */
export function charactersShown(d: Draft): string[] {
  const cell = d.display.cell === "custom" ? { kind: "custom" as const, segments: draftSegments(d) } : builtinCell(d.display.cell);
  const seen = new Set<string>();
  for (const t of d.show) for (const p of splitText(t, cell)) if (p.char !== " ") seen.add(p.char);
  return [...seen];
}

export function setTitle(d: Draft, title: string): Draft {
  return { ...d, title };
}

/** Sets the state count; new states show a blank, removed states drop off the end. */
export function setStates(d: Draft, states: number): Draft {
  const n = Math.max(LIMITS.states.min, Math.min(LIMITS.states.max, Math.round(states)));
  const show = d.show.slice(0, n);
  while (show.length < n) show.push(" ".repeat(d.display.positions));
  return { ...d, counter: { ...d.counter, states: n }, show };
}

/**
 * Sets how the counter holds its state. A custom code starts from the
 * binary codes of the states, so the project stays valid; another code
 * drops the custom table.
 */
export function setCounterCode(d: Draft, code: CounterCodeKind): Draft {
  const { codes: _, ...rest } = d.counter;
  if (code !== "custom") return { ...d, counter: { ...rest, code } };
  return { ...d, counter: { ...rest, code, codes: d.counter.codes ?? binaryCodes(d.counter.states) } };
}

/** Sets which level marks the active state line (`counter.drive`). */
export function setCounterDrive(d: Draft, drive: CounterDrive): Draft {
  return { ...d, counter: { ...d.counter, drive } };
}

/** Sets a custom code table from text: one bit string per state, separated by spaces, commas or new lines. */
export function setCounterCodes(d: Draft, text: string): Draft {
  return { ...d, counter: { ...d.counter, codes: text.split(/[\s,]+/).filter((c) => c !== "") } };
}

/** Sets the position count; texts gain blanks on the left or lose their leftmost positions. */
export function setPositions(d: Draft, positions: number): Draft {
  const n = Math.max(LIMITS.positions.min, Math.min(LIMITS.positions.max, Math.round(positions)));
  const cell = d.display.cell === "custom" ? { kind: "custom" as const, segments: draftSegments(d) } : builtinCell(d.display.cell);
  const show = d.show.map((t) => {
    const parts = splitText(t, cell).map((p) => p.char + (p.dp ? "." : ""));
    while (parts.length < n) parts.unshift(" ");
    return parts.slice(parts.length - n).join("");
  });
  return { ...d, display: { ...d.display, positions: n }, show };
}

/**
 * Changes the cell kind. Glyph entries naming segments the new cell lacks
 * are dropped; a new custom cell starts with the seven segment names and the
 * shapes of the characters in use, so the texts keep showing something.
 */
export function setCell(d: Draft, kind: CellKind): Draft {
  if (kind === d.display.cell) return d;
  if (kind === "custom") {
    const segments = [...draftSegments(d)];
    const table = effectiveGlyphs(d);
    const glyphs: Record<string, readonly string[]> = {};
    for (const ch of charactersShown(d)) glyphs[ch] = [...(table[ch] ?? [])];
    const shapes = Object.fromEntries(segments.map((s) => [s, SEG7_FIGURE.shapes[s] ?? {}]));
    return { ...d, display: { positions: d.display.positions, cell: kind, segments, figure: { box: SEG7_FIGURE.box, shapes } }, glyphs };
  }
  const segments = builtinCell(kind).segments;
  const glyphs: Record<string, readonly string[]> = {};
  for (const [ch, segs] of Object.entries(d.glyphs)) {
    if (segs.every((s) => segments.includes(s))) glyphs[ch] = segs;
  }
  return { ...d, display: { positions: d.display.positions, cell: kind }, glyphs };
}

/**
 * Sets the segment names of a custom cell; glyph entries and the figure keep
 * the names that remain, and a new name gets a dot in a row along the
 * bottom of the figure, to be moved in the file.
 */
export function setCustomSegments(d: Draft, segments: readonly string[]): Draft {
  if (d.display.cell !== "custom") return d;
  const glyphs: Record<string, readonly string[]> = {};
  for (const [ch, segs] of Object.entries(d.glyphs)) glyphs[ch] = segs.filter((s) => segments.includes(s));
  const f = d.display.figure;
  if (!f) return { ...d, display: { ...d.display, segments: [...segments] }, glyphs };
  const [w, h] = f.box;
  const added = segments.filter((s) => !(s in f.shapes));
  const r = Math.round(Math.min(w, h) * 0.06 * 1000) / 1000;
  const shapes = Object.fromEntries(
    segments.map((s) => {
      const k = added.indexOf(s);
      const x = Math.round(((w * (k + 1)) / (added.length + 1)) * 1000) / 1000;
      return [s, f.shapes[s] ?? { dot: [x, Math.round((h - 1.5 * r) * 1000) / 1000], r }];
    }),
  );
  return { ...d, display: { ...d.display, segments: [...segments], figure: { box: f.box, shapes } }, glyphs };
}

/** Sets one state's text (0-based state index). */
export function setText(d: Draft, state: number, text: string): Draft {
  if (state < 0 || state >= d.show.length) throw new RangeError(`state ${state} is outside 0..${d.show.length - 1}`);
  const show = [...d.show];
  show[state] = text;
  return { ...d, show };
}

/** Replaces all texts, and the state count with them. */
export function setTexts(d: Draft, texts: readonly string[]): Draft {
  return { ...d, counter: { ...d.counter, states: texts.length }, show: [...texts] };
}

/**
 * Sets the lit segments of one character. An entry equal to the built-in
 * shape is removed, so the file keeps only real overrides.
 */
export function setGlyph(d: Draft, char: string, segments: readonly string[]): Draft {
  const order = draftSegments(d);
  const ordered = order.filter((s) => segments.includes(s));
  const glyphs: Record<string, readonly string[]> = { ...d.glyphs };
  const cell = d.display.cell === "custom" ? { kind: "custom" as const, segments: order } : builtinCell(d.display.cell);
  const builtin = builtinGlyphs(cell)[char];
  if (builtin !== undefined && builtin.join() === ordered.join()) delete glyphs[char];
  else glyphs[char] = ordered;
  return { ...d, glyphs };
}

/** Lights or darkens one segment of one character. */
export function toggleSegment(d: Draft, char: string, segment: string): Draft {
  const now = effectiveGlyphs(d)[char] ?? [];
  return setGlyph(d, char, now.includes(segment) ? now.filter((s) => s !== segment) : [...now, segment]);
}

export function setSynthesis(d: Draft, change: Partial<SynthesisFields>): Draft {
  return { ...d, synthesis: { ...d.synthesis, ...change } };
}

/**
 * The built-in shape of a character on the draft's cell, or undefined where
 * there is none: a character the built-in table lacks, or any character of a
 * custom cell (which has no built-in glyphs but the blank). "Back to built-in
 * shape" applies only where this is defined.
 *
 * @example
 * builtinShape(draft, "7"); // ["a", "b", "c"] on a seven-segment cell
 * builtinShape(draft, "W"); // undefined
 */
export function builtinShape(d: Draft, char: string): readonly string[] | undefined {
  if (d.display.cell === "custom" || char === " ") return undefined;
  return builtinGlyphs(builtinCell(d.display.cell))[char];
}

/**
 * Characters the texts show that light the same segments (a 4 edited into
 * the shape of a 9; a character that lights nothing beside a blank the texts
 * also show), as groups of two or more, with the shape they share.
 *
 * @example
 * sameShapes(draft); // [{ chars: ["4", "9"], segments: ["a", "b", "c", "d", "f", "g"] }]
 */
export function sameShapes(d: Draft): { readonly chars: readonly string[]; readonly segments: readonly string[] }[] {
  const table = effectiveGlyphs(d);
  const order = draftSegments(d);
  const byShape = new Map<string, string[]>();
  const blank = d.show.some((t) => t.includes(" "));
  for (const ch of [...(blank ? [" "] : []), ...charactersShown(d)]) {
    const lit = table[ch];
    if (lit === undefined) continue;
    const key = order.filter((s) => lit.includes(s)).join(" ");
    byShape.set(key, [...(byShape.get(key) ?? []), ch]);
  }
  return [...byShape.entries()]
    .filter(([, chars]) => chars.length > 1)
    .map(([key, chars]) => ({ chars, segments: key ? key.split(" ") : [] }));
}

/** What "Add character" does with what was typed: which character to open for editing, and what to tell the person. */
export interface AddCharacter {
  /** The character to open in the editor, or null when nothing can be added. */
  readonly char: string | null;
  readonly message: string;
}

/**
 * Reads the "Add character" field. A character that already has a shape
 * (built-in or the project's own) is opened for editing and the message
 * says so; a new one is opened with no segments lit, to be clicked, and
 * gets no glyph entry until it lights something.
 *
 * @example
 * addCharacter(draft, "P"); // { char: "P", message: '"P" has a built-in shape (abefg); it is open for editing' }
 * addCharacter(draft, "W"); // { char: "W", message: '"W" is new: click the segments it lights' }
 */
export function addCharacter(d: Draft, text: string): AddCharacter {
  const chars = [...text.trim()];
  if (chars.length === 0) return { char: null, message: "Type the character to add, for example P" };
  if (chars.length > 1) return { char: null, message: `Add one character at a time ("${text.trim()}" is ${chars.length})` };
  const c = chars[0] as string;
  if (/[\u0000-\u001f\u007f-\u009f]/.test(c))
    return { char: null, message: "A control character cannot be shown; type a letter, digit or sign" };
  if (c in d.glyphs)
    return { char: c, message: `"${c}" is already in the project (${shapeText(d, d.glyphs[c] ?? [])}); it is open for editing` };
  const builtin = builtinShape(d, c);
  if (builtin !== undefined) return { char: c, message: `"${c}" has a built-in shape (${shapeText(d, builtin)}); it is open for editing` };
  return { char: c, message: `"${c}" is new: click the segments it lights` };
}

/** A shape for a message: `abefg` on a seven-segment cell, `tl c br` on a custom one, `nothing lit` when empty. */
function shapeText(d: Draft, segments: readonly string[]): string {
  if (segments.length === 0) return "nothing lit";
  return d.display.cell === "custom" ? segments.join(" ") : segments.map((s) => (s === "dp" ? "." : s)).join("");
}
