/**
 * What a drawing needs besides the matrix: paper and the title-block fields
 * a person supplies. Everything has a fixed default so that the same project
 * always gives the same drawing; nothing here reads the clock.
 */
import type { Project } from "../core/project/project.ts";
import type { PaperName } from "./drawingModel.ts";

export interface DrawingOptions {
  readonly paper: PaperName;
  readonly drawingNumber: string;
  readonly revision: string;
  /** Date of issue as printed; empty leaves the field for a hand entry. */
  readonly date: string;
  readonly drawnBy: string;
}

/** Name printed as the creator when none is given. */
export const DEFAULT_DRAWN_BY = "diodeloom";

/**
 * Fills in the options: A4, revision A, no date, drawn by diodeloom, and a
 * drawing number derived from the project's title and texts (`DL-` and 8 hex
 * digits of an FNV-1a hash), so it stays the same from run to run.
 *
 * @example
 * drawingOptions(project, { paper: "letter", date: "2026-03-01" });
 */
export function drawingOptions(project: Project, given: Partial<DrawingOptions> = {}): DrawingOptions {
  return {
    paper: given.paper ?? "a4",
    drawingNumber: given.drawingNumber ?? defaultDrawingNumber(project),
    revision: given.revision ?? "A",
    date: given.date ?? "",
    drawnBy: given.drawnBy ?? DEFAULT_DRAWN_BY,
  };
}

/** `DL-` and the FNV-1a hash of the title and the state texts, 8 hex digits. */
export function defaultDrawingNumber(project: Project): string {
  const text = [project.title, ...project.show].join("\n");
  let h = 0x811c9dc5;
  for (const byte of new TextEncoder().encode(text)) {
    h ^= byte;
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return `DL-${h.toString(16).toUpperCase().padStart(8, "0")}`;
}
