/**
 * Messages between the app and the live worker, which turns each valid
 * draft into a matrix and its drawing off the main thread, so that no
 * project, however large, can stop the page from answering.
 *
 * For every request the worker answers first with the direct matrix (one
 * diode per lit cell: quick at any size) without its drawing, so the first
 * figure shows at once; then with that matrix's drawing; then with the
 * heuristic's matrix and drawing, the final answer. Drawings are laid out
 * with the requested drawing options (paper, title block). The page
 * verifies every matrix again before it shows it.
 */
import type { DrawingOptions } from "../../render/drawingOptions.ts";
import type { MatrixDrawing } from "../../render/layout.ts";

export interface LiveRequest {
  readonly id: number;
  /** The project as plain JSON (a draft); the worker validates it itself. */
  readonly project: unknown;
  /** The paper and title-block fields chosen; the rest take their defaults. */
  readonly drawing: Partial<DrawingOptions>;
}

/** `direct`: the first, quick answer; `heuristic`: the final one. */
export type LivePhase = "direct" | "heuristic";

export type LiveReply =
  | {
      readonly id: number;
      readonly type: "matrix";
      readonly phase: LivePhase;
      readonly matrix: unknown;
      /** Null for the direct answer, whose drawing follows in a `drawing` message. */
      readonly drawing: MatrixDrawing | null;
    }
  /** The direct matrix's drawing. */
  | { readonly id: number; readonly type: "drawing"; readonly drawing: MatrixDrawing }
  | {
      readonly id: number;
      readonly type: "failed";
      /** `bug` when diodeloom made a wrong matrix; otherwise the project's settings admit none. */
      readonly bug: boolean;
      readonly message: string;
    };
