/**
 * Messages between the app and the analysis workers, which solve the
 * budget, run the heuristic glyph-style comparison and lay out drawings off
 * the main thread, so typing never waits for them. Each job has a worker of
 * its own and a deadline (analysisClient.ts).
 */
import type { BudgetFailure } from "../../core/budget/budget.ts";
import type { Budget } from "../../core/budget/budgetTypes.ts";
import type { TrimMode } from "../../core/budget/segmentDesign.ts";
import type { GlyphStyleRow } from "../../core/compare/glyphStyles.ts";
import type { SynthFailure } from "../../core/synth/synthesize.ts";
import type { Result } from "../../core/result/result.ts";
import type { DrawingOptions } from "../../render/drawingOptions.ts";
import type { MatrixDrawing } from "../../render/layout.ts";
import type { DarkNetworkValues } from "../../core/matrix/designators.ts";

/** A job the worker would not do (`rejected`: the input did not check out) or did not finish in time (`deadline`). */
export interface WorkerFailure {
  readonly kind: "rejected" | "deadline";
  readonly message: string;
}

export type AnalysisRequest =
  /** The budget of a verified matrix; the worker checks the matrix again before solving. */
  | { readonly id: number; readonly job: "budget"; readonly project: unknown; readonly matrix: unknown; readonly trim: TrimMode }
  /** The glyph-style comparison with the heuristic. */
  | { readonly id: number; readonly job: "compare"; readonly project: unknown }
  /**
   * The drawing of a matrix for other drawing options (paper, title block),
   * or with the values of its dark-decoded outputs' network once the budget has sized them.
   */
  | {
      readonly id: number;
      readonly job: "layout";
      readonly project: unknown;
      readonly matrix: unknown;
      readonly drawing: Partial<DrawingOptions>;
      readonly darkValues?: DarkNetworkValues;
    }
  /** A coded counter's two-rank decoder (one gate per state, then the matrix), to show beside the decoder on screen. */
  | { readonly id: number; readonly job: "two-rank"; readonly project: unknown };

/** What the app shows of a two-rank decoder. */
export interface TwoRankFigures {
  readonly diodes: number;
  readonly gates: number;
  readonly gateDiodes: number;
  readonly matrixDiodes: number;
  /** How the matrix on the state lines was found. */
  readonly method: string;
}

export type AnalysisReply =
  | { readonly id: number; readonly job: "budget"; readonly result: Result<Budget, BudgetFailure | WorkerFailure> }
  | { readonly id: number; readonly job: "compare"; readonly result: Result<GlyphStyleRow[], SynthFailure | WorkerFailure> }
  | { readonly id: number; readonly job: "layout"; readonly result: Result<MatrixDrawing, WorkerFailure> }
  | { readonly id: number; readonly job: "two-rank"; readonly result: Result<TwoRankFigures, SynthFailure | WorkerFailure> };
