/**
 * The bill of materials: one line per distinct part, from the parts count
 * (and so from the designators), with quantity, designators as ranges
 * (D1-D24), value and description. The resistors that set the segment
 * currents are the design's (the trim where the design takes it), and their
 * description says which.
 * The same words serve the parts list of `synth` and the print view.
 */
import { csvText } from "../core/papers/csv.ts";
import { designSource, type SegmentDesign } from "../core/budget/segmentDesign.ts";
import type { Designators } from "../core/matrix/designators.ts";
import { countParts, refRanges, type PartGroup } from "../core/papers/parts.ts";
import type { ElectricalModel } from "../core/project/project.ts";
import { formatOhms, milliampsExact } from "./units.ts";

export interface BomLine {
  readonly quantity: number;
  /** Designators as ranges, e.g. `D1-D24, D30`. */
  readonly references: string;
  /** The designators one by one. */
  readonly refs: readonly string[];
  readonly value: string;
  readonly description: string;
}

/** A part's value as a BOM prints it: `10k`, `NPN`, `1 LED`, `22 LEDs`. */
export function partValue(g: PartGroup, e: ElectricalModel): string {
  if (g.ohms !== null) return formatOhms(g.ohms);
  switch (g.kind) {
    case "diode":
    case "level-shift-diode":
      return "small-signal silicon";
    case "transistor":
      return e.driver.kind === "high-side-switch" ? "PNP" : "NPN";
    case "display":
      return e.segment.leds === 1 ? "1 LED" : `${e.segment.leds} LEDs`;
    default:
      throw new Error(`bug: a ${g.kind} group without a resistance`);
  }
}

const DRIVER_WORDS: Readonly<Record<ElectricalModel["driver"]["kind"], string>> = {
  "current-sink": "constant-current sink",
  "low-side-switch": "low-side switch",
  "emitter-follower": "emitter follower",
  "high-side-switch": "high-side switch",
  direct: "none",
};

/** A part's description as a BOM prints it, with the ratings to buy to. */
export function partDescription(g: PartGroup, e: ElectricalModel, design: SegmentDesign): string {
  switch (g.kind) {
    case "diode":
      return `matrix diode, ≥${e.diode.maxReverseV} V reverse, ≥${milliampsExact(e.diode.maxForwardA)} mA forward`;
    case "transistor":
      return `segment driver (${DRIVER_WORDS[e.driver.kind]}), Vce(max) ≥ ${e.driver.maxVceV} V, ≥ ${e.driver.maxPowerW} W, Ic ≥ ${milliampsExact(e.driver.maxCollectorA)} mA`;
    case "emitter-resistor":
      return `emitter resistor, sets the segment current, ${e.tolerance.resistorPct} %, ${designSource(design)}`;
    case "series-resistor":
      return design.role === "series"
        ? `segment series resistor, sets the segment current, ${e.tolerance.resistorPct} %, ${designSource(design)}`
        : `collector resistor, takes part of the drop off the sink, ${e.tolerance.resistorPct} %`;
    case "base-resistor":
      return `base resistor, ${e.tolerance.resistorPct} %`;
    case "base-emitter-resistor":
      return e.driver.kind === "high-side-switch"
        ? `base-emitter resistor, from the segment supply to the base, holds the switch off, ${e.tolerance.resistorPct} %`
        : `base-emitter resistor, holds the switch off, ${e.tolerance.resistorPct} %`;
    case "pull-down":
      return "output line pull-down";
    case "line-pull-up":
      return `output line pull-up to the segment supply (${e.supply.volts} V), holds the high-side switch off`;
    case "tie-on-resistor":
      return e.driver.kind === "high-side-switch"
        ? "holds an always-lit segment on, from its output line to ground"
        : `holds an always-lit segment on, from the logic supply (${e.logicSupply.volts} V)`;
    case "level-shift-diode":
      return `level-shift diode in series with a dark-decoded output's driver input (keeps it off while the node is pulled down), the matrix diode's type`;
    case "dark-pull-up":
      return `pull-up of a dark-decoded output node, from the logic supply (${e.logicSupply.volts} V), ${e.tolerance.resistorPct} %, sized by the budget's ghost check`;
    case "divider-resistor":
      return `divider from a dark-decoded output node to its driver's input (over the pull-down), ${e.tolerance.resistorPct} %, sized by the budget's ghost check`;
    case "gate-pull-up":
      return `AND gate pull-up, from the logic supply (${e.logicSupply.volts} V) to the gate node, ${e.tolerance.resistorPct} %`;
    case "display":
      return `segment, ${e.segment.leds === 1 ? "one LED" : `${e.segment.leds} LEDs in series`}, ${milliampsExact(e.segment.targetA)} mA`;
  }
}

/**
 * The BOM lines, in the order of the parts count (diodes, drivers,
 * resistors role by role and value by value, segments).
 *
 * @param parts the designators of the design (with its emitter values)
 * @param design which emitter values those are, for their description
 * @example
 * bomLines(project.electrical, designators(spec, matrix, project.electrical, design.ohms), design)[0];
 * // { quantity: 78, references: "D1-D78", value: "small-signal silicon", ... }
 */
export function bomLines(e: ElectricalModel, parts: Designators, design: SegmentDesign): BomLine[] {
  return countParts(parts).map((g) => ({
    quantity: g.refs.length,
    references: refRanges(g.refs),
    refs: g.refs,
    value: partValue(g, e),
    description: partDescription(g, e, design),
  }));
}

export const BOM_HEADER = ["Quantity", "References", "Value", "Description"] as const;

/** The BOM as CSV, header first. */
export function bomCsv(lines: readonly BomLine[]): string {
  return csvText([[...BOM_HEADER], ...lines.map((l) => [l.quantity, l.references, l.value, l.description])]);
}
