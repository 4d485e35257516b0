import { mkdtemp, readFile, readdir, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import type { CliIo } from "../../../../src/cli/io.ts";
import { nodeIo } from "../../../../src/cli/nodeIo.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { currentOhmsOf } from "../../../../src/core/matrix/designators.ts";
import { formatOhms, ohmsText } from "../../../../src/render/units.ts";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { xmlProblem } from "../../../support/xmlCheck.ts";
import { parseCsv } from "../../../support/csvRead.ts";

const dirs: string[] = [];
afterAll(async () => {
  for (const d of dirs) await rm(d, { recursive: true, force: true });
});

/** The real file system, with the printed text kept for the checks. */
function recordingIo(): { io: CliIo; out: string[]; err: string[] } {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { ...nodeIo, out: (t) => void out.push(t), err: (t) => void err.push(t) }, out, err };
}

const example = (name: string): string => new URL(`../../../../public/examples/${name}.json`, import.meta.url).pathname;

describe("diodeloom export", () => {
  it.each(["relay-hex-monitor", "turntable-position", "die-roller"])("writes every file for the %s example", async (name) => {
    const dir = await mkdtemp(join(tmpdir(), "diodeloom-export-"));
    dirs.push(dir);
    const { io, out, err } = recordingIo();
    const code = await main(["export", example(name), "--out", dir, "--fast", "--date", "2026-12-01"], io);
    expect(err.join("")).toBe("");
    expect(code).toBe(0);
    const files = (await readdir(dir)).sort();
    expect(files).toEqual(
      expect.arrayContaining(["bom.csv", "budget.json", "driver.svg", "project.json", "spice", "wiring.csv", "wiring.html"]),
    );
    const svgs = files.filter((f) => /^matrix(-\d+)?\.svg$/.test(f));
    expect(svgs.length).toBeGreaterThan(0);
    // One sheet is matrix.svg; several are matrix-1.svg, matrix-2.svg, ...
    if (svgs.length === 1) expect(svgs).toEqual(["matrix.svg"]);
    else expect(svgs.every((f) => f !== "matrix.svg")).toBe(true);
    for (const f of svgs) {
      const svg = await readFile(join(dir, f), "utf8");
      expect(xmlProblem(svg)).toBeNull();
      expect(svg).toContain("2026-12-01");
    }
    expect(out.join("")).toContain("matrix");

    // project.json is normalised and reads back to the same matrix.
    const original = parseProject(await readFile(example(name), "utf8"));
    const written = parseProject(await readFile(join(dir, "project.json"), "utf8"));
    expect(written.ok && original.ok).toBe(true);
    if (!written.ok || !original.ok) return;
    expect(written.value).toEqual(original.value);
    const settings = synthSettings(written.value, { mode: "fast" });
    const m1 = await synthesize(compileSpec(original.value), settings);
    const m2 = await synthesize(compileSpec(written.value), settings);
    expect(m2).toEqual(m1);
    if (!m1.ok) return;

    // The wiring list has a row per diode of that matrix; the page lists them too.
    const wiring = parseCsv(await readFile(join(dir, "wiring.csv"), "utf8"));
    expect(wiring.slice(1, 1 + m1.value.count).map((r) => r[1])).toEqual(m1.value.diodes.map((d) => d.ref));
    const html = await readFile(join(dir, "wiring.html"), "utf8");
    for (const d of m1.value.diodes) expect(html).toContain(`<b>${d.ref}</b>`);
    expect(html).toContain("Inspection checklist");

    // budget.json is the budget of that matrix; the BOM carries the current-setting resistors of the design it
    // describes: the values the rule judged where the design takes the trim, else the project's, and says which.
    const budget = JSON.parse(await readFile(join(dir, "budget.json"), "utf8"));
    expect(budget.schema).toBe("diodeloom/budget@3");
    expect(budget.kind).toBe(original.value.electrical.driver.kind);
    const drivers = budget.drivers as Record<string, { currentResistor: { ref: string; ohms: number } }>;
    const trim = budget.trim as { applied: boolean; judgedOhms: Record<string, number> };
    const designOhms = Object.values(drivers).map((d) => d.currentResistor.ohms);
    if (trim.applied) expect(designOhms).toEqual(Object.keys(drivers).map((o) => trim.judgedOhms[o]));
    else expect(designOhms).toEqual(Object.keys(drivers).map((o) => currentOhmsOf(original.value.electrical, o)));
    // The driver sheet shows the same design: every current-setting resistor with the budget's value.
    const driverSvg = await readFile(join(dir, "driver.svg"), "utf8");
    expect(xmlProblem(driverSvg)).toBeNull();
    for (const d of Object.values(drivers))
      expect(driverSvg).toContain(`${d.currentResistor.ref}\u00a0${ohmsText(d.currentResistor.ohms).replace(" ", "\u00a0")}`);
    const bom = parseCsv(await readFile(join(dir, "bom.csv"), "utf8"));
    expect(bom[1]?.[0]).toBe(String(m1.value.count));
    const setting = bom.filter((r) => r[3]?.includes("sets the segment current"));
    expect(setting.every((r) => r[3]?.includes(trim.applied ? "trimmed by the budget (E24)" : "as in the project"))).toBe(true);
    expect(setting.reduce((n, r) => n + Number(r[0]), 0)).toBe(designOhms.length);
    expect(setting.map((r) => r[2]).sort()).toEqual([...new Set(designOhms.map((o) => formatOhms(o)))].sort());

    // One SPICE deck per state.
    const decks = (await readdir(join(dir, "spice"))).sort();
    expect(decks.length).toBe(written.value.counter.states);
    const s0 = await readFile(join(dir, "spice", "S0.cir"), "utf8");
    expect(s0).toMatch(/\.end\s*$/i);
  });

  it("writes the same bytes on every run", async () => {
    const runs: Map<string, string>[] = [];
    for (let i = 0; i < 2; i++) {
      const dir = await mkdtemp(join(tmpdir(), "diodeloom-export-"));
      dirs.push(dir);
      expect(await main(["export", example("turntable-position"), "--out", dir, "--fast"], recordingIo().io)).toBe(0);
      const names = [
        ...(await readdir(dir)).filter((f) => f !== "spice"),
        ...(await readdir(join(dir, "spice"))).map((f) => join("spice", f)),
      ];
      runs.push(new Map(await Promise.all(names.map(async (n): Promise<[string, string]> => [n, await readFile(join(dir, n), "utf8")]))));
    }
    expect([...runs[1]!.keys()].sort()).toEqual([...runs[0]!.keys()].sort());
    for (const [name, text] of runs[0]!) expect(runs[1]!.get(name), name).toBe(text);
  });

  it("writes Letter sheets with --paper letter", async () => {
    const dir = await mkdtemp(join(tmpdir(), "diodeloom-export-"));
    dirs.push(dir);
    const { io } = recordingIo();
    expect(await main(["export", example("die-roller"), "--out", dir, "--direct", "--paper", "letter"], io)).toBe(0);
    expect(await readFile(join(dir, "matrix.svg"), "utf8")).toContain('width="279.4mm" height="215.9mm"');
    expect(await readFile(join(dir, "wiring.html"), "utf8")).toContain("size: letter portrait");
  });

  it("writes A3 sheets with --paper a3, fewer of them than on A4, none without a diode (00-59)", async () => {
    const texts = Array.from({ length: 60 }, (_, k) => String(k).padStart(2, "0"));
    const project = { schema: "diodeloom/project@1", title: "Lap timer", counter: { states: 60 }, display: { positions: 2 }, show: texts };
    const work = await mkdtemp(join(tmpdir(), "diodeloom-export-"));
    dirs.push(work);
    const file = join(work, "lap.json");
    await writeFile(file, JSON.stringify(project));
    const sheets: Record<string, string[]> = {};
    for (const paper of ["a4", "a3"]) {
      const dir = join(work, paper);
      expect(await main(["export", file, "--out", dir, "--fast", "--paper", paper], recordingIo().io)).toBe(0);
      const names = (await readdir(dir)).filter((f) => /^matrix(-\d+)?\.svg$/.test(f)).sort();
      sheets[paper] = await Promise.all(names.map((n) => readFile(join(dir, n), "utf8")));
    }
    // ISO 216 A3 is 297 x 420 mm (docs/sources.md), in either orientation.
    expect(sheets["a3"]![0]).toMatch(/width="(420mm" height="297|297mm" height="420)mm"/);
    expect(sheets["a3"]!.length).toBeLessThan(sheets["a4"]!.length);
    for (const svg of [...sheets["a4"]!, ...sheets["a3"]!]) expect(svg).toMatch(/data-ref="D\d+"/);
  });

  it.each([
    [["--fast"], "--out"],
    [["--out", "/nonexistent-never", "--paper", "a5"], '--paper: got "a5"; must be a4, a3, letter\n'],
    [["--out", "/nonexistent-never", "--date", "tomorrow"], '--date: got "tomorrow"; must be a date written YYYY-MM-DD, like 2026-03-01\n'],
    [
      ["--out", "/nonexistent-never", "--date", "2026-02-31"],
      '--date: got "2026-02-31"; 2026-02 has no day 31; give a real date, like 2026-03-01\n',
    ],
    [
      ["--out", "/nonexistent-never", "--date", "2026-13-01"],
      '--date: got "2026-13-01"; there is no month 13; give a real date, like 2026-03-01\n',
    ],
    [
      ["--out", "/nonexistent-never", "--revision", "x".repeat(41)],
      `--revision: got "${"x".repeat(40)}…" (41 characters); must be at most 40 printable characters\n`,
    ],
  ])("refuses %j with exit code 2", async (args, message) => {
    const { io, err } = recordingIo();
    expect(await main(["export", example("die-roller"), ...args], io)).toBe(2);
    // A whole message (ending in a newline) is checked exactly, a fragment by inclusion.
    if (message.endsWith("\n")) expect(err.join("")).toBe(message);
    else expect(err.join("")).toContain(message);
  });
});

