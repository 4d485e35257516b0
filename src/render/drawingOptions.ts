/**
 * What a drawing needs besides the matrix: paper and the title-block fields
 * a person supplies. Everything has a fixed default so that the same project
 * always gives the same drawing; nothing here reads the clock.
 */
import type { Project } from "../core/project/project.ts";
import { PAPER_NAMES, type PaperName } from "./drawingModel.ts";

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

/** True for a paper name the drawing knows (`a4`, `a3`, `letter`). */
export function isPaper(name: string): name is PaperName {
  return (PAPER_NAMES as readonly string[]).includes(name);
}

/** Longest free text accepted for a title-block field (drawing number, revision, drawn by). */
export const TITLE_FIELD_MAX = 40;

/**
 * What is wrong with a title-block text, or undefined when it fits: at most
 * `TITLE_FIELD_MAX` printable characters. The command line and the app check
 * with the same rule.
 *
 * @example
 * titleTextProblem("Rev B\n"); // "must be at most 40 printable characters"
 */
export function titleTextProblem(text: string): string | undefined {
  if ([...text].length > TITLE_FIELD_MAX || /[\u0000-\u001f\u007f]/.test(text)) {
    return `must be at most ${TITLE_FIELD_MAX} printable characters`;
  }
  return undefined;
}

/**
 * What is wrong with a date of issue, or undefined for a real calendar date
 * written YYYY-MM-DD (ISO 8601, proleptic Gregorian calendar).
 *
 * @example
 * dateProblem("2026-02-31"); // "2026-02 has no day 31; give a real date, like 2026-03-01"
 */
export function dateProblem(text: string): string | undefined {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return "must be a date written YYYY-MM-DD, like 2026-03-01";
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (month < 1 || month > 12) return `there is no month ${m[2]}; give a real date, like 2026-03-01`;
  // Day 0 of the next month is the last day of this one; setUTCFullYear keeps years below 100 as written.
  const last = new Date(0);
  last.setUTCFullYear(year, month, 0);
  if (day < 1 || day > last.getUTCDate()) return `${m[1]}-${m[2]} has no day ${m[3]}; give a real date, like 2026-03-01`;
  return undefined;
}
