/**
 * Glyph-style comparison: which built-in variants of the shown characters
 * (6 with or without its top bar, 7 with or without f, 9 with or without d)
 * give the smallest matrix under the project's own limits.
 *
 * Every combination is synthesized and verified like any project; rows come
 * back sorted best first (count, then bound, then the glyph strings, so the
 * order is the same every run). Each row says how far its figure is worked
 * out (`heuristic`, `best found` or `proven`), and a caller may follow the
 * rows as they finish and hand in rows it already knows (an earlier run's),
 * keyed by `rowKey`, so a proven row is never worked out twice.
 */
import { compileSpec } from "../spec/decodeSpec.ts";
import { SEG7_VARIANTS, segmentsOfString } from "../glyphs/glyphs.ts";
import { matrixObjective, type VerifiedMatrix } from "../matrix/matrix.ts";
import type { Project } from "../project/project.ts";
import { splitText } from "../project/projectSchema.ts";
import { ok, type Result } from "../result/result.ts";
import { SEARCH_MAX_OUTPUTS } from "../synth/search.ts";
import { synthesize, synthSettings, type SynthFailure, type SynthHooks, type SynthSettings } from "../synth/synthesize.ts";

export const COMPARE_SCHEMA = "diodeloom/compare@1";

/**
 * How far a figure is worked out: `heuristic` (the fast heuristic only, no
 * claim of a minimum), `best found` (the exact optimizer's best, not proven
 * minimal) or `proven` (a proven minimum).
 */
export type FigureStatus = "heuristic" | "best found" | "proven";

export interface GlyphStyleRow {
  /** The varied characters and their lit segments, e.g. `{ "6": "acdefg" }`. */
  readonly glyphs: Readonly<Record<string, string>>;
  readonly count: number;
  readonly lowerBound: number | null;
  readonly optimal: boolean;
  readonly status: FigureStatus;
}

/** A row about to be worked out. */
export interface RowStart {
  /** Position in the order the rows are worked out, 0-based. */
  readonly index: number;
  readonly total: number;
  readonly key: string;
  readonly glyphs: Readonly<Record<string, string>>;
}

/** A row as it finishes, with the verified matrix it stands for. */
export interface RowDone {
  /** Position in the order the rows are worked out (not the sorted order), 0-based. */
  readonly index: number;
  readonly total: number;
  readonly key: string;
  readonly row: GlyphStyleRow;
  /** The row's matrix; undefined for a row taken from `known`. */
  readonly matrix: VerifiedMatrix | undefined;
}

export interface CompareOptions {
  /** Overrides of the project's synthesis settings (`mode`, `timeLimitMs`...). */
  readonly settings?: Partial<SynthSettings>;
  readonly hooks?: SynthHooks;
  /** Rows already worked out, by `rowKey`: a proven one is taken as it is instead of being synthesized again. */
  readonly known?: ReadonlyMap<string, GlyphStyleRow>;
  /** Called when a row starts, before its synthesis. */
  readonly onRowStart?: (start: RowStart) => void;
  /** Called as each row finishes, in the order they are worked out. */
  readonly onRow?: (done: RowDone) => void;
}

/** Most combinations tried; the three built-in variant pairs give at most 8. */
const MAX_COMBINATIONS = 64;

/** The characters the project shows that have built-in variants, with the options for each. */
export function variantChoices(project: Project): { char: string; options: string[] }[] {
  if (project.display.cell.kind === "custom") return [];
  const shown = new Set<string>();
  for (const text of project.show) for (const pos of splitText(text, project.display.cell)) shown.add(pos.char);
  const out: { char: string; options: string[] }[] = [];
  for (const ch of Object.keys(SEG7_VARIANTS).sort()) {
    if (!shown.has(ch)) continue;
    const options = [...(SEG7_VARIANTS[ch] ?? [])];
    const current = (project.glyphs[ch] ?? []).join("");
    if (current !== "" && !options.includes(current)) options.unshift(current);
    out.push({ char: ch, options });
  }
  return out;
}

/** The project with some characters' glyphs replaced by lit-segment strings. */
export function withGlyphs(project: Project, combo: Readonly<Record<string, string>>): Project {
  const glyphs: Record<string, readonly string[]> = { ...project.glyphs };
  for (const [ch, lit] of Object.entries(combo)) glyphs[ch] = segmentsOfString(lit);
  return { ...project, glyphs };
}

