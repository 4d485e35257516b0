/**
 * The notes printed on every sheet of the matrix drawing: what to buy for
 * the diodes, how to read the symbol and the grid, and what to fit first.
 */
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import { darkOutputs, type DiodeMatrix } from "../core/matrix/matrix.ts";
import { refRanges } from "../core/papers/parts.ts";
import type { Project } from "../core/project/project.ts";
import { designators } from "../core/matrix/designators.ts";
import { formatOhms, milliampsExact } from "./units.ts";

/**
 * The notes of a drawing.
 *
 * @param continued the drawing takes more than one sheet (adds the continuation note)
 */
export function matrixNotes(project: Project, spec: DecodeSpec, matrix: DiodeMatrix, continued: boolean): string[] {
  const e = project.electrical;
  const refs = matrix.diodes.map((d) => d.ref);
  const notes: string[] = [];
  if (refs.length > 0) {
    notes.push(
      `Diodes ${refRanges(refs)} (${refs.length}): small-signal silicon, at least ${e.diode.maxReverseV} V reverse and ${milliampsExact(e.diode.maxForwardA)} mA forward.`,
    );
  }
  const dark = darkOutputs(matrix);
  if (spec.counter.kind === "one-hot" && dark.length > 0) {
    notes.push(
      "Band = cathode = bar on the symbol. Lit-decoded outputs: the anode takes the row (S line, bus or link line), the cathode the column it drives. Dark-decoded outputs: the diode is turned round, its band on the row (nS line, bus or link line) and its anode on the column it pulls down.",
    );
    notes.push("Lines that cross without a dot are not joined; a dot marks a joint.");
    notes.push(
      "Rows: the counter lines S<k> (high in state k) and nS<k> (low in state k), each with the text its state shows. Columns: output lines, grouped by display position; each ends at its driver stage (Q).",
    );
    notes.push(darkNote(project, spec, matrix));
  } else if (spec.counter.kind === "one-hot" && spec.polarity.inverting) {
    notes.push(
      "Band = cathode = bar on the symbol. Each diode is turned round: its band on the row (nS line, bus or link line), its anode on the column it pulls down, which switches that column's high-side PNP on.",
    );
    notes.push("Lines that cross without a dot are not joined; a dot marks a joint.");
    notes.push(
      `Rows: the active-low counter lines ${spec.polarity.activeLow[0]}-${spec.polarity.activeLow[spec.polarity.activeLow.length - 1]} (low in state k), each with the text its state shows. Columns: output lines, grouped by display position; each ends at its driver stage (Q).`,
    );
  } else if (spec.counter.kind === "one-hot") {
    notes.push(
      "Band = cathode = bar on the symbol. The anode takes the row (counter, bus or link line); the cathode goes to the column it drives.",
    );
    notes.push("Lines that cross without a dot are not joined; a dot marks a joint.");
    const foot = e.driver.kind === "direct" ? "its series resistor (R)" : "its driver stage (Q)";
    notes.push(
      `Rows: the counter lines ${spec.states[0]}-${spec.states[spec.states.length - 1]}, each with the text it shows. Columns: output lines, grouped by display position; each ends at ${foot}.`,
    );
  } else notes.push(...codedNotes(project, spec, matrix));
  if (matrix.buses.length > 0)
    notes.push(`Bus nodes ${matrix.buses.join(", ")}: the counter lines feed the bus column; the bus row feeds the outputs.`);
  const outputs = new Set(matrix.outputs);
  const links = matrix.diodes.filter((d) => outputs.has(d.from));
  if (links.length > 0) {
    const shown = links.slice(0, 6).map((d) => `${d.ref} ${d.from} to ${d.to}`);
    const more = links.length > shown.length ? ` and ${links.length - shown.length} more (see the wiring list)` : "";
    notes.push(`Links, output to output: ${shown.join(", ")}${more}; a link row taps its source column at the dot.`);
  }
  if (spec.tiedOn.length > 0) {
    notes.push(
      `Lit in every state, no diodes: ${someOf(spec.tiedOn)}, held on from the ${e.logicSupply.volts} V logic supply (net VLOGIC) through a tie-on resistor each.`,
    );
  }
  if (spec.neverLit.length > 0) notes.push(`Never lit, not wired: ${someOf(spec.neverLit)}.`);
  if (continued) notes.push("An arrowhead with sh.N marks a line continued on sheet N.");
  if (continued && (dark.length > 0 || matrix.gates.length > 0))
    notes.push("A designator with sh.N over a column names the column's pull-up, drawn at its top on sheet N.");
  notes.push("Fit the diodes in the order of the wiring list, row by row, ticking each one.");
  return notes;
}

