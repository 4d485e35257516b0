/**
 * `diodeloom export FILE --out DIR`: everything a builder takes to the bench,
 * the files the papers builder (render/papers.ts) makes, the same the web
 * app's Export menu offers: the matrix drawing (matrix.svg, or matrix-1.svg
 * ... when it needs several sheets), the driver-stage sheet (driver.svg, or
 * driver-1.svg ...: the stage of the chosen kind drawn once and every output's
 * parts with their values after the trim), the wiring list (wiring.csv and the
 * printable wiring.html), the budget (budget.json, diodeloom/budget@3), the
 * BOM (bom.csv) and one SPICE netlist per state (spice/S0.cir ...), both
 * with the design's emitter resistors, and the normalised project
 * (project.json).
 *
 * When the budget cannot be solved the other files are still written, the
 * BOM and decks keep the project's emitter values, and the exit code is 1.
 */
import { solveBudget } from "../../core/budget/budget.ts";
import { designNote } from "../../core/budget/segmentDesign.ts";
import { dateProblem, drawingOptions, isPaper, titleTextProblem, type DrawingOptions } from "../../render/drawingOptions.ts";
import { PAPER_NAMES } from "../../render/drawingModel.ts";
import { layoutMatrix } from "../../render/layout.ts";
import { registerNodeWindow } from "../../render/nodeWindow.ts";
import { eachPaperFile, paperDarkValues, paperDesign } from "../../render/papers.ts";
import { quoteText } from "../../core/project/valueText.ts";
import { shownArg, type ParsedArgs } from "../args.ts";
import type { Command } from "../command.ts";
import { budgetDeadline, designArgs, DESIGN_OPTIONS, DESIGN_USAGE, type DesignArgs } from "../designOptions.ts";
import { DECODER_OPTION, DECODER_USAGE } from "../loadProject.ts";
import { EXIT, type CliIo } from "../io.ts";
import type { OutputFile, OwnNames } from "../outputFolder.ts";
import { SYNTH_OPTIONS, SYNTH_USAGE, synthesizeForCircuit, type Synthesized } from "../synthOptions.ts";
import { decoderIo, loadInstrument } from "../loadProject.ts";
import type { Instrument } from "../../core/project/instrument.ts";
import { instrumentBudget, type BudgetedDecoder, type InstrumentBudget } from "../../core/budget/instrumentBudget.ts";
import { eachInstrumentPaperFile, sheetIndex, sheetIndexText, type DecoderPaperInput } from "../../render/instrumentPapers.ts";

const USAGE = `export FILE --out DIR [--paper a4|a3|letter] [--date YYYY-MM-DD] [--drawing-number TEXT] [--revision TEXT] [--drawn-by TEXT] ${SYNTH_USAGE} ${DESIGN_USAGE} ${DECODER_USAGE}`;

/**
 * The names an export writes. A folder holding only these (an earlier
 * export) may be written again; the new export replaces it whole.
 */
export const EXPORT_NAMES: OwnNames = {
  files: [
    /^(matrix|driver)(-\d+)?\.svg$/,
    /^wiring\.(csv|html)$/,
    /^budget\.json$/,
    /^bom\.csv$/,
    /^project\.json$/,
    /^spice\/S\d+\.cir$/,
    // An instrument's set (render/instrumentPapers.ts): the index, and each decoder's folder.
    /^index\.svg$/,
    /^\d+-[a-z0-9-]+\/(matrix|driver)(-\d+)?\.svg$/,
    /^\d+-[a-z0-9-]+\/spice\/S\d+\.cir$/,
  ],
  folders: [/^spice$/, /^\d+-[a-z0-9-]+$/, /^\d+-[a-z0-9-]+\/spice$/],
};

