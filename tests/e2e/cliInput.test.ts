/**
 * Wrong input on the command line (issue 15): each case is a clear exit 2
 * whose message names the field, what it found and what would fix it, run
 * through the installed command in a child process. Before this change each
 * of these passed silently, exited 70 ("this is a bug"), echoed raw escape
 * sequences or megabytes, or spun until killed.
 */
import { execFile } from "node:child_process";
import { mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;
const DIR = mkdtempSync(join(tmpdir(), "diodeloom-input-"));
afterAll(() => rmSync(DIR, { recursive: true, force: true }));

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string; ms: number }> {
  const started = Date.now();
  return new Promise((resolve) => {
    execFile(process.execPath, [BIN, ...args], { cwd: ROOT, timeout: 30_000, maxBuffer: 64 * 1024 * 1024 }, (err, stdout, stderr) => {
      const code = err ? (typeof err.code === "number" ? err.code : 99) : 0;
      resolve({ code, stdout, stderr, ms: Date.now() - started });
    });
  });
}

const BASE = {
  schema: "diodeloom/project@1",
  title: "Quiz scoreboard",
  counter: { states: 3 },
  display: { positions: 1 },
  show: ["0", "1", "2"],
};

/** Writes a project file (text, bytes or an object as JSON) and returns its path. */
function file(name: string, content: string | Uint8Array | object): string {
  const path = join(DIR, name);
  writeFileSync(path, typeof content === "string" || content instanceof Uint8Array ? content : JSON.stringify(content));
  return path;
}

describe("wrong input that used to pass: now exit 2, naming the field", () => {
  it.each([
    [
      "glyphs as an array",
      { ...BASE, glyphs: ["bc"] },
      'glyphs: got an array of 1 item; must be an object mapping each character to its lit segments, e.g. {"7": "abcf"}',
    ],
    [
      "synthesis as an array",
      { ...BASE, synthesis: [] },
      "synthesis: got an array of 0 items; must be an object with the keys maxDepth, depth, buses, links, timeLimitMs, seed, decode, darkInput",
    ],
    [
      "display as an array",
      { ...BASE, display: [] },
      "display: got an array of 0 items; must be an object with the keys positions, cell, segments, figure",
    ],
    [
      "electrical as an array",
      { ...BASE, electrical: [] },
      "electrical: got an array of 0 items; must be an object with the keys temperatureC, counterOutput, diode, pullDown, driver, string, supply, tolerance",
    ],
    [
      "supply as an array",
      { ...BASE, electrical: { supply: [] } },
      "electrical.supply: got an array of 0 items; must be an object with the keys volts, minVolts, maxVolts",
    ],
    [
      "tolerance as an array",
      { ...BASE, electrical: { tolerance: [] } },
      "electrical.tolerance: got an array of 0 items; must be an object with the keys resistorPct, betaMin, betaMax, temperatureC",
    ],
    [
      "driver as an array",
      { ...BASE, electrical: { driver: [] } },
      "electrical.driver: got an array of 0 items; must be an object with the keys is, betaF, betaR, emitterResistor, emitterResistors, maxVceV, maxPowerW",
    ],
    [
      "a key given twice",
      '{"schema":"diodeloom/project@1","counter":{"states":"bad","states":3},"display":{},"show":["0","1","2"]}',
      "counter.states: appears twice in one object (at line 1, column 44 and again at line 1, column 59); keep one of them",
    ],
    [
      "two schema keys",
      '{"schema":"other/x@1","schema":"diodeloom/project@1","counter":{"states":3},"display":{},"show":["0","1","2"]}',
      "schema: appears twice in one object (at line 1, column 2 and again at line 1, column 23); keep one of them",
    ],
    [
      "a title that is not UTF-8",
      new Uint8Array([
        ...new TextEncoder().encode('{"schema":"diodeloom/project@1","title":"Lap '),
        0xc3,
        0x28,
        ...new TextEncoder().encode(' timer","counter":{"states":3},"display":{},"show":["0","1","2"]}'),
      ]),
      "title: holds a byte that is not UTF-8 (0xC3 at byte 45, line 1, column 46); save the file as UTF-8, or retype the text there",
    ],
  ])("%s", async (name, content, message) => {
    const path = file(`${name.replace(/\W+/g, "-")}.json`, content);
    const r = await run(["synth", path, "--fast"]);
    expect(r.stderr).toBe(`${path}: ${message}\n`);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe("");
  });

  it("--date 2026-02-31", async () => {
    const out = join(DIR, "dated");
    const r = await run(["export", file("dated.json", BASE), "--out", out, "--fast", "--date", "2026-02-31"]);
    expect(r.stderr).toBe('--date: got "2026-02-31"; 2026-02 has no day 31; give a real date, like 2026-03-01\n');
    expect(r.code).toBe(2);
    expect(readdirSync(DIR)).not.toContain("dated");
  });

  it.each(["budget", "export"])("a 5e-324 A target current (%s used to exit 70)", async (command) => {
    const path = file("tiny-target.json", { ...BASE, electrical: { string: { targetA: 5e-324 } } });
    const r = await run([command, path, "--fast", ...(command === "export" ? ["--out", join(DIR, "tiny")] : [])]);
    expect(r.stderr).toBe(`${path}: electrical.string.targetA: got 5e-324; must be a number from 1e-6 to 10 A\n`);
    expect(r.code).toBe(2);
  });
});

