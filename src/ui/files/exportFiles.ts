/**
 * The files the Export menu offers for the shown result, built by the core
 * and render stages; this module only collects and names them.
 */
import { bomCsv, bomLines } from "../../core/papers/bom.ts";
import type { Budget } from "../../core/budget/budget.ts";
import { spiceNetlist } from "../../core/papers/netlist.ts";
import { serializeProject } from "../../core/project/projectWriter.ts";
import type { Result } from "../../core/result/result.ts";
import { wiringCsv, wiringRows } from "../../core/papers/wiringList.ts";
import type { PaperName } from "../../render/drawingModel.ts";
import { drawingOptions } from "../../render/drawingOptions.ts";
import { layoutMatrix } from "../../render/layout.ts";
import { wiringPageHtml } from "../../render/wiringPage.ts";
import type { LiveResult } from "../workers/liveResult.ts";
import { sheetSvgText } from "./sheetSvg.ts";
import { zipArchive } from "./zipArchive.ts";

export interface ExportFile {
  readonly name: string;
  readonly mime: string;
  /** Text, or the bytes of an archive. */
  readonly content: string | Uint8Array;
}

export type ExportKind = "svg" | "wiring" | "wiring-page" | "bom" | "netlists" | "budget" | "project";

/** One file stays itself; several go into one ZIP archive, so each export is one download. */
function bundle(archiveName: string, files: readonly { name: string; text: string; mime: string }[]): ExportFile[] {
  const only = files[0];
  if (files.length === 1 && only) return [{ name: only.name, mime: only.mime, content: only.text }];
  return [{ name: archiveName, mime: "application/zip", content: zipArchive(files) }];
}

/** Trimmed emitter resistors from a budget, for the BOM. */
function trimmedOhms(budget: Result<Budget, unknown> | undefined): ReadonlyMap<string, number> | undefined {
  if (!budget?.ok) return undefined;
  return new Map(Object.entries(budget.value.trim.outputs).map(([o, t]) => [o, t.ohms]));
}

/**
 * The files of one export kind. An empty list means the export is not
 * ready (the budget of this result has not been worked out yet).
 */
export function exportFiles(r: LiveResult, kind: ExportKind, paper: PaperName, budget?: Result<Budget, unknown>): ExportFile[] {
  const options = drawingOptions(r.project, { paper });
  switch (kind) {
    case "svg": {
      const sheets = layoutMatrix(r.project, r.spec, r.matrix, options).sheets;
      return bundle(
        "matrix-sheets.zip",
        sheets.map((s) => ({
          name: sheets.length === 1 ? "matrix.svg" : `matrix-${s.number}.svg`,
          mime: "image/svg+xml",
          text: sheetSvgText(s),
        })),
      );
    }
    case "wiring": {
      const drawing = layoutMatrix(r.project, r.spec, r.matrix, options);
      const rows = wiringRows(r.matrix, drawing.placements);
      return [{ name: "wiring.csv", mime: "text/csv", content: wiringCsv(rows) }];
    }
    case "wiring-page": {
      const drawing = layoutMatrix(r.project, r.spec, r.matrix, options);
      const rows = wiringRows(r.matrix, drawing.placements);
      return [
        { name: "wiring.html", mime: "text/html", content: wiringPageHtml(r.project, r.matrix, rows, options, drawing.sheets.length) },
      ];
    }
    case "bom":
      return [{ name: "bom.csv", mime: "text/csv", content: bomCsv(bomLines(r.project, r.spec, r.matrix, trimmedOhms(budget))) }];
    case "netlists":
      return bundle(
        "spice-netlists.zip",
        r.spec.states.map((s, k) => ({
          name: `spice/${s}.cir`,
          mime: "text/plain",
          text: spiceNetlist(r.project, r.spec, r.matrix, k, trimmedOhms(budget)),
        })),
      );
    case "budget":
      if (!budget) return [];
      return [
        {
          name: "budget.json",
          mime: "application/json",
          content: JSON.stringify(budget.ok ? budget.value : { error: budget.error }, null, 2) + "\n",
        },
      ];
    case "project":
      return [{ name: "project.json", mime: "application/json", content: serializeProject(r.project) }];
  }
}
