/**
 * Glyph-style comparison: which built-in variants of the shown characters
 * (6 with or without its top bar, 7 with or without f, 9 with or without d)
 * give the smallest matrix under the project's own limits.
 *
 * Every combination is synthesized and verified like any project; rows come
 * back sorted best first (count, then bound, then the glyph strings, so the
 * order is the same every run).
 */
import { compileSpec } from "../spec/decodeSpec.ts";
import { SEG7_VARIANTS, segmentsOfString } from "../glyphs/glyphs.ts";
import type { Project } from "../project/project.ts";
import { splitText } from "../project/projectSchema.ts";
import { ok, type Result } from "../result/result.ts";
import { SEARCH_MAX_OUTPUTS } from "../synth/search.ts";
import { synthesize, synthSettings, type SynthFailure, type SynthHooks, type SynthSettings } from "../synth/synthesize.ts";

export const COMPARE_SCHEMA = "diodeloom/compare@1";

export interface GlyphStyleRow {
  /** The varied characters and their lit segments, e.g. `{ "6": "acdefg" }`. */
  readonly glyphs: Readonly<Record<string, string>>;
  readonly count: number;
  readonly lowerBound: number | null;
  readonly optimal: boolean;
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

/**
 * Synthesizes every glyph-variant combination. A display with few outputs
 * (where the exact search usually proves the optimum at once) gives each run
 * the project's whole time limit; a bigger one shares the limit out over the
 * combinations, at least 1 s each.
 *
 * @example
 * const r = await compareGlyphStyles(project);
 * if (r.ok) r.value[0]; // the best combination
 */
export async function compareGlyphStyles(
  project: Project,
  overrides: Partial<SynthSettings> = {},
  hooks: SynthHooks = {},
): Promise<Result<GlyphStyleRow[], SynthFailure>> {
  const choices = variantChoices(project);
  let combos: Record<string, string>[] = [{}];
  for (const c of choices) combos = combos.flatMap((combo) => c.options.map((o) => ({ ...combo, [c.char]: o })));
  combos = combos.slice(0, MAX_COMBINATIONS);
  const base = synthSettings(project, overrides);
  // Small instances, where the per-state branch-and-bound applies and usually proves the optimum in well
  // under a second, get the whole limit each, as a single synth run would, so that every row is worked out
  // like the project's own matrix. Bigger ones share the limit out (at least 1 s each).
  const shared: SynthSettings = { ...base, timeLimitMs: Math.max(1000, Math.floor(base.timeLimitMs / combos.length)) };

  const rows: GlyphStyleRow[] = [];
  for (const combo of combos) {
    const glyphs: Record<string, readonly string[]> = { ...project.glyphs };
    for (const [ch, lit] of Object.entries(combo)) glyphs[ch] = segmentsOfString(lit);
    const spec = compileSpec({ ...project, glyphs });
    const settings = base.depthLimit === 2 && spec.outputs.length <= SEARCH_MAX_OUTPUTS ? base : shared;
    const r = await synthesize(spec, settings, hooks);
    if (!r.ok) return r;
    rows.push({ glyphs: combo, count: r.value.count, lowerBound: r.value.lowerBound, optimal: r.value.optimal });
  }
  const key = (r: GlyphStyleRow): string => JSON.stringify(r.glyphs);
  rows.sort((a, b) => a.count - b.count || (b.lowerBound ?? -1) - (a.lowerBound ?? -1) || key(a).localeCompare(key(b)));
  return ok(rows);
}
