/**
 * Messages between the app and the live worker, which turns each valid
 * draft into a matrix and its drawing off the main thread, so that no
 * project, however large, can stop the page from answering.
 *
 * For every request the worker answers first with the direct matrix (one
 * diode per lit cell: quick at any size) and then with the heuristic's, the
 * final one; each comes with its drawing laid out for the requested paper.
 * The page verifies every matrix again before it shows it.
 */
import type { PaperName } from "../../render/drawingModel.ts";
import type { MatrixDrawing } from "../../render/layout.ts";

export interface LiveRequest {
  readonly id: number;
  /** The project as plain JSON (a draft); the worker validates it itself. */
  readonly project: unknown;
  readonly paper: PaperName;
}

/** `direct`: the first, quick answer; `heuristic`: the final one. */
export type LivePhase = "direct" | "heuristic";

export type LiveReply =
  | {
      readonly id: number;
      readonly type: "matrix";
      readonly phase: LivePhase;
      readonly matrix: unknown;
      readonly drawing: MatrixDrawing;
    }
  | {
      readonly id: number;
      readonly type: "failed";
      /** `bug` when diodeloom made a wrong matrix; otherwise the project's settings admit none. */
      readonly bug: boolean;
      readonly message: string;
    };
