/**
 * The draft: the project as the person is editing it, in the file format.
 *
 * The app keeps the draft as its one source of truth. Every edit makes a new
 * draft; `validateProject` then turns it into a strict `Project` or into
 * path-naming problems. A draft may be invalid while someone is typing; the
 * last valid project keeps its (stale) results on screen meanwhile.
 */
import type { CellKind, CounterCodeKind, CounterDrive, ElectricalModel, Project, SynthesisFields } from "../../core/project/project.ts";
import { electricalFields, serializeProject, synthesisFields } from "../../core/project/projectWriter.ts";
import { figureFields } from "../../core/project/figureSchema.ts";

import { validateProject } from "../../core/project/projectSchema.ts";
import { PROJECT_SCHEMA } from "../../core/project/project.ts";

/** A figure as the file writes it (`display.figure`). */
export type FigureFields = ReturnType<typeof figureFields>;

export interface Draft {
  readonly schema: typeof PROJECT_SCHEMA;
  readonly title: string;
  readonly counter: {
    readonly states: number;
    readonly drive: CounterDrive;
    readonly code: CounterCodeKind;
    readonly codes?: readonly string[];
  };
  readonly display: {
    readonly positions: number;
    readonly cell: CellKind;
    readonly segments?: readonly string[];
    /** A custom cell's figure, as the file writes it. */
    readonly figure?: FigureFields;
  };
  /** The file's own glyph entries (overrides of the built-in table). */
  readonly glyphs: Readonly<Record<string, readonly string[]>>;
  readonly show: readonly string[];
  readonly synthesis: SynthesisFields;
  readonly electrical: ElectricalModel;
}

/** The complete draft of a validated project; saving it and reading it back gives the same project. */
export function draftFromProject(p: Project): Draft {
  const cell = p.display.cell;
  return {
    schema: PROJECT_SCHEMA,
    title: p.title,
    counter:
      p.counter.code === "custom"
        ? { states: p.counter.states, drive: p.counter.drive, code: "custom", codes: [...p.counter.codes] }
        : { states: p.counter.states, drive: p.counter.drive, code: p.counter.code },
    display:
      cell.kind === "custom"
        ? {
            positions: p.display.positions,
            cell: cell.kind,
            segments: [...cell.segments],
            ...(cell.figure ? { figure: figureFields(cell.figure) } : {}),
          }
        : { positions: p.display.positions, cell: cell.kind },
    glyphs: Object.fromEntries(Object.entries(p.glyphOverrides).map(([ch, segs]) => [ch, [...segs]])),
    show: [...p.show],
    synthesis: synthesisFields(p.synthesis),
    electrical: electricalFields(p.electrical),
  };
}

/**
 * The draft as project JSON text, in the one form every file diodeloom
 * writes takes (the Save button, the Project JSON export, `diodeloom
 * export`'s project.json): a draft that validates is written by
 * `serializeProject`, byte for byte; one that does not (a project being
 * fixed) is written as it stands, glyphs as arrays of segment names as well.
 */
export function draftToJson(d: Draft): string {
  const v = validateProject(d);
  return v.ok ? serializeProject(v.value) : JSON.stringify(d, null, 2) + "\n";
}
