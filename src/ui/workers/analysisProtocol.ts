/**
 * Messages between the app and the analysis worker, which solves the
 * budget and runs the heuristic glyph-style comparison off the main thread,
 * so typing never waits for them.
 */
import type { BudgetFailure } from "../../core/budget/budget.ts";
import type { Budget } from "../../core/budget/budgetTypes.ts";
import type { TrimMode } from "../../core/budget/emitterDesign.ts";
import type { GlyphStyleRow } from "../../core/compare/glyphStyles.ts";
import type { SynthFailure } from "../../core/synth/synthesize.ts";
import type { Result } from "../../core/result/result.ts";

export type AnalysisRequest =
  /** The budget of a verified matrix; the worker checks the matrix again before solving. */
  | { readonly id: number; readonly job: "budget"; readonly project: unknown; readonly matrix: unknown; readonly trim: TrimMode }
  /** The glyph-style comparison with the heuristic. */
  | { readonly id: number; readonly job: "compare"; readonly project: unknown };

export type AnalysisReply =
  | {
      readonly id: number;
      readonly job: "budget";
      readonly result: Result<Budget, BudgetFailure | { readonly kind: "rejected"; readonly message: string }>;
    }
  | {
      readonly id: number;
      readonly job: "compare";
      readonly result: Result<GlyphStyleRow[], SynthFailure | { readonly kind: "rejected"; readonly message: string }>;
    };
