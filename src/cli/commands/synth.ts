import { designModel, designNote, type SegmentDesign } from "../../core/budget/segmentDesign.ts";
import { decodeSides, type DecodeSpec } from "../../core/spec/decodeSpec.ts";
import { designators } from "../../core/matrix/designators.ts";
import { darkOutputs, matrixObjective, outputDecode, type VerifiedMatrix } from "../../core/matrix/matrix.ts";
import { countParts, refRanges } from "../../core/papers/parts.ts";
import type { Project } from "../../core/project/project.ts";
import { partValue } from "../../render/bom.ts";
import type { Command } from "../command.ts";
import { designAndSizing, designArgs, DESIGN_OPTIONS, DESIGN_USAGE, type DesignArgs } from "../designOptions.ts";
import { EXIT, type CliIo } from "../io.ts";
import { DECODER_OPTION, DECODER_USAGE, decoderIo, loadInstrument } from "../loadProject.ts";
import type { ParsedArgs } from "../args.ts";

import { SYNTH_OPTIONS, SYNTH_USAGE, synthesizeCodedProject, synthesizeProject } from "../synthOptions.ts";
import { describeDecoder } from "../decoderReport.ts";
import { checkWith } from "../../core/budget/ghostCheck.ts";
import { darkMarginLines } from "../darkSizingText.ts";
import { formatOhms, microamps, milliamps } from "../../render/units.ts";

const USAGE = `synth FILE [--json] ${SYNTH_USAGE} ${DESIGN_USAGE} ${DECODER_USAGE}`;

/** The schema of `synth --json` for an instrument of several decoders: one matrix per decoder, keyed by name. */
export const INSTRUMENT_MATRICES_SCHEMA = "diodeloom/instrument-matrices@1";

export const synthCommand: Command = {
  name: "synth",
  usage: USAGE,
  options: {
    json: { help: "print the matrix as diodeloom/matrix@3 JSON (an instrument: diodeloom/instrument-matrices@1, one per decoder)" },
    ...DECODER_OPTION,
    ...SYNTH_OPTIONS,
    ...DESIGN_OPTIONS,
  },
  async run(args, io) {
    const design = designArgs(args, io);
    if (!design) return EXIT.input;
    const loaded = await loadInstrument(args, io, USAGE);
    if (!loaded) return EXIT.input;
    const { instrument, refPrefixes } = loaded;
    const json = args.flags.has("json");
    const [only] = instrument.decoders;
    if (instrument.single && only) {
      const done = await synthDecoder(only.project, refPrefixes[0] ?? "", args, io, json ? null : design);
      if (typeof done === "number") return done;
      io.out(json ? JSON.stringify(done.matrix, null, 2) + "\n" : done.report);
      return EXIT.ok;
    }
    // An instrument: each decoder in turn, with its own counter, code, polarity, depth policy and time limit.
    const matrices: [string, unknown][] = [];
    const reports: string[] = [];
    const count = instrument.decoders.length;
    for (const [i, d] of instrument.decoders.entries()) {
      const done = await synthDecoder(d.project, refPrefixes[i] ?? "", args, decoderIo(io, d.name), json ? null : design);
      if (typeof done === "number") return done;
      matrices.push([d.name, done.matrix]);
      reports.push(`== Decoder ${i + 1} of ${count}: ${d.name} ==\n${done.report}`);
    }
    if (json) {
      const doc = {
        schema: INSTRUMENT_MATRICES_SCHEMA,
        title: instrument.title,
        order: matrices.map(([n]) => n),
        decoders: Object.fromEntries(matrices),
      };
      io.out(JSON.stringify(doc, null, 2) + "\n");
    } else {
      const names = instrument.decoders.map((d) => d.name).join(", ");
      io.out(
        `${instrument.title}\nAn instrument of ${count} decoders (${names}); designators carry the decoder's number in front (2D1 is decoder 2's D1).\n\n${reports.join("\n")}`,
      );
    }
    return EXIT.ok;
  },
};

/**
 * One decoder synthesized: its matrix (for --json) and its report (none
 * when `design` is null: --json settles no design), or the exit code of a
 * failure (already printed).
 */