export const exportCommand: Command = {
  name: "export",
  usage: USAGE,
  options: {
    out: {
      value: true,
      meta: "DIR",
      help: "folder to write: a new one (created), an empty one, or an earlier export's (replaced whole)",
    },
    paper: { value: true, meta: "SIZE", help: "a4 (default), a3 for big matrices, or letter" },
    date: { value: true, meta: "DATE", help: "date of issue for the title block, YYYY-MM-DD (default: left blank)" },
    "drawing-number": { value: true, meta: "TEXT", help: "drawing number (default: DL- and a hash of the project)" },
    revision: { value: true, meta: "TEXT", help: "revision (default A)" },
    "drawn-by": { value: true, meta: "TEXT", help: "creator for the title block (default diodeloom)" },
    ...DECODER_OPTION,
    ...SYNTH_OPTIONS,
    ...DESIGN_OPTIONS,
  },
  async run(args, io) {
    const out = args.values.get("out");
    if (out === undefined) {
      io.err(`export needs --out DIR, the directory to write into\nusage: diodeloom ${USAGE}\n`);
      return EXIT.input;
    }
    const given = drawingArgs(args, io);
    if (!given) return EXIT.input;
    const design = designArgs(args, io);
    if (!design) return EXIT.input;
    // Checked before the work, so a synthesis of many seconds never ends in "cannot write there".
    const where = await io.checkOutputFolder(out, EXPORT_NAMES);
    if (!where.ok) {
      io.err(`--out ${shownArg(out, 200)}: ${where.message}\n`);
      return EXIT.input;
    }
    const loaded = await loadInstrument(args, io, USAGE);
    if (!loaded) return EXIT.input;
    const { instrument, refPrefixes } = loaded;
    const [only] = instrument.decoders;
    if (instrument.single && only) {
      const done = await synthesizeForCircuit(only.project, args, io, refPrefixes[0] ?? "");
      if (typeof done === "number") return done;
      return exportSingle(done, out, given, design, io);
    }
    return exportInstrument(instrument, refPrefixes, out, given, design, args, io);
  },
};

/** `export` of a single-decoder file (or one decoder, `--decoder`): the papers of one project. */
async function exportSingle(
  done: Synthesized,
  out: string,
  given: Partial<DrawingOptions>,
  design: DesignArgs,
  io: CliIo,
): Promise<number> {
  const { project, spec, matrix } = done;
  const options = drawingOptions(project, given);
  const budget = solveBudget(project, spec, matrix, {
    series: design.series,
    trim: design.mode,
    deadlineMs: budgetDeadline(done.timeLimitMs),
    timeLimitMs: done.timeLimitMs,
  });
  const drawing = layoutMatrix(project, spec, matrix, options, paperDarkValues({ project, spec, budget }));
  if (!budget.ok) io.err(`budget: ${budget.error.message}; budget.json left out, the BOM and decks keep the project's emitter resistors\n`);
  registerNodeWindow();
  const names = await writePapers(io, out, eachPaperFile({ project, spec, matrix, options, drawing, budget }));
  if (!names) return EXIT.input;
  io.out(`${project.title}\nWrote ${names.length} files to ${out}:\n${names.map((n) => `  ${n}`).join("\n")}\n`);
  io.out(`${designNote(paperDesign({ project, matrix, budget }))}\n`);
  if (budget.ok && budget.value.warnings.length > 0)
    io.out(`The budget has ${budget.value.warnings.length} warning(s); see budget.json or run diodeloom budget.\n`);
  return budget.ok ? EXIT.ok : EXIT.findings;
}

/**
 * `export` of an instrument of several decoders: each decoder synthesized,
 * drawn and budgeted in turn, then one set of papers (render/instrumentPapers.ts).
 * The set's title block (the index sheet) takes the first decoder's drawing
 * number unless --drawing-number gives one; every decoder's sheets keep their own.
 */