describe("messages that say what is missing, in one path style", () => {
  it.each([
    [
      "a missing show",
      { ...BASE, show: undefined },
      'show: missing; add "show": an array with one text per counter state, e.g. ["0", "1", "2"]',
    ],
    [
      "a missing counter.states",
      { ...BASE, counter: {} },
      'counter.states: missing; add "states": N, the number of counter states, a whole number from 2 to 256',
    ],
    [
      "JSON nested 3000 deep",
      '{"schema":"diodeloom/project@1","title":' + "[".repeat(3000) + "]".repeat(3000) + "}",
      "arrays and objects nest deeper than 32 levels at line 1, column 72, inside title[0][0]…; a project needs far fewer",
    ],
    ["a wrong type inside show", { ...BASE, show: ["0", 1, "2"] }, "show[1]: got 1; must be the text of one state"],
    [
      "a text of the wrong length",
      { ...BASE, show: ["0", "12", "2"] },
      'show[1]: got "12", which fills 2 position(s) but display.positions is 1; pad with spaces for blanks',
    ],
  ])("%s", async (name, content, message) => {
    const path = file(`${name.replace(/\W+/g, "-")}.json`, content);
    const r = await run(["synth", path]);
    expect(r.stderr).toBe(`${path}: ${message}\n`);
    expect(r.code).toBe(2);
  });

  it("accepts a leading byte-order mark, as the app's Open does", async () => {
    const plain = await run(["synth", file("plain.json", BASE), "--fast", "--json"]);
    const marked = await run([
      "synth",
      file("marked.json", new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode(JSON.stringify(BASE))])),
      "--fast",
      "--json",
    ]);
    expect(marked.stderr).toBe("");
    expect(marked.code).toBe(0);
    expect(marked.stdout).toBe(plain.stdout);
  });
});

