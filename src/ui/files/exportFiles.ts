/**
 * The files the Export menu offers for the shown result: the papers
 * builder's files (render/papers.ts, the same the command line's `export`
 * writes), one download per kind, several files packed into one ZIP.
 */
import { drawingOptions, type DrawingOptions } from "../../render/drawingOptions.ts";
import { layoutMatrix } from "../../render/layout.ts";
import { paperFiles, type BudgetOutcome, type PaperFile, type PaperKind } from "../../render/papers.ts";
import type { LiveResult } from "../workers/liveResult.ts";
import { zipArchive } from "./zipArchive.ts";

export interface ExportFile {
  readonly name: string;
  readonly mediaType: string;
  /** Text, or the bytes of an archive. */
  readonly content: string | Uint8Array;
}

export type ExportKind = PaperKind;

const ARCHIVE_NAME: Readonly<Record<ExportKind, string>> = {
  svg: "matrix-sheets.zip",
  driver: "driver-sheets.zip",
  wiring: "wiring.zip",
  "wiring-page": "wiring-page.zip",
  bom: "bom.zip",
  netlists: "spice-netlists.zip",
  budget: "budget.zip",
  project: "project.zip",
};

/** One file stays itself; several go into one ZIP archive, so each export is one download. */
function bundle(kind: ExportKind, files: readonly PaperFile[]): ExportFile[] {
  const only = files[0];
  if (files.length === 1 && only) return [{ name: only.name, mediaType: only.mediaType, content: only.text }];
  if (files.length === 0) return [];
  return [
    { name: ARCHIVE_NAME[kind], mediaType: "application/zip", content: zipArchive(files.map((f) => ({ name: f.name, text: f.text }))) },
  ];
}

/**
 * The download of one export kind. An empty list means the export is not
 * ready: the budget of this result, which settles the BOM's and the decks'
 * emitter resistors, has not been worked out yet.
 */
export function exportFiles(
  r: LiveResult,
  kind: ExportKind,
  choice: Partial<DrawingOptions>,
  budget: BudgetOutcome | undefined,
): ExportFile[] {
  const options = drawingOptions(r.project, choice);
  const drawing = layoutMatrix(r.project, r.spec, r.matrix, options);
  return bundle(kind, paperFiles({ project: r.project, spec: r.spec, matrix: r.matrix, options, drawing, budget }, kind));
}
