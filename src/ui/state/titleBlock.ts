/**
 * The title-block fields the person fills in (drawing number, revision,
 * date of issue, drawn by), as the command line's `export` takes them:
 * checked by the same rules (render/drawingOptions.ts), kept in the browser
 * with the paper, and given to every drawing the app lays out. An empty
 * field takes the drawing's default (the project's own drawing number,
 * revision A, no date, drawn by diodeloom).
 */
import { dateProblem, titleTextProblem, type DrawingOptions } from "../../render/drawingOptions.ts";
import type { KeyValueStore } from "./autosave.ts";

export interface TitleFields {
  readonly drawingNumber: string;
  readonly revision: string;
  readonly date: string;
  readonly drawnBy: string;
}

export const EMPTY_TITLE_FIELDS: TitleFields = { drawingNumber: "", revision: "", date: "", drawnBy: "" };

export const TITLE_FIELDS_KEY = "diodeloom.titleBlock";

/** What is wrong with a field's text, in the words of the form, or undefined when it may go on the drawing. */
export function titleFieldProblem(field: keyof TitleFields, text: string): string | undefined {
  if (text === "") return undefined;
  return field === "date" ? dateProblem(text) : titleTextProblem(text);
}

/**
 * The drawing options the fields give: only the fields that are filled in
 * and check out; the others keep their defaults.
 *
 * @example
 * titleOptions({ drawingNumber: "LT-7", revision: "", date: "2026-02-31", drawnBy: "" }); // { drawingNumber: "LT-7" }
 */
export function titleOptions(fields: TitleFields): Partial<DrawingOptions> {
  const out: { -readonly [K in keyof TitleFields]?: string } = {};
  for (const key of Object.keys(EMPTY_TITLE_FIELDS) as (keyof TitleFields)[]) {
    const text = fields[key];
    if (text !== "" && titleFieldProblem(key, text) === undefined) out[key] = text;
  }
  return out;
}

/** The fields kept in the browser, or empty ones; anything unreadable is left out. */
export function readTitleFields(store: KeyValueStore): TitleFields {
  try {
    const data: unknown = JSON.parse(store.getItem(TITLE_FIELDS_KEY) ?? "{}");
    if (typeof data !== "object" || data === null) return EMPTY_TITLE_FIELDS;
    const o = data as Record<string, unknown>;
    const text = (k: keyof TitleFields) => (typeof o[k] === "string" ? (o[k] as string) : "");
    return { drawingNumber: text("drawingNumber"), revision: text("revision"), date: text("date"), drawnBy: text("drawnBy") };
  } catch {
    return EMPTY_TITLE_FIELDS;
  }
}

/** Keeps the fields in the browser; a refused store only loses them for the next visit. */
export function writeTitleFields(store: KeyValueStore, fields: TitleFields): void {
  try {
    store.setItem(TITLE_FIELDS_KEY, JSON.stringify(fields));
  } catch {
    // The drawing on screen still has them.
  }
}
