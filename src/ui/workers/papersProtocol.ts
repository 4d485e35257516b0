/**
 * Messages between the app and the papers worker, which does the heavy part
 * of an instrument's export off the main thread: every decoder's budget and
 * drawing with its designators' decoder number in front, and the
 * instrument's budget. The page then writes the set of papers
 * (render/instrumentPapers.ts), as `diodeloom export` writes it.
 */
import type { BudgetFailure } from "../../core/budget/budget.ts";
import type { Budget } from "../../core/budget/budgetTypes.ts";
import type { InstrumentBudget } from "../../core/budget/instrumentBudget.ts";
import type { TrimMode } from "../../core/budget/segmentDesign.ts";
import type { Result } from "../../core/result/result.ts";
import type { DrawingOptions } from "../../render/drawingOptions.ts";
import type { MatrixDrawing } from "../../render/layout.ts";

export interface PapersRequest {
  /** The instrument in the file form; the worker validates it itself. */
  readonly instrument: unknown;
  /** Per decoder, in order, its verified matrix (without the decoder's number), as the summary found it. */
  readonly matrices: readonly unknown[];
  readonly trim: TrimMode;
  readonly drawing: Partial<DrawingOptions>;
}

export interface DecoderPapers {
  /** The matrix with the decoder's number in front of its designators. */
  readonly matrix: unknown;
  readonly drawing: MatrixDrawing;
  readonly budget: Result<Budget, BudgetFailure | { readonly kind: "rejected"; readonly message: string }>;
}

export type PapersReply =
  | { readonly ok: true; readonly decoders: readonly DecoderPapers[]; readonly budget: InstrumentBudget | null }
  | { readonly ok: false; readonly message: string };
