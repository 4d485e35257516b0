/**
 * The bill of materials: one line per distinct part, built on the parts
 * count, with quantity, designators as ranges (D1-D24), value and
 * description. Trimmed emitter resistor values replace the nominal ones when
 * the budget has worked them out.
 */
import { csvText } from "./csv.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import { countParts, refRanges, type PartGroup } from "./parts.ts";
import type { Project } from "../project/project.ts";

export interface BomLine {
  readonly quantity: number;
  /** Designators as ranges, e.g. `D1-D24, D30`. */
  readonly references: string;
  /** The designators one by one. */
  readonly refs: readonly string[];
  readonly value: string;
  readonly description: string;
}

/**
 * The BOM lines, in the order of the parts count (diodes, drivers, emitter
 * resistors by value, pull-downs, tie-on resistors, display strings).
 *
 * @param trimmedOhms emitter resistor per output name, ohms, from a budget
 */
export function bomLines(project: Project, spec: DecodeSpec, matrix: DiodeMatrix, trimmedOhms?: ReadonlyMap<string, number>): BomLine[] {
  return countParts(project, spec, matrix, trimmedOhms).map((g: PartGroup) => ({
    quantity: g.refs.length,
    references: refRanges(g.refs),
    refs: g.refs,
    value: g.value,
    description: g.kind === "emitter-resistor" && trimmedOhms ? `${g.description}, trimmed by the budget` : g.description,
  }));
}

export const BOM_HEADER = ["Quantity", "References", "Value", "Description"] as const;

/** The BOM as CSV, header first. */
export function bomCsv(lines: readonly BomLine[]): string {
  return csvText([[...BOM_HEADER], ...lines.map((l) => [l.quantity, l.references, l.value, l.description])]);
}
