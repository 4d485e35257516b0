/**
 * The files the Export menu offers for the shown result, or for an
 * instrument of several decoders its one set of papers: the papers
 * builder's files (render/papers.ts, render/instrumentPapers.ts, the same
 * the command line's `export` writes), one download per kind, several
 * files packed into one ZIP.
 */
import { drawingOptions, type DrawingOptions } from "../../render/drawingOptions.ts";
import { layoutMatrix } from "../../render/layout.ts";
import { paperDarkValues, paperFiles, type BudgetOutcome, type PaperFile, type PaperKind } from "../../render/papers.ts";
import { instrumentPaperFiles, type DecoderPaperInput } from "../../render/instrumentPapers.ts";
import type { InstrumentBudget } from "../../core/budget/instrumentBudget.ts";
import type { VerifiedMatrix } from "../../core/matrix/matrix.ts";
import type { Instrument } from "../../core/project/instrument.ts";
import type { Project } from "../../core/project/project.ts";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import type { DecoderPapers } from "../workers/papersProtocol.ts";
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
  const drawing = layoutMatrix(r.project, r.spec, r.matrix, options, paperDarkValues({ project: r.project, spec: r.spec, budget }));
  return bundle(kind, paperFiles({ project: r.project, spec: r.spec, matrix: r.matrix, options, drawing, budget }, kind));
}

/** Which files of an instrument's set each export kind takes (render/instrumentPapers.ts names them). */
const INSTRUMENT_KIND: Readonly<Record<ExportKind, (name: string) => boolean>> = {
  svg: (n) => n === "index.svg" || /\/matrix(-\d+)?\.svg$/.test(n),
  driver: (n) => /\/driver(-\d+)?\.svg$/.test(n),
  wiring: (n) => n === "wiring.csv",
  "wiring-page": (n) => n === "wiring.html",
  bom: (n) => n === "bom.csv",
  netlists: (n) => n.endsWith(".cir"),
  budget: (n) => n === "budget.json",
  project: (n) => n === "project.json",
};

/**
 * The download of one export kind of an instrument of several decoders:
 * the files of that kind from its one set of papers (the same the command
 * line's `export` writes), several in one ZIP archive with the set's folders.
 *
 * @param decoders per decoder, what the papers worker worked out, with its project
 */
export function instrumentExportFiles(
  instrument: Instrument,
  decoders: readonly { readonly project: Project; readonly papers: DecoderPapers }[],
  budget: InstrumentBudget | null,
  kind: ExportKind,
  choice: Partial<DrawingOptions>,
): ExportFile[] {
  const inputs: DecoderPaperInput[] = decoders.map((d, i) => {
    const name = instrument.decoders[i]?.name ?? "";
    const options = drawingOptions(d.project, choice);
    return {
      name,
      project: d.project,
      spec: compileSpec(d.project),
      matrix: d.papers.matrix as VerifiedMatrix,
      options,
      drawing: d.papers.drawing,
      budget: d.papers.budget,
    };
  });
  const first = inputs[0];
  if (!first) return [];
  const files = instrumentPaperFiles({ instrument, decoders: inputs, options: first.options, budget }).filter((f) =>
    INSTRUMENT_KIND[kind](f.name),
  );
  return bundle(kind, files);
}
