/**
 * One set of papers for an instrument (the wall-clock demo): designators
 * unique across the set, a BOM whose totals are the sums of the decoders'
 * parts, a wiring list with a section per decoder, a deck per decoder and
 * state, and an index of every sheet.
 */
import { readFileSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import { solveBudget } from "../../../src/core/budget/budget.ts";
import { instrumentBudget } from "../../../src/core/budget/instrumentBudget.ts";
import { decoderRefPrefix, designators, withRefPrefix } from "../../../src/core/matrix/designators.ts";
import { countParts } from "../../../src/core/papers/parts.ts";
import { parseInstrument, type Instrument } from "../../../src/core/project/instrument.ts";
import { compileSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../src/core/synth/synthesize.ts";
import { budgetDesign } from "../../../src/core/budget/budget.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import {
  decoderBomLines,
  decoderFolder,
  instrumentBomLines,
  instrumentPaperFiles,
  sheetIndex,
  sheetIndexText,
  type DecoderPaperInput,
  type InstrumentPaperInput,
} from "../../../src/render/instrumentPapers.ts";
import { layoutMatrix } from "../../../src/render/layout.ts";
import { registerNodeWindow } from "../../../src/render/nodeWindow.ts";
import type { PaperFile } from "../../../src/render/papers.ts";
import { parseCsv } from "../../support/csvRead.ts";
import { NETWORK_HEADING } from "../../../src/core/papers/wiringList.ts";

const CLOCK = readFileSync(new URL("../../../public/examples/wall-clock.json", import.meta.url), "utf8");

let instrument: Instrument;
let input: InstrumentPaperInput;
let files: PaperFile[];

/** An instrument's papers as `export` makes them: each decoder synthesized (fast), prefixed, laid out and budgeted. */
async function instrumentPapersOf(text: string): Promise<{ instrument: Instrument; input: InstrumentPaperInput; files: PaperFile[] }> {
  const r = parseInstrument(text);
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  const instrument = r.value;
  const decoders: DecoderPaperInput[] = [];
  for (const [i, d] of instrument.decoders.entries()) {
    const spec = compileSpec(d.project);
    const m = await synthesize(spec, synthSettings(d.project, { mode: "fast" }));
    if (!m.ok) throw new Error(m.error.message);
    const matrix = withRefPrefix(m.value, decoderRefPrefix(i, instrument.decoders.length));
    const options = drawingOptions(d.project, { date: "2026-12-03" });
    const budget = solveBudget(d.project, spec, matrix);
    decoders.push({
      name: d.name,
      project: d.project,
      spec,
      matrix,
      options,
      drawing: layoutMatrix(d.project, spec, matrix, options),
      budget,
    });
  }
  const budgeted = decoders.map((d) => {
    if (!d.budget?.ok) throw new Error("budget");
    return { name: d.name, project: d.project, spec: d.spec, matrix: d.matrix, budget: d.budget.value };
  });
  const totals = instrumentBudget(instrument.title, budgeted);
  if (!totals.ok) throw new Error(totals.error.message);
  const input = { instrument, decoders, options: decoders[0]!.options, budget: totals.value };
  registerNodeWindow();
  return { instrument, input, files: instrumentPaperFiles(input) };
}

beforeAll(async () => {
  ({ instrument, input, files } = await instrumentPapersOf(CLOCK));
}, 120_000);

const file = (name: string): string => {
  const f = files.find((x) => x.name === name);
  if (!f) throw new Error(`no ${name}`);
  return f.text;
};

describe("instrument papers", () => {
  it("names every part once across the instrument, each with its decoder's number in front", () => {
    const all: string[] = [];
    input.decoders.forEach((d, i) => {
      const parts = designators(d.spec, d.matrix, d.project.electrical);
      const refs = [
        ...parts.diodes.map((x) => x.ref),
        ...parts.drivers.flatMap((x) => [x.transistor, x.display].filter((r): r is string => r !== null)),
        ...parts.resistors.map((x) => x.ref),
      ];
      for (const ref of refs) expect(ref.startsWith(String(i + 1)), ref).toBe(true);
      all.push(...refs);
    });
    expect(new Set(all).size).toBe(all.length);
    // The BOM lists exactly these, each once.
    const bomRefs = instrumentBomLines(input.decoders).flatMap((l) => [...l.refs]);
    expect([...bomRefs].sort()).toEqual([...all].sort());
  });

  it("gives BOM totals that are the sums of the decoders' parts, value by value", () => {
    const lines = instrumentBomLines(input.decoders);
    const total = lines.reduce((a, l) => a + l.quantity, 0);
    const perDecoder = input.decoders.map((d) => {
      const design = budgetDesign(d.budget!.ok ? d.budget!.value : (null as never));
      return countParts(designators(d.spec, d.matrix, d.project.electrical, design.ohms)).reduce((a, g) => a + g.refs.length, 0);
    });
    expect(total).toBe(perDecoder.reduce((a, x) => a + x, 0));
    const byValue = (ls: readonly { value: string; description: string; quantity: number }[]): Map<string, number> => {
      const m = new Map<string, number>();
      for (const l of ls) m.set(`${l.value}|${l.description}`, (m.get(`${l.value}|${l.description}`) ?? 0) + l.quantity);
      return m;
    };
    const summed = byValue(input.decoders.flatMap((d) => decoderBomLines(d)));
    expect(byValue(lines)).toEqual(summed);
    // The file: one header and one line per distinct part, quantities as above.
    const csv = parseCsv(file("bom.csv"));
    expect(csv[0]).toEqual(["Quantity", "References", "Value", "Description"]);
    expect(csv.slice(1).reduce((a, r) => a + Number(r[0]), 0)).toBe(total);
    // Every diode of the three matrices is on the diode line.
    const diodes = lines.find((l) => l.value === "small-signal silicon");
    expect(diodes?.quantity).toBe(input.decoders.reduce((a, d) => a + d.matrix.count, 0));
  });

  it("indexes every sheet of the set, the index first, and writes each", () => {
    const index = sheetIndex(input);
    expect(index[0]).toEqual({ number: 1, decoder: "", title: "Sheet index", file: "index.svg" });
    expect(index.map((e) => e.number)).toEqual(index.map((_, i) => i + 1));
    const svgs = files.filter((f) => f.name.endsWith(".svg")).map((f) => f.name);
    expect(index.map((e) => e.file)).toEqual(svgs);
    for (const d of ["hours", "minute tens", "minute units"])
      expect(index.some((e) => e.decoder === d && e.title.startsWith("Diode matrix"))).toBe(true);
    // Every decoder's sheets are titled by its name.
    const words = (svg: string): string => svg.replace(/<[^>]+>/g, " ").replace(/\s+/g, " ");
    expect(words(file("1-hours/matrix.svg"))).toContain("Wall clock: 12-hour time on four digits - hours");
    expect(words(file("3-minute-units/driver.svg"))).toContain("Wall clock: 12-hour time on four digits - minute units");
    // (Spaces in a sheet's texts are written as no-break spaces, which SVG keeps.)
    expect(words(file("index.svg"))).toContain("Sheet index: Wall clock: 12-hour time on four digits");
    expect(words(file("index.svg"))).toContain("7 minute units Driver stage, sheet 1 of 1 3-minute-units/driver.svg");
    expect(sheetIndexText(index).split("\n")[0]).toMatch(/^No\. {2}Decoder +Sheet +File$/);
  });

  it("writes one wiring list with a section per decoder, and the checklist once", () => {
    const csv = parseCsv(file("wiring.csv"));
    const headings = csv.filter((r) => /^Decoder \d+: /.test(r[0] ?? "")).map((r) => r[0]);
    expect(headings).toEqual(["Decoder 1: hours", "Decoder 2: minute tens", "Decoder 3: minute units"]);
    const diodeRows = csv.filter((r) => /^\d+D\d+$/.test(r[1] ?? ""));
    expect(diodeRows.length).toBe(input.decoders.reduce((a, d) => a + d.matrix.diodes.length, 0));
    expect(csv.filter((r) => r[0] === "Inspection checklist")).toHaveLength(1);
    const html = file("wiring.html");
    expect(html.match(/<h1>Decoder \d of 3: /g)).toHaveLength(3);
    expect(html.match(/<body>/g)).toHaveLength(1);
  });

  it("writes a deck per decoder and state, each element named with its SPICE letter first", () => {
    const decks = files.filter((f) => f.name.endsWith(".cir"));
    expect(decks.map((f) => f.name)).toEqual(
      input.decoders.flatMap((d, i) => d.spec.states.map((s) => `${decoderFolder(i, d.name)}/spice/${s}.cir`)),
    );
    for (const deck of decks) {
      for (const line of deck.text.split("\n")) {
        if (line === "" || line.startsWith("*") || line.startsWith(".")) continue;
        expect(line, deck.name).toMatch(/^[VRDQ]/);
      }
    }
    expect(file("1-hours/spice/S0.cir")).toMatch(/^D1D1 /m);
  });

  it("writes the instrument's budget and the project, which reads back as the same instrument", () => {
    const budget = JSON.parse(file("budget.json"));
    expect(budget.schema).toBe("diodeloom/instrument-budget@1");
    expect(budget.order).toEqual(["hours", "minute tens", "minute units"]);
    const again = parseInstrument(file("project.json"));
    expect(again.ok && again.value).toEqual(instrument);
  });

  it("makes a decoder's folder name from its number and name", () => {
    expect(decoderFolder(0, "hours")).toBe("1-hours");
    expect(decoderFolder(1, "Minute Tens (M10)")).toBe("2-minute-tens-m10");
    expect(decoderFolder(15, "*** ")).toBe("16-decoder");
    expect(decoderFolder(2, "é".repeat(40))).toBe("3-eeeeeeeeeeeeeeeeeeeeeeee");
  });

  it("lists a dark-decoded decoder's input network in its section, each part under the decoder's number", async () => {
    const decoder = (name: string, drive: string, decode: string): object => ({
      name,
      counter: { states: 6, drive },
      display: {},
      show: [..."012345"],
      synthesis: { depth: "mixed", decode, darkInput: "level-shift", timeLimitMs: 5000 },
    });
    const text = JSON.stringify({
      schema: "diodeloom/project@2",
      title: "Die roller pair",
      decoders: [decoder("lit die", "source", "lit"), decoder("dark die", "complementary", "dark")],
    });
    const { input: pair, files: pairFiles } = await instrumentPapersOf(text);
    const csv = parseCsv(pairFiles.find((f) => f.name === "wiring.csv")!.text);
    const sections = csv.map((r, i) => (/^Decoder \d+: /.test(r[0] ?? "") ? i : -1)).filter((i) => i >= 0);
    expect(sections).toHaveLength(2);
    const networkAt = csv.findIndex((r) => r[0] === NETWORK_HEADING);
    // Only the dark decoder has an input network, and it sits in that decoder's section.
    expect(csv.filter((r) => r[0] === NETWORK_HEADING)).toHaveLength(1);
    expect(networkAt).toBeGreaterThan(sections[1]!);
    const rows = csv.slice(networkAt + 1).filter((r) => /^N\d+$/.test(r[0] ?? ""));
    // The same rows as the decoder exported on its own (the single project's wiring list), each part with the prefix 2.
    const dark = pair.decoders[1]!;
    const own = await instrumentPapersOf(
      JSON.stringify({ schema: "diodeloom/project@2", ...decoder("x", "complementary", "dark"), name: undefined }),
    );
    const ownCsv = parseCsv(own.files.find((f) => f.name === "wiring.csv")!.text);
    const ownRows = ownCsv.filter((r) => /^N\d+$/.test(r[0] ?? ""));
    expect(ownRows.length).toBeGreaterThan(0);
    expect(rows.map((r) => r[1])).toEqual(ownRows.map((r) => `2${r[1]}`));
    expect(rows.every((r) => /^2(R|D)\d+$/.test(r[1] ?? ""))).toBe(true);
    // Each of those parts is on the BOM, and in the printable list.
    const bom = pairFiles.find((f) => f.name === "bom.csv")!.text;
    const html = pairFiles.find((f) => f.name === "wiring.html")!.text;
    for (const r of rows) expect(html, r[1]).toContain(r[1]!);
    expect(dark.spec.states).toHaveLength(6);
    expect(bom).toMatch(/2D\d+/);
  }, 120_000);
});
