/**
 * The wiring list: one row per diode in assembly order, row by row of the
 * drawing (counter lines in state order, then bus rows, then links, as
 * `buildMatrix` numbers them), and the inspection checklist to close with.
 *
 * Where each diode sits on the drawing (sheet and zone) comes from the
 * layout, passed in as plain data so that the core does not depend on it.
 */
import { csvText } from "./csv.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";

export interface WiringRow {
  /** Assembly step, 1-based. */
  readonly step: number;
  readonly ref: string;
  /** Anode end: the driving line. */
  readonly from: string;
  /** Cathode end (the band): the driven line. */
  readonly to: string;
  /** Drawing sheet number, or null when no drawing was made. */
  readonly sheet: number | null;
  /** Drawing zone such as `C4`, or "" when no drawing was made. */
  readonly zone: string;
}

export interface DrawingPosition {
  readonly sheet: number;
  readonly zone: string;
}

/** The checks after assembly, in the order a builder does them. */
export const INSPECTION_CHECKLIST: readonly { readonly item: string; readonly check: string }[] = [
  { item: "Polarity", check: "every diode's band (cathode) faces the driven line, as the bar on the symbol" },
  { item: "Count", check: "the number of diodes fitted equals the number of rows above" },
  { item: "Joints", check: "every joint is soldered and bright; every dot on the drawing is a joint" },
  { item: "No bridges", check: "no solder bridge or stray lead joins two lines; crossings without a dot stay apart" },
  { item: "Continuity", check: "with one counter line high, only the segments of that state light" },
];

/**
 * The rows of the wiring list, in the matrix's assembly order.
 *
 * @example
 * wiringRows(matrix, drawing.placements)[0]; // { step: 1, ref: "D1", from: "S0", to: "1a", sheet: 1, zone: "B2" }
 */
export function wiringRows(matrix: DiodeMatrix, placements?: ReadonlyMap<string, DrawingPosition>): WiringRow[] {
  return matrix.diodes.map((d, i) => {
    const at = placements?.get(d.ref);
    return { step: i + 1, ref: d.ref, from: d.from, to: d.to, sheet: at?.sheet ?? null, zone: at?.zone ?? "" };
  });
}

/** Column heads of the wiring CSV. */
export const WIRING_HEADER = ["Step", "Ref", "From (anode)", "To (cathode, band)", "Sheet", "Zone", "Done"] as const;

/**
 * The wiring list as CSV: the header, one record per diode with an empty
 * Done column to tick, a blank record, then the inspection checklist in the
 * same columns (Step `C1`.., Ref the item, From the check).
 */
export function wiringCsv(rows: readonly WiringRow[]): string {
  const records: (string | number)[][] = [[...WIRING_HEADER]];
  for (const r of rows) records.push([r.step, r.ref, r.from, r.to, r.sheet ?? "", r.zone, ""]);
  records.push([]);
  records.push(["Inspection checklist", "", "", "", "", "", ""]);
  INSPECTION_CHECKLIST.forEach((c, i) => records.push([`C${i + 1}`, c.item, c.check, "", "", "", ""]));
  return csvText(records);
}
