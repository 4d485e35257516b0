/**
 * The papers of an instrument of several decoders, as one set: a sheet
 * index and every decoder's drawing sheets, one BOM, one wiring list with a
 * section per decoder, the instrument's budget, every decoder's SPICE decks
 * and the project. The command line's `export` writes them; the app's
 * Export menu offers the same files (papers.ts re-exports this builder).
 *
 * Layout of the set (decoder k, 1-based, its name made a file name `slug`):
 * - `index.svg`: sheet 1, the index of every sheet of the set;
 * - `<k>-<slug>/matrix.svg` (or `matrix-1.svg`...) and `<k>-<slug>/driver.svg`
 *   (or `driver-1.svg`...): the decoder's sheets, titled `<title> - <name>`,
 *   each numbered within its decoder's drawing as a single project's are;
 * - `<k>-<slug>/spice/S0.cir`...: one deck per state of the decoder;
 * - `bom.csv`, `wiring.csv`, `wiring.html`, `budget.json`, `project.json`:
 *   one each for the whole instrument.
 * Every part carries its decoder's number in front (designators.ts), so
 * the BOM, the wiring list, the drawings and the decks name it alike.
 */
import type { InstrumentBudget } from "../core/budget/instrumentBudget.ts";
import { designators } from "../core/matrix/designators.ts";
import { csvText } from "../core/papers/csv.ts";
import { refRanges } from "../core/papers/parts.ts";
import { spiceNetlist } from "../core/papers/netlist.ts";
import { checklistRecords, WIRING_HEADER, wiringRecords, wiringRows } from "../core/papers/wiringList.ts";
import { serializeInstrument, type Instrument } from "../core/project/instrument.ts";
import { BOM_HEADER, bomLines, type BomLine } from "./bom.ts";
import { label, STROKE, type Label, type Rect, type Segment, type Sheet } from "./drawingModel.ts";
import type { DrawingOptions } from "./drawingOptions.ts";
import { instrumentBudgetJsonText } from "./instrumentBudgetReport.ts";
import { designModel } from "../core/budget/segmentDesign.ts";
import { driverSheets, networkOf, paperDesign, tieOnsOf, type PaperFile, type PaperInput } from "./papers.ts";
import { sheetFrame, titleBlock } from "./sheetFrame.ts";
import { sheetSvgText } from "./sheetSvg.ts";
import { wiringPageHtml } from "./wiringPage.ts";

/** One decoder's papers input, with its name. */
export interface DecoderPaperInput extends PaperInput {
  readonly name: string;
}

export interface InstrumentPaperInput {
  readonly instrument: Instrument;
  /** Per decoder, in file order: its matrix, drawing and budget (each as a single project's papers take them). */
  readonly decoders: readonly DecoderPaperInput[];
  /** The options of the set: the index sheet's title block. */
  readonly options: DrawingOptions;
  /** The instrument's budget; null when a decoder's budget failed (budget.json is then left out). */
  readonly budget: InstrumentBudget | null;
}

/** One line of the sheet index. */
export interface SheetIndexEntry {
  /** Number in the set, 1-based: the index is 1. */
  readonly number: number;
  /** The decoder, or "" for the index itself. */
  readonly decoder: string;
  /** What the sheet shows, with its number within the decoder's drawing. */
  readonly title: string;
  /** Its file in the export. */
  readonly file: string;
}

/**
 * A decoder's folder in the export: its number and its name as a file name
 * (lower case, letters and digits, other runs as `-`, at most 24 characters).
 *
 * @example
 * decoderFolder(1, "Hours (tens)"); // "2-hours-tens"
 */
export function decoderFolder(index: number, name: string): string {
  const slug =
    name
      .normalize("NFKD")
      .replace(/[\u0300-\u036f]/g, "")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 24)
      .replace(/-+$/, "") || "decoder";
  return `${index + 1}-${slug}`;
}

function sheetFiles(prefix: string, base: string, count: number): string[] {
  return Array.from({ length: count }, (_, i) => `${prefix}/${count === 1 ? `${base}.svg` : `${base}-${i + 1}.svg`}`);
}

/** The sheet index of the set: the index itself, then every decoder's matrix sheets and driver sheets. */
export function sheetIndex(input: Pick<InstrumentPaperInput, "decoders">): SheetIndexEntry[] {
  const entries: SheetIndexEntry[] = [{ number: 1, decoder: "", title: "Sheet index", file: "index.svg" }];
  input.decoders.forEach((d, i) => {
    const folder = decoderFolder(i, d.name);
    const matrixCount = d.drawing.sheets.length;
    sheetFiles(folder, "matrix", matrixCount).forEach((file, k) =>
      entries.push({ number: entries.length + 1, decoder: d.name, title: `Diode matrix, sheet ${k + 1} of ${matrixCount}`, file }),
    );
    const drivers = d.budget ? driverSheets(d).length : 0;
    sheetFiles(folder, "driver", drivers).forEach((file, k) =>
      entries.push({ number: entries.length + 1, decoder: d.name, title: `Driver stage, sheet ${k + 1} of ${drivers}`, file }),
    );
  });
  return entries;
}

