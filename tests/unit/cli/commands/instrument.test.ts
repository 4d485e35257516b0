/**
 * Every command on an instrument (a project file with `decoders`): synth
 * runs each decoder in turn, the commands that work on one decoder take
 * `--decoder NAME` and say so without it.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import { recordingIo } from "../../../support/recordingIo.ts";

const SHARED = { preset: "bench-5v-switch", segment: { targetA: 0.008 } };
const UNITS = { counter: { states: 5 }, display: { positions: 1 }, show: ["0", "1", "2", "3", "4"], synthesis: { timeLimitMs: 10_000 } };
const TENS = {
  counter: { states: 4, code: "binary" },
  display: { positions: 1 },
  show: ["0", "1", "2", "3"],
  synthesis: { timeLimitMs: 10_000, maxDepth: 2 },
};

const INSTRUMENT = JSON.stringify({
  schema: "diodeloom/project@2",
  title: "Lap counter",
  electrical: SHARED,
  decoders: [
    { name: "units", ...UNITS },
    { name: "tens", ...TENS, electrical: { segment: { targetA: 0.006 } } },
  ],
});
const single = (title: string, d: Record<string, unknown>, electrical: Record<string, unknown> = SHARED): string =>
  JSON.stringify({ schema: "diodeloom/project@2", title, ...d, electrical });
const FILES = {
  "lap.json": INSTRUMENT,
  "units.json": single("Lap counter - units", UNITS),
  "tens.json": single("Lap counter - tens", TENS, { ...SHARED, segment: { targetA: 0.006 } }),
  "one.json": JSON.stringify({
    schema: "diodeloom/project@2",
    title: "Lap counter",
    electrical: SHARED,
    decoders: [{ name: "units", ...UNITS }],
  }),
};

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  const io = recordingIo(FILES);
  const code = await main(args, io);
  return { code, out: io.stdout.join(""), err: io.stderr.join("") };
}

/** A matrix with its decoder prefix taken off again, to compare with the decoder's own file. */
function unprefixed(m: Record<string, unknown>, prefix: string): Record<string, unknown> {
  const { refPrefix, ...rest } = m;
  expect(refPrefix).toBe(prefix);
  const diodes = (rest["diodes"] as { ref: string }[]).map((d) => {
    expect(d.ref.startsWith(`${prefix}D`)).toBe(true);
    return { ...d, ref: d.ref.slice(prefix.length) };
  });
  return { ...rest, diodes };
}