describe("terminal safety", () => {
  const noControls = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/;

  it.each([
    [
      "an escape sequence in the title",
      { ...BASE, title: "\u001b]0;owned\u0007\u001b[2J" },
      'title: got "\\u001b]0;owned\\u0007\\u001b[2J"; must be printable text; remove the control characters (shown as \\u escapes)',
    ],
    [
      "an escape sequence in a text",
      { ...BASE, show: ["0", "\u001b[2J", "2"] },
      'show[1]: got "\\u001b[2J"; a text holds control characters, which no display shows; remove them',
    ],
    [
      "an escape sequence as a key",
      { ...BASE, "\u001b[31mred": 1 },
      '["\\u001b[31mred"]: unknown key; remove it or check its spelling (allowed here: schema, title, counter, display, glyphs, show, synthesis, electrical)',
    ],
  ])("%s is quoted, never echoed raw", async (name, content, message) => {
    const path = file(`${name.replace(/\W+/g, "-")}.json`, content);
    const r = await run(["synth", path]);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`${path}: ${message}\n`);
    expect(r.stderr).not.toMatch(noControls);
  });

  it.each([
    ["a 1 MB text", { ...BASE, show: ["0", "x".repeat(900_000), "2"] }],
    ["a 1 MB key", { ...BASE, ["k".repeat(900_000)]: 1 }],
    ["a 1 MB value where a number goes", { ...BASE, counter: { states: "y".repeat(900_000) } }],
  ])("%s is cut to a short excerpt", async (name, content) => {
    const path = file(`${name.replace(/\W+/g, "-")}.json`, content);
    const r = await run(["synth", path]);
    expect(r.code).toBe(2);
    expect(r.stderr.length).toBeLessThan(500);
    expect(r.stderr).toMatch(/…" \(900000 characters\)/);
  });

  it("an unknown command or option holding escapes is quoted", async () => {
    const cmd = await run(["\u001b[2Jsynth"]);
    expect(cmd.code).toBe(2);
    expect(cmd.stderr).toMatch(/^unknown command "\\u001b\[2Jsynth"/);
    const opt = await run(["synth", "x.json", "--\u001b[2J"]);
    expect(opt.code).toBe(2);
    expect(cmd.stderr + opt.stderr).not.toMatch(noControls);
  });
});

describe("export output folders: checked first, written all or nothing", () => {
  const project = (): string => file("folder.json", BASE);

  it("an existing file", async () => {
    const target = file("not-a-folder", "x");
    const r = await run(["export", project(), "--fast", "--out", target]);
    expect(r.stderr).toBe(`--out ${target}: is a file, not a folder; give the path of a folder (it is created if missing)\n`);
    expect(r.code).toBe(2);
  });

  it("a path under a file", async () => {
    const target = file("plain-file", "x");
    const r = await run(["export", project(), "--fast", "--out", join(target, "sub")]);
    expect(r.stderr).toBe(`--out ${join(target, "sub")}: a part of the path is a file, not a folder (${target})\n`);
    expect(r.code).toBe(2);
  });

  it.runIf(process.platform === "linux")("folders the system refuses (/proc/x used to spin until killed, /sys/x exited 70)", async () => {
    const proc = await run(["export", project(), "--fast", "--out", "/proc/x"]);
    expect(proc.stderr).toBe("--out /proc/x: the system refuses to create a folder in /proc (error ENOENT)\n");
    expect(proc.code).toBe(2);
    const sys = await run(["export", project(), "--fast", "--out", "/sys/x"]);
    expect(sys.stderr).toMatch(/^--out \/sys\/x: the system refuses to create a folder in \/sys \(/);
    expect(sys.code).toBe(2);
  });

  it("a clash halfway leaves nothing behind", async () => {
    const target = join(DIR, "clash");
    mkdirSync(join(target, "bom.csv"), { recursive: true });
    const r = await run(["export", project(), "--fast", "--out", target]);
    expect(r.stderr).toBe(
      `--out ${target}: bom.csv is a folder where the export writes a file; remove or rename it, or give another folder\n`,
    );
    expect(r.code).toBe(2);
    expect(readdirSync(target)).toEqual(["bom.csv"]);
  });

  it("a fresh folder, then the same folder again, both succeed", async () => {
    const target = join(DIR, "fresh");
    for (let i = 0; i < 2; i++) {
      const r = await run(["export", project(), "--fast", "--out", target]);
      expect(r.stderr).toBe("");
      expect(r.code).toBe(0);
    }
    expect(readdirSync(target).sort()).toEqual([
      "bom.csv",
      "budget.json",
      "driver.svg",
      "matrix.svg",
      "project.json",
      "spice",
      "wiring.csv",
      "wiring.html",
    ]);
    expect(readdirSync(DIR).filter((n) => n.startsWith("."))).toEqual([]);
  });
});