/**
 * What a row's figure depends on, as a string: the lit matrix the texts and
 * glyphs give, and the rules a matrix must keep (depth limit, policy, buses,
 * links). Two projects with the same key have the same matrices, so a
 * result found for one holds for the other: after adopting a row's glyphs,
 * the project's key is that row's key.
 *
 * @example
 * rowKey(project, { "7": "abcf" }) === rowKey(withGlyphs(project, { "7": "abcf" }), {}); // true
 */
export function rowKey(project: Project, combo: Readonly<Record<string, string>> = {}): string {
  const spec = compileSpec(withGlyphs(project, combo));
  const { depthLimit, policy, buses, links, decode, darkInput } = project.synthesis;
  return JSON.stringify({
    outputs: spec.outputs,
    lit: spec.lit.map((r) => r.map((x) => (x ? 1 : 0)).join("")),
    depthLimit,
    policy,
    buses,
    links,
    // A dark decode's figures depend on the polarity and on what each dark output's input network costs.
    ...(decode !== "lit" ? { decode, darkInput, inputDiodes: spec.polarity.inputDiodes } : {}),
  });
}

/** The status of a synthesized matrix's figure, given the mode it was run in. */
export function figureStatus(matrix: { readonly optimal: boolean }, mode: SynthSettings["mode"]): FigureStatus {
  if (matrix.optimal) return "proven";
  return mode === "exact" ? "best found" : "heuristic";
}

/**
 * True when a comparison row gets the project's whole time limit: the fast
 * mode (the heuristic ends in well under a second whatever the limit, and
 * its work budget comes from the limit, so a row worked out as the live
 * result is shows the count that adopting it gives), and small displays at
 * depth 2, where the exact search usually proves the optimum at once.
 */
export function ownLimit(settings: SynthSettings, outputs: number): boolean {
  return settings.mode === "fast" || (settings.depthLimit === 2 && outputs <= SEARCH_MAX_OUTPUTS);
}

/**
 * Synthesizes every glyph-variant combination. The fast mode and a display
 * with few outputs (see `ownLimit`) give each run the project's whole time
 * limit; else the limit is shared out over the combinations, at least 1 s
 * each.
 *
 * @example
 * const r = await compareGlyphStyles(project, { settings: { mode: "fast" } });
 * if (r.ok) r.value[0]; // the best combination
 */
export async function compareGlyphStyles(project: Project, options: CompareOptions = {}): Promise<Result<GlyphStyleRow[], SynthFailure>> {
  const choices = variantChoices(project);
  let combos: Record<string, string>[] = [{}];
  for (const c of choices) combos = combos.flatMap((combo) => c.options.map((o) => ({ ...combo, [c.char]: o })));
  combos = combos.slice(0, MAX_COMBINATIONS);
  const base = synthSettings(project, options.settings ?? {});
  // Small instances, where the per-state branch-and-bound applies and usually proves the optimum in well
  // under a second, get the whole limit each, as a single synth run would, so that every row is worked out
  // like the project's own matrix. Bigger ones share the limit out (at least 1 s each).
  const shared: SynthSettings = { ...base, timeLimitMs: Math.max(1000, Math.floor(base.timeLimitMs / combos.length)) };

  const rows: GlyphStyleRow[] = [];
  for (const [index, combo] of combos.entries()) {
    const total = combos.length;
    const key = rowKey(project, combo);
    const known = options.known?.get(key);
    if (known?.status === "proven") {
      const row: GlyphStyleRow = { ...known, glyphs: combo };
      rows.push(row);
      options.onRow?.({ index, total, key, row, matrix: undefined });
      continue;
    }
    options.onRowStart?.({ index, total, key, glyphs: combo });
    const spec = compileSpec(withGlyphs(project, combo));
    const settings = ownLimit(base, spec.outputs.length) ? base : shared;
    const r = await synthesize(spec, settings, options.hooks ?? {});
    if (!r.ok) return r;
    const m = r.value;
    const row: GlyphStyleRow = {
      glyphs: combo,
      // With dark-decoded outputs the optimizer counts their level-shift diodes too, and so does the bound.
      count: matrixObjective(m),
      lowerBound: m.lowerBound,
      optimal: m.optimal,
      status: figureStatus(m, settings.mode),
    };
    rows.push(row);
    options.onRow?.({ index, total, key, row, matrix: m });
  }
  const key = (r: GlyphStyleRow): string => JSON.stringify(r.glyphs);
  rows.sort((a, b) => a.count - b.count || (b.lowerBound ?? -1) - (a.lowerBound ?? -1) || key(a).localeCompare(key(b)));
  return ok(rows);
}
