/**
 * The wiring list: one row per diode in assembly order, row by row of the
 * drawing (counter lines in state order, then bus rows, then links, as
 * `buildMatrix` numbers them), and the inspection checklist to close with.
 *
 * Where each diode sits on the drawing (sheet and zone) comes from the
 * layout, passed in as plain data so that the core does not depend on it.
 *
 * A tied-on output (lit in every state) has no diode: its tie-on resistor
 * joins the logic supply's net VLOGIC to the output line. The list names
 * them after the diodes, so that the net and the part are wired too, and
 * last the pull-ups drawn at the columns' tops (an AND gate's, a
 * dark-decoded output's) with a dark-decoded output's input network.
 */
import { csvText } from "./csv.ts";
import type { Designators, DriverParts } from "../matrix/designators.ts";
import { darkSideDiodes, type DiodeMatrix } from "../matrix/matrix.ts";

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
  { item: "Polarity", check: "every diode's band (cathode) is on the line the list names second, as the bar on the symbol" },
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
  const dark = darkSideDiodes(matrix);
  return matrix.diodes.map((d, i) => {
    const at = placements?.get(d.ref);
    // A dark-side diode is driven from its cathode: the list names each diode's anode first all the same.
    const [anode, cathode] = dark.has(d.ref) ? [d.to, d.from] : [d.from, d.to];
    return { step: i + 1, ref: d.ref, from: anode, to: cathode, sheet: at?.sheet ?? null, zone: at?.zone ?? "" };
  });
}

/** The net tied-on outputs hang from: the logic supply, as the drawing and the SPICE decks name it. */
export const LOGIC_SUPPLY_NET = "VLOGIC";

/** The ground net, as the drawing names it. */
export const GROUND_NET = "GND";

/**
 * A tied-on output's tie-on resistor: from the logic supply's net to the
 * output line, or, for a high-side switch (on while its line is low), from
 * the output line to ground.
 */
export interface TieOnRow {
  readonly ref: string;
  /** The logic supply's net, or the output line of a high-side switch. */
  readonly from: string;
  /** The output line, or the ground net for a high-side switch. */
  readonly to: string;
  /** Ohms. */
  readonly ohms: number;
}

/**
 * The tie-on resistors of a build, in output order.
 *
 * @example
 * tieOnRows(designators(spec, matrix, e).drivers); // [{ ref: "R16", from: "VLOGIC", to: "2b", ohms: 470 }]
 */
export function tieOnRows(drivers: readonly DriverParts[]): TieOnRow[] {
  return drivers.flatMap((d) => {
    if (!d.tieOn) return [];
    const low = d.kind === "high-side-switch";
    return [{ ref: d.tieOn.ref, from: low ? d.output : LOGIC_SUPPLY_NET, to: low ? GROUND_NET : d.output, ohms: d.tieOn.ohms }];
  });
}

/** The heading of the tie-on rows in the CSV and the printed lists. */
export const TIE_ON_HEADING =
  "Tied-on outputs (no diodes): each tie-on resistor from the logic supply net VLOGIC to the output line (a high-side switch's from the output line to GND)";

/**
 * A part at the top or foot of a column: an AND gate's pull-up from the
 * logic supply's net to the gate node; or a part between a dark-decoded
 * output's node and its driver: its pull-up from the logic supply's net,
 * its level-shift diodes (anode first) or its divider's upper resistor, to
 * the driver's input (`1a in`; the diodes' joints between are `1a/1`, ...).
 */
export interface NetworkRow {
  readonly ref: string;
  readonly part: "gate pull-up" | "pull-up" | "level-shift diode" | "divider";
  readonly from: string;
  readonly to: string;
  /** Ohms; null for a diode. */
  readonly ohms: number | null;
  /** The matrix sheet the part is drawn on (at its column), or null when not placed. */
  readonly sheet: number | null;
  /** Its zone on that sheet, e.g. `A3`; empty when not placed. */
  readonly zone: string;
}

/** The net at a dark-decoded output's driver input, as the wiring list names it. */
export function driverInputNet(output: string): string {
  return `${output} in`;
}

/**
 * The AND gates' pull-ups, gate by gate, then the input network of the
 * dark-decoded outputs, output by output.
 *
 * @example
 * networkRows(designators(spec, matrix, e), drawing.placements)[0];
 * // { ref: "R29", part: "pull-up", from: "VLOGIC", to: "1a", ohms: 4300, sheet: 1, zone: "A2" }
 */
