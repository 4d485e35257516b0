/**
 * The papers of one result, as files: the matrix drawing's sheets, the
 * driver-stage sheets, the wiring list (CSV and printable page), the budget, the BOM, one SPICE deck
 * per state and the normalised project. The command line's `export` writes
 * them all; the web app's Export menu offers them kind by kind. Both call
 * this one builder, so both write the same files with the same names.
 *
 * Every paper shows one design: the BOM and the decks take their emitter
 * resistors from the budget (the trim where the design takes it); without
 * a budget they keep the project's values and say why.
 */
import { budgetDesign } from "../core/budget/budget.ts";
import type { Budget } from "../core/budget/budgetTypes.ts";
import { designModel, projectDesign, type SegmentDesign } from "../core/budget/segmentDesign.ts";
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import { designators, estimatedDarkNetwork, type DarkNetworkValues } from "../core/matrix/designators.ts";
import type { VerifiedMatrix } from "../core/matrix/matrix.ts";
import { spiceNetlists } from "../core/papers/netlist.ts";
import { networkRows, tieOnRows, wiringCsv, wiringRows, type NetworkRow, type TieOnRow } from "../core/papers/wiringList.ts";
import type { Project } from "../core/project/project.ts";
import { serializeProject } from "../core/project/projectWriter.ts";
import type { Result } from "../core/result/result.ts";
import { bomCsv, bomLines } from "./bom.ts";
import { budgetJsonText } from "./budgetJson.ts";
import type { Sheet } from "./drawingModel.ts";
import type { DrawingOptions } from "./drawingOptions.ts";
import { layoutDriverSheets } from "./driverSheet.ts";
import type { MatrixDrawing } from "./layout.ts";
import { sheetSvgText } from "./sheetSvg.ts";
import { wiringPageHtml } from "./wiringPage.ts";

export interface PaperFile {
  /** Path inside the export, `/`-separated, e.g. `spice/S0.cir`. */
  readonly name: string;
  /** IANA media type, e.g. `text/csv`. */
  readonly mediaType: string;
  readonly text: string;
}

export type PaperKind = "svg" | "driver" | "wiring" | "wiring-page" | "bom" | "netlists" | "budget" | "project";

/** Every kind, in the order `export` writes them. */
export const PAPER_KINDS: readonly PaperKind[] = ["svg", "driver", "wiring", "wiring-page", "budget", "bom", "netlists", "project"];

/** A budget, or why there is none. */
export type BudgetOutcome = Result<Budget, { readonly kind: string; readonly message: string }>;

export interface PaperInput {
  readonly project: Project;
  readonly spec: DecodeSpec;
  readonly matrix: VerifiedMatrix;
  readonly options: DrawingOptions;
  /** The drawing laid out with `options`. */
  readonly drawing: MatrixDrawing;
  /** The budget of this matrix; undefined while it is still being worked out. */
  readonly budget: BudgetOutcome | undefined;
}

/** The design the papers show: the budget's, or the project's values when there is no budget. */
export function paperDesign(input: Pick<PaperInput, "project" | "matrix" | "budget">): SegmentDesign {
  return input.budget?.ok ? budgetDesign(input.budget.value) : projectDesign(input.project.electrical, input.matrix);
}

/**
 * The values of the dark-decoded outputs' input network that the matrix
 * sheet prints, the same the BOM carries: the budget's sized network, or
 * with a failed budget the estimate the BOM then keeps; undefined while the
 * budget is still being worked out (the sheet then shows designators only).
 */
export function paperDarkValues(input: Pick<PaperInput, "project" | "spec" | "budget">): DarkNetworkValues | undefined {
  const { budget } = input;
  if (budget === undefined) return undefined;
  if (budget.ok) return budgetDesign(budget.value).network ?? undefined;
  return estimatedDarkNetwork(input.spec, input.project.electrical);
}

/** The tie-on resistors of the tied-on outputs, for the wiring list (their values are not trimmed). */
export function tieOnsOf(input: Pick<PaperInput, "project" | "spec" | "matrix">): TieOnRow[] {
  return tieOnRows(designators(input.spec, input.matrix, input.project.electrical).drivers);
}

/**
 * The AND gates' pull-ups and the dark-decoded outputs' input network for
 * the wiring list, with the values of the design the papers show and where
 * the drawing has each part.
 */
export function networkOf(input: Pick<PaperInput, "project" | "spec" | "matrix" | "budget" | "drawing">): NetworkRow[] {
  const design = paperDesign(input);
  return networkRows(
    designators(input.spec, input.matrix, designModel(input.project.electrical, design), design.ohms),
    input.drawing.placements,
  );
}