async function synthDecoder(
  project: Project,
  refPrefix: string,
  args: ParsedArgs,
  io: CliIo,
  design: DesignArgs | null,
): Promise<{ readonly matrix: unknown; readonly report: string } | number> {
  if (project.counter.code !== "one-hot") {
    const coded = await synthesizeCodedProject(project, args, io, refPrefix);
    if (typeof coded === "number") return coded;
    return { matrix: coded.coded.matrix, report: design === null ? "" : describeDecoder(coded.project, coded.spec, coded.coded) };
  }
  const done = await synthesizeProject(project, args, io, refPrefix);
  if (typeof done === "number") return done;
  const { spec, matrix } = done;
  if (design === null) return { matrix, report: "" };
  const settled = designAndSizing(done.project, spec, matrix, design, done.timeLimitMs);
  return { matrix, report: describeMatrix(done.project, spec, matrix, settled.design, settled.sizing) };
}

/** The ghost check of the dark-decoded outputs with the design's network, in words. */
function ghostLines(project: Project, spec: DecodeSpec, m: VerifiedMatrix, design: SegmentDesign, sizing: string | null): string[] {
  const net = design.network;
  if (net === null || net === undefined) return ["", "Ghost check: the pull-ups could not be sized (the budget says why)"];
  const g = checkWith(project, spec, m, net, { design: design.ohms });
  if (!g.ok) return ["", `Ghost check: ${g.error.message}`];
  const v = g.value;
  const at = (f: { output: string; state: string; corner: string }): string => `${f.output} in ${f.state}, ${f.corner}`;
  return [
    "",
    `Ghost check (every state, at the nominal values and both tolerance corners), pull-ups ${formatOhms(net.pullUpOhms)} (E24)${
      net.dividerOhms !== null
        ? `, dividers ${formatOhms(net.dividerOhms)} over ${formatOhms(net.dividerLowerOhms ?? project.electrical.pullDown)}`
        : ""
    }:`,
    `  worst unlit segment ${microamps(v.worstUnlit.currentA)} µA (${at(v.worstUnlit)}) against the ${microamps(v.ghostLimitA)} µA ghost limit`,
    `  weakest lit segment ${milliamps(v.weakestLit.currentA)} mA (${at(v.weakestLit)}), window ${milliamps(v.litWindowA[0])}-${milliamps(v.litWindowA[1])} mA; most sunk by an active-low line ${milliamps(v.mostSunk.currentA)} mA (${at(v.mostSunk)}) of ${milliamps(project.electrical.lowLine.maxCurrentA)} mA`,
    `  ${v.passes ? "passes" : `FAILS: ${v.binding}`}`,
    ...(sizing === null ? [] : [`  sizing: ${sizing}`]),
    ...darkMarginLines(project, spec, m, net, v, design.ohms).map((l) => `  ${l}`),
  ];
}

const METHOD_TEXT = {
  direct: "direct (one diode per lit cell)",
  heuristic: "heuristic sharing",
  exact: "exact optimizer",
} as const;

/**
 * The readable report of `synth`.
 *
 * @param design the current-setting resistors the parts list shows (as the budget, the BOM and the decks do)
 * @param sizing the words of the dark-decoded outputs' sizing (which limit stops a smaller value), printed with the ghost check
 */