async function exportInstrument(
  instrument: Instrument,
  refPrefixes: readonly string[],
  out: string,
  given: Partial<DrawingOptions>,
  design: DesignArgs,
  args: ParsedArgs,
  io: CliIo,
): Promise<number> {
  const decoders: DecoderPaperInput[] = [];
  const budgeted: BudgetedDecoder[] = [];
  let longestMs = 0;
  for (const [i, d] of instrument.decoders.entries()) {
    const dio = decoderIo(io, d.name);
    const done = await synthesizeForCircuit(d.project, args, dio, refPrefixes[i] ?? "");
    if (typeof done === "number") return done;
    const { project, spec, matrix } = done;
    longestMs = Math.max(longestMs, done.timeLimitMs);
    const options = drawingOptions(project, given);
    const budget = solveBudget(project, spec, matrix, {
      series: design.series,
      trim: design.mode,
      deadlineMs: budgetDeadline(done.timeLimitMs),
      timeLimitMs: done.timeLimitMs,
    });
    const drawing = layoutMatrix(project, spec, matrix, options, paperDarkValues({ project, spec, budget }));
    if (!budget.ok)
      dio.err(
        `budget: ${budget.error.message}; its budget and the instrument's totals left out, its BOM lines and decks keep the project's values\n`,
      );
    else budgeted.push({ name: d.name, project, spec, matrix, budget: budget.value });
    decoders.push({ name: d.name, project, spec, matrix, options, drawing, budget });
  }
  let totals: InstrumentBudget | null = null;
  if (budgeted.length === decoders.length) {
    const r = instrumentBudget(instrument.title, budgeted, budgetDeadline(longestMs));
    if (r.ok) totals = r.value;
    else io.err(`budget: decoder ${quoteText(r.error.decoder ?? "")}: ${r.error.message}; budget.json left out\n`);
  }
  const first = decoders[0];
  if (!first) return EXIT.internal;
  registerNodeWindow();
  const input = { instrument, decoders, options: first.options, budget: totals };
  const names = await writePapers(io, out, eachInstrumentPaperFile(input));
  if (!names) return EXIT.input;
  io.out(`${instrument.title}\nWrote ${names.length} files to ${out}:\n${names.map((n) => `  ${n}`).join("\n")}\n`);
  io.out(`\nSheet index\n${sheetIndexText(sheetIndex(input))}`);
  for (const d of decoders) io.out(`${d.name}: ${designNote(paperDesign(d))}\n`);
  const warnings = budgeted.reduce((a, b) => a + b.budget.warnings.length, 0);
  if (warnings > 0) io.out(`The budgets have ${warnings} warning(s); see budget.json or run diodeloom budget.\n`);
  return totals !== null ? EXIT.ok : EXIT.findings;
}

/** Reads the drawing options, or prints what is wrong and returns undefined. */
/**
 * Writes the papers into `out`, all or nothing (beside or inside the target first, then moved into place).
 * Each paper is made as the one before it is written, and let go: the export never holds every sheet and
 * deck at once. Gives the names written, or undefined once it has said why the folder was refused.
 */
async function writePapers(
  io: CliIo,
  out: string,
  papers: Iterable<{ readonly name: string; readonly text: string }>,
): Promise<string[] | undefined> {
  const names: string[] = [];
  const files = function* (): Generator<OutputFile> {
    for (const f of papers) {
      names.push(f.name);
      yield { name: f.name, data: f.text };
    }
  };
  const wrote = await io.writeOutputFolder(out, files(), EXPORT_NAMES);
  if (!wrote.ok) {
    io.err(`--out ${shownArg(out, 200)}: ${wrote.message}\n`);
    return undefined;
  }
  return names;
}

function drawingArgs(args: ParsedArgs, io: CliIo): Partial<DrawingOptions> | undefined {
  const given: { -readonly [K in keyof DrawingOptions]?: DrawingOptions[K] } = {};
  const paper = args.values.get("paper");
  if (paper !== undefined) {
    if (!isPaper(paper)) return void io.err(`--paper: got ${quoteText(paper)}; must be ${PAPER_NAMES.join(", ")}\n`);
    given.paper = paper;
  }
  const date = args.values.get("date");
  if (date !== undefined) {
    const problem = dateProblem(date);
    if (problem !== undefined) return void io.err(`--date: got ${quoteText(date)}; ${problem}\n`);
    given.date = date;
  }
  const text: [string, "drawingNumber" | "revision" | "drawnBy"][] = [
    ["drawing-number", "drawingNumber"],
    ["revision", "revision"],
    ["drawn-by", "drawnBy"],
  ];
  for (const [option, field] of text) {
    const v = args.values.get(option);
    if (v === undefined) continue;
    const problem = titleTextProblem(v);
    if (problem !== undefined) return void io.err(`--${option}: got ${quoteText(v)}; ${problem}\n`);
    given[field] = v;
  }
  return given;
}