/**
 * The driver-stage sheets of the design the papers show: the stage drawn
 * once, the supplies, the hazard note above 60 V DC and every output's
 * parts with the values the BOM and the decks carry.
 */
export function driverSheets(input: Pick<PaperInput, "project" | "spec" | "matrix" | "options" | "budget">): Sheet[] {
  const { project, spec, matrix, options, budget } = input;
  return layoutDriverSheets({ project, spec, matrix, options, design: paperDesign(input), budget: budget?.ok ? budget.value : null });
}

/**
 * The files of one kind. The driver sheets, the BOM, the decks and the budget wait for the
 * budget (an empty list while `budget` is undefined), so that they never
 * show a design the budget then changes. A failed budget gives its error as
 * budget.json, and the BOM and decks with the project's values.
 *
 * @example
 * paperFiles(input, "bom"); // [{ name: "bom.csv", mediaType: "text/csv", text: "Quantity,References,..." }]
 */
export function paperFiles(input: PaperInput, kind: PaperKind): PaperFile[] {
  return [...filesOfKind(input, kind)];
}

/** The files of one kind (see `paperFiles`), each made when it is asked for. */
function* filesOfKind(input: PaperInput, kind: PaperKind): Generator<PaperFile> {
  const { project, spec, matrix, options, drawing, budget } = input;
  switch (kind) {
    case "svg": {
      const single = drawing.sheets.length === 1;
      for (const s of drawing.sheets) {
        yield { name: single ? "matrix.svg" : `matrix-${s.number}.svg`, mediaType: "image/svg+xml", text: sheetSvgText(s) };
      }
      return;
    }
    case "driver": {
      if (!budget) return;
      const sheets = driverSheets(input);
      for (const s of sheets) {
        yield { name: sheets.length === 1 ? "driver.svg" : `driver-${s.number}.svg`, mediaType: "image/svg+xml", text: sheetSvgText(s) };
      }
      return;
    }
    case "wiring":
      yield {
        name: "wiring.csv",
        mediaType: "text/csv",
        text: wiringCsv(wiringRows(matrix, drawing.placements), tieOnsOf(input), networkOf(input)),
      };
      return;
    case "wiring-page": {
      const rows = wiringRows(matrix, drawing.placements);
      yield {
        name: "wiring.html",
        mediaType: "text/html",
        text: wiringPageHtml({
          project,
          matrix,
          rows,
          tieOns: tieOnsOf(input),
          network: networkOf(input),
          options,
          sheetCount: drawing.sheets.length,
        }),
      };
      return;
    }
    case "budget":
      if (!budget) return;
      yield {
        name: "budget.json",
        mediaType: "application/json",
        text: budget.ok ? budgetJsonText(budget.value) : JSON.stringify({ error: budget.error }, null, 2) + "\n",
      };
      return;
    case "bom": {
      if (!budget) return;
      const design = paperDesign(input);
      const parts = designators(spec, matrix, designModel(project.electrical, design), design.ohms);
      yield { name: "bom.csv", mediaType: "text/csv", text: bomCsv(bomLines(project.electrical, parts, design)) };
      return;
    }
    case "netlists": {
      if (!budget) return;
      const design = paperDesign(input);
      let k = 0;
      for (const text of spiceNetlists(project, spec, matrix, design)) {
        yield { name: `spice/${spec.states[k++] as string}.cir`, mediaType: "text/plain", text };
      }
      return;
    }
    case "project":
      yield { name: "project.json", mediaType: "application/json", text: serializeProject(project) };
      return;
  }
}

/**
 * Every paper, in the order `export` writes them, each made only when the
 * one before it has been taken: a caller that writes each file and lets it
 * go holds one paper at a time, not the whole export (several hundred
 * decks and sheets for the largest projects). A failed budget leaves
 * budget.json out (the caller reports the failure).
 *
 * @example
 * for (const f of eachPaperFile(input)) await writeFile(join(dir, f.name), f.text);
 */
export function* eachPaperFile(input: PaperInput): Generator<PaperFile> {
  for (const k of PAPER_KINDS) if (k !== "budget" || input.budget?.ok === true) yield* filesOfKind(input, k);
}

/** Every paper at once, in the order `export` writes them (see `eachPaperFile`). */
export function allPaperFiles(input: PaperInput): PaperFile[] {
  return [...eachPaperFile(input)];
}

// An instrument of several decoders: one set of papers (the index, every decoder's sheets and decks, one BOM, wiring list and budget).
export {
  decoderFolder,
  eachInstrumentPaperFile,
  instrumentBomLines,
  instrumentPaperFiles,
  sheetIndex,
  sheetIndexText,
} from "./instrumentPapers.ts";
export type { DecoderPaperInput, InstrumentPaperInput, SheetIndexEntry } from "./instrumentPapers.ts";