export function networkRows(
  parts: Pick<Designators, "gates" | "darkInputs">,
  placements?: ReadonlyMap<string, DrawingPosition>,
): NetworkRow[] {
  const place = (ref: string): { sheet: number | null; zone: string } => {
    const at = placements?.get(ref);
    return { sheet: at?.sheet ?? null, zone: at?.zone ?? "" };
  };
  const gates = parts.gates.map((g): NetworkRow => ({
    ref: g.pullUp.ref,
    part: "gate pull-up",
    from: LOGIC_SUPPLY_NET,
    to: g.gate,
    ohms: g.pullUp.ohms,
    ...place(g.pullUp.ref),
  }));
  return gates.concat(networkOfDark(parts.darkInputs, place));
}

function networkOfDark(inputs: Designators["darkInputs"], place: (ref: string) => { sheet: number | null; zone: string }): NetworkRow[] {
  return inputs.flatMap((p) => {
    const rows: NetworkRow[] = [
      { ref: p.pullUp.ref, part: "pull-up", from: LOGIC_SUPPLY_NET, to: p.output, ohms: p.pullUp.ohms, ...place(p.pullUp.ref) },
    ];
    if (p.divider !== null)
      rows.push({
        ref: p.divider.ref,
        part: "divider",
        from: p.output,
        to: driverInputNet(p.output),
        ohms: p.divider.ohms,
        ...place(p.divider.ref),
      });
    p.shiftDiodes.forEach((ref, j) => {
      const from = j === 0 ? p.output : `${p.output}/${j}`;
      const to = j === p.shiftDiodes.length - 1 ? driverInputNet(p.output) : `${p.output}/${j + 1}`;
      rows.push({ ref, part: "level-shift diode", from, to, ohms: null, ...place(ref) });
    });
    return rows;
  });
}

/** The heading of the input-network rows. */
export const NETWORK_HEADING =
  "Dark-decoded outputs' input network: each pull-up from VLOGIC to the output line, then its level-shift diodes (anode first, band towards the driver) or divider to the driver's input";

/** The heading of the AND gates' pull-up rows. */
export const GATE_PULL_UP_HEADING = "AND gates' pull-ups: each from VLOGIC to the gate node, at the top of the gate's column";

/**
 * The heading over a list of network rows: the gates' pull-ups', the
 * dark-decoded outputs' input network's, or both joined.
 */
export function networkHeading(rows: readonly NetworkRow[]): string {
  const gates = rows.some((r) => r.part === "gate pull-up");
  const dark = rows.some((r) => r.part !== "gate pull-up");
  if (gates && dark) return `${GATE_PULL_UP_HEADING}. ${NETWORK_HEADING}`;
  return gates ? GATE_PULL_UP_HEADING : NETWORK_HEADING;
}

/** Column heads of the wiring CSV. */
export const WIRING_HEADER = ["Step", "Ref", "From (anode)", "To (cathode, band)", "Sheet", "Zone", "Done"] as const;

/**
 * The wiring list as CSV: the header, one record per diode with an empty
 * Done column to tick; where outputs are tied on, a blank record, their
 * heading and one record per tie-on resistor (Step `T1`.., its reference,
 * VLOGIC, the output line); where outputs are decoded dark, a blank record,
 * their heading and one record per part of their input network (Step
 * `N1`..), after the AND gates' pull-ups where there are gates (the same
 * records, under `networkHeading`); then a blank record and the inspection
 * checklist in the same columns (Step `C1`.., Ref the item, From the check).
 */
export function wiringCsv(rows: readonly WiringRow[], tieOns: readonly TieOnRow[] = [], network: readonly NetworkRow[] = []): string {
  return csvText([[...WIRING_HEADER], ...wiringRecords(rows, tieOns, network), [], ...checklistRecords()]);
}

/** The CSV records of one decoder's wiring: its diodes, then its tie-ons and its input network, each after a blank record and a heading. */
export function wiringRecords(
  rows: readonly WiringRow[],
  tieOns: readonly TieOnRow[] = [],
  network: readonly NetworkRow[] = [],
): (string | number)[][] {
  const records: (string | number)[][] = rows.map((r) => [r.step, r.ref, r.from, r.to, r.sheet ?? "", r.zone, ""]);
  if (tieOns.length > 0) {
    records.push([]);
    records.push([TIE_ON_HEADING, "", "", "", "", "", ""]);
    tieOns.forEach((t, i) => records.push([`T${i + 1}`, t.ref, t.from, t.to, "", "", ""]));
  }
  if (network.length > 0) {
    records.push([]);
    records.push([networkHeading(network), "", "", "", "", "", ""]);
    network.forEach((n, i) => records.push([`N${i + 1}`, n.ref, n.from, n.to, n.sheet ?? "", n.zone, ""]));
  }
  return records;
}

/** The inspection checklist's CSV records, under their heading. */
export function checklistRecords(): (string | number)[][] {
  return [
    ["Inspection checklist", "", "", "", "", "", ""],
    ...INSPECTION_CHECKLIST.map((c, i) => [`C${i + 1}`, c.item, c.check, "", "", "", ""]),
  ];
}
