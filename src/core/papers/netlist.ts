/**
 * The SPICE netlist of one state's circuit: a standard deck (title line,
 * `.model` cards, elements, `.op`, `.end`) that any SPICE simulator runs
 * unchanged, for every driver kind. Each segment is written out LED by LED,
 * each LED's series resistance in its model card.
 */
import { buildCircuit, circuitFrame, stateCircuit, type Circuit } from "../circuit/circuit.ts";
import { highLines } from "../circuit/counterLines.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import type { Project } from "../project/project.ts";
import { designModel, designNote, type SegmentDesign } from "../budget/segmentDesign.ts";

/** `num`'s recent answers: a deck repeats a few values (model parameters, levels) thousands of times. */
const written = new Map<number, string>();

/** Formats a number the way every SPICE reads it (no unit suffixes). */
function num(x: number): string {
  const known = written.get(x);
  if (known !== undefined) return known;
  if (!Number.isFinite(x)) throw new RangeError(`cannot write ${x} into a netlist`);
  const text = String(Number(x.toPrecision(12)));
  if (written.size >= 4096) written.clear();
  written.set(x, text);
  return text;
}

/**
 * Node name after LED `i` (1-based) inside a segment, counted from its
 * anode, named after the segment's end away from the supply or ground
 * (`c1a_3`, `a1a_2`).
 */
export function segmentLedNode(end: string, i: number): string {
  return `${end}_${i}`;
}

/**
 * An element's name as SPICE reads it: the name itself when it starts with
 * the element's letter, else the letter in front. SPICE takes an element's
 * kind from the first letter of its name, and a decoder of an instrument
 * numbers its parts with the decoder's number in front (`2R14`,
 * designators.ts), so that part is written `R2R14`.
 */
export function spiceName(letter: "R" | "D" | "Q", name: string): string {
  return name.toUpperCase().startsWith(letter) ? name : `${letter}${name}`;
}

/**
 * Writes a circuit as a SPICE deck.
 *
 * @param title the deck's title line (SPICE ignores the first line)
 */
export function circuitNetlist(circuit: Circuit, title: string, notes: readonly string[] = []): string {
  const lines: string[] = [`* ${title.replace(/[\r\n]+/g, " ")}: state ${circuit.state} active`];
  lines.push("* Written by diodeloom; DC operating point of one counter state. Units: V, A, ohm.");
  for (const note of notes) lines.push(`* ${note.replace(/[\r\n]+/g, " ")}`);
  lines.push(`.options TNOM=${num(circuit.temperatureC)}`);
  lines.push(`.temp ${num(circuit.temperatureC)}`);
  // One .model card per distinct parameter set: DMTX, DMTX2, ... (a corner may differ per part).
  const models = new Map<string, string>();
  const perPrefix = new Map<string, number>();
  const modelOf = (prefix: string, card: string): string => {
    const known = models.get(card);
    if (known) return known;
    const count = (perPrefix.get(prefix) ?? 0) + 1;
    perPrefix.set(prefix, count);
    const name = count === 1 ? prefix : `${prefix}${count}`;
    models.set(card, name);
    return name;
  };
  const body: string[] = [];
  for (const el of circuit.elements) {
    switch (el.kind) {
      case "vsource":
        body.push(`${el.name} ${el.node} 0 DC ${num(el.volts)}`);
        break;
      case "resistor":
        body.push(`${spiceName("R", el.name)} ${el.a} ${el.b} ${num(el.ohms)}`);
        break;
      case "diode": {
        const m = modelOf("DMTX", `D (IS=${num(el.isA)} N=${num(el.n)} RS=${num(el.rsOhms)})`);
        body.push(`${spiceName("D", el.name)} ${el.anode} ${el.cathode} ${m}`);
        break;
      }
      case "segment": {
        const rs = el.rsOhms > 0 ? ` RS=${num(el.rsOhms)}` : "";
        const m = modelOf("DLED", `D (IS=${num(el.isA)} N=${num(el.n)}${rs})`);
        // Inner nodes are named after the segment's far end from the supply: its cathode, or its anode when the cathode is ground.
        const far = el.cathode === "0" ? el.anode : el.cathode;
        for (let i = 1; i <= el.leds; i++) {
          const a = i === 1 ? el.anode : segmentLedNode(far, i - 1);
          const k = i === el.leds ? el.cathode : segmentLedNode(far, i);
          body.push(`D${el.name}_${i} ${a} ${k} ${m}`);
        }
        break;
      }
      case "npn": {
        const m = modelOf("QDRV", `NPN (IS=${num(el.isA)} BF=${num(el.betaF)} BR=${num(el.betaR)})`);
        body.push(`${spiceName("Q", el.name)} ${el.collector} ${el.base} ${el.emitter} ${m}`);
        break;
      }
      case "pnp": {
        const m = modelOf("QHSW", `PNP (IS=${num(el.isA)} BF=${num(el.betaF)} BR=${num(el.betaR)})`);
        body.push(`${spiceName("Q", el.name)} ${el.collector} ${el.base} ${el.emitter} ${m}`);
        break;
      }
    }
  }
  for (const [card, name] of models) lines.push(`.model ${name} ${card}`);
  lines.push(...body, ".op", ".end");
  return lines.join("\n") + "\n";
}

/**
 * The SPICE netlist of a project's circuit with state `stateIndex` (0-based)
 * active, with the design's current-setting resistors (the values the BOM
 * lists); a comment line says which they are.
 *
 * @example
 * spiceNetlist(project, spec, matrix, 0, design).split("\n")[0]; // "* <title>: state S0 active"
 */
export function spiceNetlist(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  stateIndex: number,
  design: SegmentDesign,
): string {
  return stateNetlist(
    project,
    matrix,
    buildCircuit(spec, matrix, designModel(project.electrical, design), stateIndex, design.ohms),
    design,
  );
}

/**
 * The SPICE netlist of every state in turn (as `spiceNetlist` writes each),
 * the parts every state shares built once; each deck is made when it is
 * asked for.
 *
 * @example
 * for (const deck of spiceNetlists(project, spec, matrix, design)) write(deck);
 */
export function* spiceNetlists(project: Project, spec: DecodeSpec, matrix: VerifiedMatrix, design: SegmentDesign): Generator<string> {
  const frame = circuitFrame(spec, matrix, designModel(project.electrical, design), design.ohms);
  for (let k = 0; k < matrix.states.length; k++) yield stateNetlist(project, matrix, stateCircuit(frame, k), design);
}

function stateNetlist(project: Project, matrix: VerifiedMatrix, circuit: Circuit, design: SegmentDesign): string {
  const k = circuit.stateIndex;
  const code = matrix.codes[k];
  const codeNote =
    code === undefined ? [] : [`Code ${code} (highest stage leftmost): high stage lines ${[...highLines(matrix, k)].join(", ")}.`];
  return circuitNetlist(circuit, project.title, [...codeNote, designNote(design)]);
}