describe("synth on an instrument", () => {
  it("prints one matrix per decoder keyed by name, each the decoder's own with its prefix", async () => {
    const r = await run(["synth", "lap.json", "--json"]);
    expect(r.code, r.err).toBe(0);
    const doc = JSON.parse(r.out);
    expect(doc.schema).toBe("diodeloom/instrument-matrices@1");
    expect(doc.title).toBe("Lap counter");
    expect(doc.order).toEqual(["units", "tens"]);
    const units = JSON.parse((await run(["synth", "units.json", "--json"])).out);
    const tens = JSON.parse((await run(["synth", "tens.json", "--json"])).out);
    expect(unprefixed(doc.decoders.units, "1")).toEqual(units);
    expect(unprefixed(doc.decoders.tens, "2")).toEqual(tens);
    // Each keeps its own counter kind: the tens decoder is a binary counter's gates and OR diodes.
    expect(doc.decoders.tens.gates.length).toBeGreaterThan(0);
    expect(doc.decoders.units.gates).toEqual([]);
  }, 60_000);

  it("prints a one-decoder instrument's matrix under its name, without a prefix", async () => {
    const r = await run(["synth", "one.json", "--json"]);
    expect(r.code, r.err).toBe(0);
    const doc = JSON.parse(r.out);
    expect(doc.decoders.units).toEqual(JSON.parse((await run(["synth", "units.json", "--json"])).out));
  }, 60_000);

  it("prints a section per decoder, its parts numbered with the decoder's number in front", async () => {
    const r = await run(["synth", "lap.json"]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/^Lap counter\nAn instrument of 2 decoders \(units, tens\)/);
    expect(r.out).toContain("== Decoder 1 of 2: units ==\nLap counter - units\n");
    expect(r.out).toContain("== Decoder 2 of 2: tens ==\nLap counter - tens\n");
    expect(r.out).toMatch(/1Q1-1Q7/);
    expect(r.out).toMatch(/\b1D1>/);
  }, 60_000);

  it("with --decoder prints that decoder as a single file prints, keeping its instrument designators", async () => {
    const r = await run(["synth", "lap.json", "--json", "--decoder", "tens"]);
    expect(r.code, r.err).toBe(0);
    const m = JSON.parse(r.out);
    expect(m.schema).toBe("diodeloom/matrix@3");
    expect(unprefixed(m, "2")).toEqual(JSON.parse((await run(["synth", "tens.json", "--json"])).out));
    const bad = await run(["synth", "lap.json", "--decoder", "hours"]);
    expect(bad.code).toBe(2);
    expect(bad.err).toBe('--decoder: got "hours"; lap.json holds the decoders "units", "tens"\n');
  }, 60_000);

  it("names the decoder whose synthesis fails", async () => {
    const r = await run(["synth", "lap.json", "--depth-limit", "1", "--policy", "uniform", "--decode", "dark"]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^decoder "units": /m);
  });

  it("gives a bad decoder's problems with their path", async () => {
    const doc = JSON.parse(INSTRUMENT);
    doc.decoders[1].show[2] = "?";
    const io = recordingIo({ "bad.json": JSON.stringify(doc) });
    expect(await main(["synth", "bad.json"], io)).toBe(2);
    expect(io.stderr.join("")).toMatch(/^bad\.json: decoders\[1\]\.show\[2\]: got "\?"; no glyph for "\?"/);
  });
});

