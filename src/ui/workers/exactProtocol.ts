/**
 * Messages between the app and the exact-optimizer worker.
 *
 * The app sends the validated project's draft (plain JSON) and a run id; the
 * worker validates it again (it shares no memory with the page), runs the
 * exact optimizer and answers with progress and one final message.
 */

import type { GlyphStyleRow, RowStart } from "../../core/compare/glyphStyles.ts";

export interface ExactRequest {
  readonly id: number;
  /** `matrix`: the project's minimum matrix; `compare`: the glyph-style comparison. */
  readonly job: "matrix" | "compare";
  /** The project as plain JSON (a draft); the worker validates it itself. */
  readonly project: unknown;
  /** For `compare`: rows already worked out, by row key; proven ones are not worked out again. */
  readonly known?: readonly (readonly [string, GlyphStyleRow])[];
}

/** A comparison row as it finishes (see `RowDone` in core/compare), its matrix as plain data for the page to verify. */
export interface RowReply {
  readonly index: number;
  readonly total: number;
  readonly key: string;
  readonly row: GlyphStyleRow;
  readonly matrix: unknown;
}

export interface ExactProgress {
  readonly best: number | null;
  readonly bound: number | null;
  /** Seconds since the run began. */
  readonly elapsedS: number;
}

export type ExactReply =
  | { readonly id: number; readonly type: "progress"; readonly progress: ExactProgress }
  | { readonly id: number; readonly type: "done"; readonly matrix: unknown }
  | { readonly id: number; readonly type: "row-start"; readonly start: RowStart }
  | { readonly id: number; readonly type: "row"; readonly done: RowReply }
  | { readonly id: number; readonly type: "compared"; readonly rows: readonly GlyphStyleRow[] }
  | { readonly id: number; readonly type: "failed"; readonly message: string };

/** The relative gap between the best count and the bound, in percent; null without both. */
export function gapPercent(p: { readonly best: number | null; readonly bound: number | null }): number | null {
  if (p.best === null || p.bound === null || p.best === 0) return null;
  return (100 * Math.max(0, p.best - p.bound)) / p.best;
}