/** The sheet index as text, one line per sheet, for a terminal. */
export function sheetIndexText(entries: readonly SheetIndexEntry[]): string {
  const w = (f: (e: SheetIndexEntry) => string, head: string): number => Math.max(head.length, ...entries.map((e) => f(e).length));
  const wd = w((e) => e.decoder, "Decoder");
  const wt = w((e) => e.title, "Sheet");
  const line = (n: string, d: string, t: string, f: string): string => `${n.padStart(3)}  ${d.padEnd(wd)}  ${t.padEnd(wt)}  ${f}`;
  return (
    [line("No.", "Decoder", "Sheet", "File"), ...entries.map((e) => line(String(e.number), e.decoder || "-", e.title, e.file))].join("\n") +
    "\n"
  );
}

/** Rows of the index table per portrait sheet (the index of 16 decoders of many sheets each runs over). */
const INDEX_ROW_MM = 6;

/** The index sheet: a table of every sheet of the set in a frame with its title block. */
export function indexSheet(entries: readonly SheetIndexEntry[], instrument: Instrument, options: DrawingOptions): Sheet {
  const frame = sheetFrame(options.paper, "portrait");
  const box = frame.content;
  const labels: Label[] = [...frame.labels];
  const rects: Rect[] = [...frame.rects];
  const segments: Segment[] = [...frame.segments];
  const block = titleBlock(
    {
      title: instrument.title,
      drawingNumber: options.drawingNumber,
      revision: options.revision,
      date: options.date,
      drawnBy: options.drawnBy,
      documentType: "Sheet index",
      extra: ["Decoders", String(instrument.decoders.length)],
    },
    1,
    entries.length,
    { x: box.x + box.w, y: box.y + box.h },
  );
  rects.push(...block.rects);
  labels.push(...block.labels);
  const x = box.x + 4;
  const cols = [0, 14, 60, 120] as const;
  let y = box.y + 8;
  labels.push(label(`Sheet index: ${instrument.title}`, { x, y }, 4, "table", { bold: true }));
  y += 9;
  const row = (cells: readonly string[], bold: boolean): void => {
    cells.forEach((c, i) => labels.push(label(c, { x: x + (cols[i] ?? 0), y }, 2.6, "table", { bold })));
    segments.push({ a: { x, y: y + 1.6 }, b: { x: box.x + box.w - 4, y: y + 1.6 }, width: STROKE.thin });
    y += INDEX_ROW_MM;
  };
  row(["No.", "Decoder", "Sheet", "File"], true);
  const last = box.y + box.h - 40;
  for (const [i, e] of entries.entries()) {
    if (y > last) {
      row(["", "", `... and ${entries.length - i} more sheets (see the export's listing)`, ""], false);
      break;
    }
    row([String(e.number), e.decoder || "-", e.title, e.file], false);
  }
  return {
    number: 1,
    count: entries.length,
    paper: options.paper,
    orientation: "portrait",
    widthMm: frame.widthMm,
    heightMm: frame.heightMm,
    segments,
    polygons: [],
    rects,
    circles: [],
    diodes: [],
    dots: [],
    labels,
  };
}

/** Each decoder's BOM lines, as its own BOM has them (none while its budget is pending or it has no circuit). */
export function decoderBomLines(d: PaperInput): BomLine[] {
  if (!d.budget) return [];
  const design = paperDesign(d);
  return bomLines(d.project.electrical, designators(d.spec, d.matrix, designModel(d.project.electrical, design), design.ohms), design);
}

/**
 * One BOM for the instrument: the decoders' lines, equal parts (the same
 * value and description) on one line with their quantities added and every
 * designator listed, in the order they first appear.
 */
export function instrumentBomLines(decoders: readonly PaperInput[]): BomLine[] {
  const merged = new Map<string, { refs: string[]; value: string; description: string }>();
  for (const d of decoders) {
    for (const l of decoderBomLines(d)) {
      const key = `${l.value}\u0000${l.description}`;
      const m = merged.get(key) ?? { refs: [], value: l.value, description: l.description };
      m.refs.push(...l.refs);
      merged.set(key, m);
    }
  }
  return [...merged.values()].map((m) => ({
    quantity: m.refs.length,
    references: refRanges(m.refs),
    refs: m.refs,
    value: m.value,
    description: m.description,
  }));
}

