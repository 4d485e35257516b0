/**
 * The files the Export menu offers for the shown result, built by the core
 * and render stages; this module only names them.
 */
import type { LiveResult } from "./liveResult.ts";
import { draftFromProject, draftToJson } from "./draft.ts";

export interface ExportFile {
  readonly name: string;
  readonly mime: string;
  readonly text: string;
}

export type ExportKind = "project";

/** Every export of a result, as file name, type and content. */
export function exportFiles(r: LiveResult, kind: ExportKind): ExportFile[] {
  switch (kind) {
    case "project":
      return [{ name: "project.json", mime: "application/json", text: draftToJson(draftFromProject(r.project)) }];
  }
}
