/**
 * Decode-polarity comparison: for each of the project's glyph styles, the
 * decoder with every output decoded lit, every output dark, and each output
 * in the cheaper polarity, on a counter that offers both line polarities
 * (complementary drive). A person who has not built the counter yet sees
 * what complementary outputs would save, after the input networks' cost.
 *
 * Each row's diodes are the optimizer's objective: the matrix's diodes plus
 * the level-shift diodes of the dark-decoded outputs (none with a divider).
 * Its resistors are those on the decoder's side of the drivers, which is
 * where the rows differ: a pull-down on each lit-decoded output, and on each
 * dark-decoded one a pull-up and either the bleed that carries its
 * level-shift diodes' current or a divider's two resistors. The drivers' own
 * resistors are the same in every row and are left out.
 */
import { compileSpec } from "../spec/decodeSpec.ts";
import { darkOutputs, matrixObjective } from "../matrix/matrix.ts";
import type { DecodePolarity, Project } from "../project/project.ts";
import { checkPolarity } from "../project/polaritySchema.ts";
import { ok, type Problem, type Result } from "../result/result.ts";
import { synthesize, synthSettings, type SynthFailure, type SynthHooks, type SynthSettings } from "../synth/synthesize.ts";
import { figureStatus, ownLimit, variantChoices, withGlyphs, type FigureStatus } from "./glyphStyles.ts";

/** One glyph style decoded in one polarity. */
export interface PolarityRow {
  /** The varied characters and their lit segments (empty when the project shows none with a variant). */
  readonly glyphs: Readonly<Record<string, string>>;
  readonly decode: DecodePolarity;
  /** The diodes the optimizer counts: `matrixDiodes` plus `inputDiodes`; null when the combination has no circuit. */
  readonly diodes: number | null;
  readonly matrixDiodes: number | null;
  /** Level-shift diodes of the dark-decoded outputs. */
  readonly inputDiodes: number | null;
  /** Resistors on the decoder's side of the drivers (see the file's comment). */
  readonly resistors: number | null;
  /** Outputs decoded dark. */
  readonly darkOutputs: number | null;
  readonly lowerBound: number | null;
  readonly optimal: boolean;
  readonly status: FigureStatus | null;
  /** Why the combination has no circuit (the project file's own message), or null. */
  readonly refused: string | null;
}

export interface PolarityCompareOptions {
  /** Overrides of the project's synthesis settings (`mode`, `timeLimitMs`...). */
  readonly settings?: Partial<SynthSettings>;
  readonly hooks?: SynthHooks;
  /** Called as each row finishes. */
  readonly onRow?: (row: PolarityRow, index: number, total: number) => void;
}

export const DECODE_ROWS: readonly DecodePolarity[] = ["lit", "dark", "either"];

/** Most glyph combinations compared (the three built-in variant pairs give at most 8). */
const MAX_COMBINATIONS = 8;

/**
 * Synthesizes every glyph style in every decode polarity, on complementary
 * counter lines. The time limit is shared out as `compareGlyphStyles` does:
 * the fast mode and small displays get the whole limit per run, bigger ones
 * a share (at least 1 s each). Rows come in glyph-style order, lit, dark, either within each.
 *
 * @example
 * const r = await comparePolarities(project, { settings: { mode: "fast" } });
 * if (r.ok) r.value.filter((row) => row.decode === "either");
 */
export async function comparePolarities(
  project: Project,
  options: PolarityCompareOptions = {},
): Promise<Result<PolarityRow[], SynthFailure>> {
  const choices = variantChoices(project);
  let combos: Record<string, string>[] = [{}];
  for (const c of choices) combos = combos.flatMap((combo) => c.options.map((o) => ({ ...combo, [c.char]: o })));
  combos = combos.slice(0, MAX_COMBINATIONS);
  const base = synthSettings(project, options.settings ?? {});
  const runs = combos.length * DECODE_ROWS.length;
  const shared: SynthSettings = { ...base, timeLimitMs: Math.max(1000, Math.floor(base.timeLimitMs / runs)) };
  const rows: PolarityRow[] = [];
  for (const combo of combos) {
    for (const decode of DECODE_ROWS) {
      const counter = { ...project.counter, drive: "complementary" as const };
      const synthesis = { ...project.synthesis, decode };
      const problems: Problem[] = [];
      checkPolarity(counter, synthesis, project.electrical, problems);
      const empty = { glyphs: combo, decode, diodes: null, matrixDiodes: null, inputDiodes: null, resistors: null, darkOutputs: null };
      if (problems.length > 0) {
        const row: PolarityRow = { ...empty, lowerBound: null, optimal: false, status: null, refused: problems[0]?.message ?? "" };
        rows.push(row);
        options.onRow?.(row, rows.length - 1, runs);
        continue;
      }
      const spec = compileSpec(withGlyphs({ ...project, counter, synthesis }, combo));
      if (decode !== "lit" && spec.polarity.inputDiodes === null) {
        const row: PolarityRow = {
          ...empty,
          lowerBound: null,
          optimal: false,
          status: null,
          refused: "no number of level-shift diodes keeps a pulled-down output dark with these electrical values; a divider would",
        };
        rows.push(row);
        options.onRow?.(row, rows.length - 1, runs);
        continue;
      }
      const settings = ownLimit(base, spec.outputs.length) ? base : shared;
      const r = await synthesize(spec, settings, options.hooks ?? {});
      if (!r.ok) return r;
      const m = r.value;
      const dark = darkOutputs(m).length;
      const lit = m.outputs.length - dark;
      const perDark = 1 + Math.max(1, spec.polarity.inputResistors);
      const row: PolarityRow = {
        glyphs: combo,
        decode,
        diodes: matrixObjective(m),
        matrixDiodes: m.count,
        inputDiodes: m.inputNetwork?.diodes ?? 0,
        resistors: lit + dark * perDark,
        darkOutputs: dark,
        lowerBound: m.lowerBound,
        optimal: m.optimal,
        status: figureStatus(m, settings.mode),
        refused: null,
      };
      rows.push(row);
      options.onRow?.(row, rows.length - 1, runs);
    }
  }
  return ok(rows);
}