function bomText(lines: readonly BomLine[]): string {
  return csvText([[...BOM_HEADER], ...lines.map((l) => [l.quantity, l.references, l.value, l.description])]);
}

/** The wiring list of the set as CSV: a heading record and each decoder's section (its diodes, tie-ons and input network), then the inspection checklist once. */
export function instrumentWiringCsv(decoders: readonly DecoderPaperInput[]): string {
  const records: (string | number)[][] = [[...WIRING_HEADER]];
  decoders.forEach((d, i) => {
    records.push([`Decoder ${i + 1}: ${d.name}`, "", "", "", "", "", ""]);
    records.push(...wiringRecords(wiringRows(d.matrix, d.drawing.placements), tieOnsOf(d), networkOf(d)));
    records.push([]);
  });
  records.push(...checklistRecords());
  return csvText(records);
}

/** The printable wiring list of the set: each decoder's page as a section of one document, each section on a new page. */
export function instrumentWiringHtml(input: Pick<InstrumentPaperInput, "instrument" | "decoders">): string {
  const sections = input.decoders.map((d, i) => {
    const page = wiringPageHtml({
      project: d.project,
      matrix: d.matrix,
      rows: wiringRows(d.matrix, d.drawing.placements),
      tieOns: tieOnsOf(d),
      network: networkOf(d),
      options: d.options,
      sheetCount: d.drawing.sheets.length,
    });
    const body = page.slice(page.indexOf("<body>") + "<body>".length, page.lastIndexOf("</body>"));
    return `<section${i > 0 ? ' style="break-before: page"' : ""}>\n<h1>Decoder ${i + 1} of ${input.decoders.length}: ${escapeHtml(d.name)}</h1>\n${body}</section>\n`;
  });
  const first = input.decoders[0];
  const head = first
    ? wiringPageHtml({ project: first.project, matrix: first.matrix, rows: [], options: first.options, sheetCount: 0 })
    : "<!DOCTYPE html><html><head></head>";
  const top = head
    .slice(0, head.indexOf("<body>"))
    .replace(/<title>[^<]*<\/title>/, `<title>Wiring list: ${escapeHtml(input.instrument.title)}</title>`);
  return `${top}<body>\n<h1>Wiring list: ${escapeHtml(input.instrument.title)}</h1>\n${sections.join("")}</body>\n</html>\n`;
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/**
 * Every file of the set, in the order `export` writes them: the index, each
 * decoder's sheets and decks, then the BOM, the wiring list, the budget and
 * the project. A decoder whose budget failed keeps its matrix sheets and
 * loses its driver sheets, BOM lines and decks, as a single project does.
 */
export function* eachInstrumentPaperFile(input: InstrumentPaperInput): Generator<PaperFile> {
  const index = sheetIndex(input);
  yield { name: "index.svg", mediaType: "image/svg+xml", text: sheetSvgText(indexSheet(index, input.instrument, input.options)) };
  for (const [i, d] of input.decoders.entries()) {
    const folder = decoderFolder(i, d.name);
    const matrixFiles = sheetFiles(folder, "matrix", d.drawing.sheets.length);
    for (const [k, s] of d.drawing.sheets.entries())
      yield { name: matrixFiles[k] as string, mediaType: "image/svg+xml", text: sheetSvgText(s) };
    if (d.budget) {
      const sheets = driverSheets(d);
      const files = sheetFiles(folder, "driver", sheets.length);
      for (const [k, s] of sheets.entries()) yield { name: files[k] as string, mediaType: "image/svg+xml", text: sheetSvgText(s) };
    }
    if (d.budget) {
      const design = paperDesign(d);
      for (const [k, s] of d.spec.states.entries()) {
        yield { name: `${folder}/spice/${s}.cir`, mediaType: "text/plain", text: spiceNetlist(d.project, d.spec, d.matrix, k, design) };
      }
    }
  }
  yield { name: "bom.csv", mediaType: "text/csv", text: bomText(instrumentBomLines(input.decoders)) };
  yield { name: "wiring.csv", mediaType: "text/csv", text: instrumentWiringCsv(input.decoders) };
  yield { name: "wiring.html", mediaType: "text/html", text: instrumentWiringHtml(input) };
  if (input.budget) {
    const budgets = input.decoders.map((d) => (d.budget?.ok ? d.budget.value : null));
    if (budgets.every((b) => b !== null)) {
      yield { name: "budget.json", mediaType: "application/json", text: instrumentBudgetJsonText(input.budget, budgets) };
    }
  }
  yield { name: "project.json", mediaType: "application/json", text: serializeInstrument(input.instrument) };
}

/** Every file of the set at once (see `eachInstrumentPaperFile`). */
export function instrumentPaperFiles(input: InstrumentPaperInput): PaperFile[] {
  return [...eachInstrumentPaperFile(input)];
}