describe("diodeloom export: netlists and BOM agree", () => {
  it("writes the BOM's trimmed series resistors into every SPICE deck where the trim improves the design", async () => {
    const dir = await mkdtemp(join(tmpdir(), "diodeloom-export-"));
    dirs.push(dir);
    const { io } = recordingIo();
    expect(await main(["export", example("die-roller"), "--out", dir, "--fast"], io)).toBe(0);
    const budget = JSON.parse(await readFile(join(dir, "budget.json"), "utf8")) as {
      kind: string;
      trim: { applied: boolean; effect: string };
      drivers: Record<string, { currentResistor: { ref: string; ohms: number } }>;
    };
    // The die roller drives its pips straight from the counter lines; its heuristic matrix has outputs at two depths,
    // and the trim evens them out, so the design takes it.
    expect(budget.kind).toBe("direct");
    expect([budget.trim.applied, budget.trim.effect]).toEqual([true, "improves"]);
    const bom = parseCsv(await readFile(join(dir, "bom.csv"), "utf8"));
    for (const state of ["S0", "S3"]) {
      const deck = await readFile(join(dir, "spice", `${state}.cir`), "utf8");
      expect(deck).toMatch(/^\* Series resistors: the E24 trim, applied because it /m);
      // Series resistor lines: "R<k> o<output> a<output> <ohms>".
      const series = new Map([...deck.matchAll(/^(R\d+) o(\S+) a\S+ (\S+)$/gm)].map((m) => [m[2] as string, [m[1], Number(m[3])]]));
      expect(series.size).toBe(Object.keys(budget.drivers).length);
      for (const [output, d] of Object.entries(budget.drivers)) {
        expect(series.get(output)).toEqual([d.currentResistor.ref, d.currentResistor.ohms]);
        expect(bom.some((row) => row[2] === formatOhms(d.currentResistor.ohms) && /series resistor/.test(row[3] ?? ""))).toBe(true);
      }
    }
  });
});