export function describeMatrix(
  project: Project,
  spec: DecodeSpec,
  m: VerifiedMatrix,
  design: SegmentDesign | null,
  sizing: string | null = null,
): string {
  const lines: string[] = [];
  const lit = spec.lit.reduce((a, row) => a + row.filter(Boolean).length, 0);
  lines.push(project.title);
  lines.push(
    `${spec.states.length} states, ${spec.positions} position(s) of ${spec.cell.kind}, ` +
      `${spec.outputs.length} outputs driven, ${spec.tiedOn.length} tied on, ${spec.neverLit.length} never lit`,
  );
  const objective = matrixObjective(m);
  const bound = m.optimal
    ? "proven minimum"
    : m.lowerBound !== null
      ? `lower bound ${m.lowerBound}, gap ${objective - m.lowerBound}`
      : "no lower bound";
  lines.push(
    `Method: ${METHOD_TEXT[m.method]}; verified; depth limit ${m.depthLimit} (${m.policy}), longest path ${m.longestPath}; ${bound}`,
  );
  if (m.deadlineHit) {
    lines.push(
      "The time limit ran out before the optimizer's work budget did (a busy machine?): another run may give a different matrix or bound.",
    );
  }
  lines.push("");

  const fromOf = new Map<string, string[]>();
  for (const d of m.diodes) fromOf.set(d.from, [...(fromOf.get(d.from) ?? []), `${d.ref}>${d.to}`]);
  const textW = Math.max(4, ...spec.texts.map((t) => t.length + 2));
  lines.push(`${"Line".padEnd(6)} ${"Text".padEnd(textW)} Diodes`);
  // Every line the counter offers that the decode uses: S<k> raises lit-decoded outputs, nS<k> pulls dark-decoded ones
  // down (and a high-side switch's lit-decoded ones).
  const sides = decodeSides(spec.polarity);
  const rowLines = [...(sides.has("high") ? spec.states : []), ...(sides.has("low") ? spec.polarity.activeLow : [])];
  rowLines.forEach((s) => {
    const k = Number(s.replace(/^n?S/, ""));
    const ds = fromOf.get(s) ?? [];
    lines.push(`${s.padEnd(6)} ${`"${spec.texts[k]}"`.padEnd(textW)} ${ds.length === 0 ? "-" : ds.join(" ")}`);
  });
  if (m.buses.length > 0) {
    lines.push("", "Bus nodes (states in -> outputs out)");
    for (const b of m.buses) {
      const ins = m.diodes.filter((d) => d.to === b).map((d) => d.from);
      const outs = m.diodes.filter((d) => d.from === b).map((d) => d.to);
      const cost = ins.length + outs.length;
      const crossings = ins.length * outs.length;
      const why = cost > crossings ? "; it keeps every path into its outputs at one length, as the depth policy asks" : "";
      lines.push(
        `  ${b.padEnd(4)} ${ins.join(" ")} -> ${outs.join(" ")}  (${cost} diodes for ${crossings} crossing${crossings === 1 ? "" : "s"}${why})`,
      );
    }
  }
  const outSet = new Set(spec.outputs);
  const links = m.diodes.filter((d) => outSet.has(d.from));
  if (links.length > 0) {
    lines.push("", "Segment links (output drives output)");
    for (const d of links) lines.push(`  ${d.ref.padEnd(5)} ${d.from} -> ${d.to}`);
  }

  const dark = darkOutputs(m);
  lines.push("", dark.length > 0 ? `${"Output".padEnd(7)} ${"Decode".padEnd(7)} Lit in states` : `${"Output".padEnd(7)} Lit in states`);
  spec.outputs.forEach((o, j) => {
    const ks = spec.states.filter((_, k) => spec.lit[k]?.[j]);
    lines.push(dark.length > 0 ? `${o.padEnd(7)} ${outputDecode(m, o).padEnd(7)} ${ks.join(" ")}` : `${o.padEnd(7)} ${ks.join(" ")}`);
  });
  if (spec.tiedOn.length > 0) lines.push(`Tied on (lit in every state, no diodes): ${spec.tiedOn.join(" ")}`);
  if (spec.neverLit.length > 0) lines.push(`Never lit (no driver): ${spec.neverLit.join(" ")}`);

  const net = m.inputNetwork;
  if (net !== undefined && dark.length > 0) {
    const what =
      net.kind === "divider"
        ? `${net.resistors} divider resistors`
        : `${net.diodes} level-shift diodes (${net.diodes / dark.length} per output)`;
    lines.push("", `Input network of the ${dark.length} dark-decoded outputs: ${dark.length} pull-ups to the logic supply and ${what}.`);
    if (design !== null) lines.push(...ghostLines(project, spec, m, design, sizing));
  }
  if (design !== null) {
    lines.push("", "Parts");
    for (const g of countParts(designators(spec, m, designModel(project.electrical, design), design.ohms))) {
      lines.push(`  ${String(g.refs.length).padStart(4)}  ${partValue(g, project.electrical).padEnd(22)} ${refRanges(g.refs)}`);
    }
    lines.push(`  ${designNote(design)}`);
  }
  if (dark.length === 0) {
    lines.push("", `Totals: ${m.count} diodes (direct ${lit}, saved ${lit - m.count}), ${m.buses.length} bus nodes, ${links.length} links`);
  } else {
    const shift = net !== undefined && net.diodes > 0 ? ` + ${net.diodes} level-shift = ${objective}` : "";
    lines.push(
      "",
      `Totals: ${m.count} matrix diodes${shift} (one per lit cell: ${lit}), ${m.buses.length} bus nodes, ${links.length} links`,
    );
  }
  return lines.join("\n") + "\n";
}