describe("budget on an instrument", () => {
  it("prints each decoder's budget as its own file has it, and the totals with how they are bounded", async () => {
    const r = await run(["budget", "lap.json", "--json"]);
    expect(r.code, r.err).toBe(0);
    const doc = JSON.parse(r.out);
    expect(doc.schema).toBe("diodeloom/instrument-budget@1");
    expect(doc.order).toEqual(["units", "tens"]);
    expect(doc.bound).toBe("per-case-sum");
    expect(doc.boundText).toMatch(/without trying every combination/);
    const units = JSON.parse((await run(["budget", "units.json", "--json"])).out);
    const tens = JSON.parse((await run(["budget", "tens.json", "--json"])).out);
    expect(doc.decoders.units.supply).toEqual(units.supply);
    expect(doc.decoders.tens.supply).toEqual(tens.supply);
    expect(doc.decoders.tens.states).toEqual(tens.states);
    expect(Object.keys(doc.decoders.tens.drivers["1a"])).toEqual(Object.keys(tens.drivers["1a"]));
    expect(doc.decoders.tens.drivers["1a"].transistor).toBe("2Q1");
    // The nominal case: the sum of the two decoders' worst supply currents.
    expect(doc.totals.cases.nominal.segmentA).toBeCloseTo(units.supply.maxCurrentA + tens.supply.maxCurrentA, 12);
    expect(doc.totals.segment.currentA.value).toBeGreaterThanOrEqual(doc.totals.cases.nominal.segmentA);
    expect(doc.totals.warningCount).toBe(units.warnings.length + tens.warnings.length);
  }, 60_000);

  it("prints a section per decoder, then the totals", async () => {
    const r = await run(["budget", "lap.json"]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain("== Decoder 1 of 2: units ==\nLap counter - units\n");
    expect(r.out).toContain("== Decoder 2 of 2: tens ==\nLap counter - tens\n");
    expect(r.out).toMatch(/^Instrument totals: 2 decoders \(units, tens\), 5 x 4 = 20 combinations of states$/m);
    expect(r.out).toMatch(
      /^ {2}Segment supply current +\d+\.\d+ mA {2}\((nominal values|low corner|high corner); units S\d+, tens S\d+\)$/m,
    );
    expect(r.out).toMatch(/^ {2}Both supplies, power +\d+\.\d mW/m);
  }, 60_000);

  it("with --decoder budgets that decoder as a single file", async () => {
    const r = await run(["budget", "lap.json", "--json", "--decoder", "units"]);
    expect(r.code, r.err).toBe(0);
    expect(JSON.parse(r.out).schema).toBe("diodeloom/budget@3");
  }, 60_000);
});

describe("export on an instrument", () => {
  it("writes one set of papers and prints the sheet index; an earlier set's folder may be written again", async () => {
    const dir = mkdtempSync(join(tmpdir(), "diodeloom-instrument-"));
    const out = join(dir, "papers");
    try {
      for (let round = 0; round < 2; round++) {
        const io = recordingIo(FILES, { writeToDisk: true });
        expect(await main(["export", "lap.json", "--out", out, "--fast"], io), io.stderr.join("")).toBe(0);
        const text = io.stdout.join("");
        expect(text).toMatch(/^Sheet index\nNo\. {2}Decoder +Sheet +File\n {2}1 {2}- +Sheet index +index\.svg$/m);
        expect(text).toMatch(/^ {2}2 {2}units +Diode matrix, sheet 1 of 1 +1-units\/matrix\.svg$/m);
        const names = [...io.written.keys()].map((k) => k.slice(out.length + 1)).sort();
        expect(names).toEqual(
          [
            "index.svg",
            "1-units/matrix.svg",
            "1-units/driver.svg",
            ...["S0", "S1", "S2", "S3", "S4"].map((s) => `1-units/spice/${s}.cir`),
            "2-tens/matrix.svg",
            "2-tens/driver.svg",
            ...["S0", "S1", "S2", "S3"].map((s) => `2-tens/spice/${s}.cir`),
            "bom.csv",
            "wiring.csv",
            "wiring.html",
            "budget.json",
            "project.json",
          ].sort(),
        );
      }
      // The set reads back as the same instrument.
      const again = await run(["synth", join(out, "project.json"), "--json", "--fast"]);
      const first = await run(["synth", "lap.json", "--json", "--fast"]);
      expect(again.out).toBe(first.out);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 120_000);
});

describe("the commands that work on one decoder", () => {
  it.each([
    [["netlist", "lap.json", "--state", "0"], /prints the circuit of one decoder's state: give --decoder NAME/],
    [["compare", "lap.json"], /compares the glyph styles of one decoder: give --decoder NAME/],
  ])("%j refuses an instrument without --decoder, naming its decoders", async (args, message) => {
    const r = await run(args as string[]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^lap\.json: an instrument of 2 decoders \("units", "tens"\); this command /);
    expect(r.err).toMatch(message);
  });

  it("netlist --decoder writes the decoder's parts with SPICE's letter in front of the prefix", async () => {
    const r = await run(["netlist", "lap.json", "--state", "0", "--decoder", "units"]);
    expect(r.code, r.err).toBe(0);
    expect(r.out.split("\n")[0]).toBe("* Lap counter - units: state S0 active");
    expect(r.out).toMatch(/^R1R1 /m);
    expect(r.out).toMatch(/^Q1Q1 /m);
    expect(r.out).toMatch(/^D1D1 s0 /m);
    // Every element name starts with its kind's letter, as SPICE reads it.
    for (const line of r.out.split("\n").filter((l) => /^[0-9]/.test(l))) throw new Error(`element without its letter: ${line}`);
    // The same deck as the decoder's own file, but for the names.
    const own = await run(["netlist", "units.json", "--state", "0"]);
    expect(r.out.replace(/^[RDQ]1(?=[RDQ])/gm, "").replace(/^Lap counter - units/, "")).toBe(
      own.out.replace(/^DDS/gm, "DS").replace(/^Lap counter - units/, ""),
    );
  }, 60_000);

  it("compare --decoder compares that decoder", async () => {
    const r = await run(["compare", "lap.json", "--decoder", "units", "--fast"]);
    expect(r.code, r.err).toBe(0);
    expect(r.out.split("\n")[0]).toBe("Lap counter - units");
  }, 60_000);
});