/**
 * The dark-decoded columns in one sentence: what their pull-ups and foot
 * parts are and why the node then follows the segment.
 */
function darkNote(project: Project, spec: DecodeSpec, matrix: DiodeMatrix): string {
  const inputs = designators(spec, matrix, project.electrical).darkInputs;
  const outputs = inputs.map((p) => p.output);
  const pullUps = refRanges(inputs.map((p) => p.pullUp.ref));
  const dividers = inputs.flatMap((p) => (p.divider === null ? [] : [p.divider.ref]));
  const shift = inputs.flatMap((p) => p.shiftDiodes);
  const per = inputs[0]?.shiftDiodes.length ?? 0;
  const foot =
    dividers.length > 0
      ? `the divider's upper resistor at its foot (${refRanges(dividers)}; the lower one stands at the driver, on the driver sheet) keeps the driver off while the node is low`
      : shift.length > 0
        ? `the ${per} level-shift diode${per === 1 ? "" : "s"} at its foot (${refRanges(shift)}, band towards the driver) keep the driver off while the node is low`
        : "its line runs straight to the driver";
  return `Columns marked dark (${outputs.join(", ")}) are held high by the pull-up at their top (${pullUps}, from the ${project.electrical.logicSupply.volts} V logic supply, net VLOGIC) and pulled low through their diodes by the nS line of each state in which the segment is dark, so the node is high exactly when the segment is lit, and ${foot}.`;
}

/** How to read a coded counter's decoder: the two planes, the gates, and the code of every state. */
function codedNotes(project: Project, spec: DecodeSpec, matrix: DiodeMatrix): string[] {
  const n = spec.counter.stages;
  const gates = matrix.gates.map((g) => g.ref);
  const pullUps = designators(spec, matrix, project.electrical).gates.map((g) => g.pullUp.ref);
  const notes = [
    "Band = cathode = bar on the symbol. OR diodes: the anode takes the row (stage line, gate, bus or link line), the band the column it drives. AND-gate diodes (on a gate column): the anode takes the gate column, the band the stage line.",
    "Lines that cross without a dot are not joined; a dot marks a joint.",
    `Rows: the counter's stage lines Q0-Q${n - 1}, nQ<i> being stage i's complement output${gates.length > 0 ? ", then one row per AND gate" : ""}. Columns: ${gates.length > 0 ? "the AND gates, then " : ""}the output lines, grouped by display position; each ends at its driver's base (Q).`,
  ];
  if (gates.length > 0) {
    notes.push(
      `AND gates ${refRanges(gates)}: each gate's column is its node, pulled up by the resistor drawn at the column's top (${refRanges(pullUps)} in gate order, ${formatOhms(project.electrical.gatePullUp)} each, from the ${project.electrical.logicSupply.volts} V logic supply, net VLOGIC) and held low by a diode to each input line; the column turns into the gate's row, which feeds the outputs.`,
    );
  }
  const codes = spec.states.map((s, k) => `${s} ${spec.counter.codes[k]} "${spec.texts[k] ?? ""}"`);
  const shown = codes.slice(0, 16).join(", ");
  notes.push(`States and codes (Q${n - 1} leftmost): ${shown}${codes.length > 16 ? ` and ${codes.length - 16} more` : ""}.`);
  return notes;
}

/** A list for a note: the first dozen names, then how many more. */
function someOf(names: readonly string[]): string {
  const shown = names.slice(0, 12).join(", ");
  return names.length > 12 ? `${shown} and ${names.length - 12} more` : shown;
}
