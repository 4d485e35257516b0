/**
 * One design, one value per designator: an example run through the real
 * command as a user runs it (`synth`, `budget --json`, `netlist`, `export`)
 * and through the web app's Export files, and every paper must give each
 * resistor the same value. The hex monitor's switches keep the project's
 * series resistors (its 300 Ω is already the E24 value that centres them),
 * and the turntable's 12 V sinks take the trim, so both kinds of design are
 * checked.
 */
import { execFile } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { formatOhms } from "../../src/render/units.ts";
import { bomValues, budgetEmitters, deckResistors, synthPartValues } from "../support/partValues.ts";
import { webExport } from "../support/webExport.ts";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), "diodeloom-agreement-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [BIN, ...args], { cwd: ROOT, timeout: 120_000, maxBuffer: 64 * 1024 * 1024 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === "number" ? err.code : 99) : 0, stdout, stderr });
    });
  });
}

describe.each([
  ["the untrimmed design", "relay-hex-monitor", 7, "Series"],
  ["the trimmed design", "turntable-position", 9, "Emitter"],
] as const)("%s of the %s", (_, example, drivers, resistors) => {
  // --fast: the heuristic matrix, the one the web app shows first, so the web app's files can be compared too.
  const synthArgs = ["--fast"];
  const FILE = `public/examples/${example}.json`;
  const webTrim = "auto";

  it("gives every resistor one value in synth, budget --json, netlist, export (bom.csv, deck) and the web app's export", async () => {
    const [synth, budget, netlist, exp] = await Promise.all([
      run(["synth", FILE, ...synthArgs]),
      run(["budget", FILE, "--json", ...synthArgs]),
      run(["netlist", FILE, "--state", "0", ...synthArgs]),
      run(["export", FILE, "--out", join(dir, example), ...synthArgs]),
    ]);
    for (const r of [synth, budget, netlist, exp]) expect(r.stderr).toBe("");
    expect([synth.code, budget.code, netlist.code, exp.code]).toEqual([0, 0, 0, 0]);

    const json = JSON.parse(budget.stdout) as Parameters<typeof budgetEmitters>[0] & { trim: { applied: boolean; effect: string } };
    const emitters = budgetEmitters(json);
    expect(emitters.size).toBe(drivers);
    // The hex monitor keeps the project's 300 Ω (the trim changes nothing); the turntable takes the trim's values.
    if (example === "relay-hex-monitor") {
      expect([json.trim.applied, json.trim.effect]).toEqual([false, "no-change"]);
      expect([...emitters.values()].every((o) => o === 300)).toBe(true);
    } else {
      expect([json.trim.applied, json.trim.effect]).toEqual([true, "improves"]);
      expect([...emitters.values()].some((o) => o !== 180)).toBe(true);
    }

    const parts = synthPartValues(synth.stdout);
    const deck = deckResistors(netlist.stdout);
    const bom = bomValues(readFileSync(join(dir, example, "bom.csv"), "utf8"));
    const exportDeck = deckResistors(readFileSync(join(dir, example, "spice", "S0.cir"), "utf8"));
    // The web app's Export of the same project, heuristic matrix and trim setting.
    const web = await webExport(example, webTrim);
    const webBom = bomValues(web.get("bom.csv") ?? "");
    const webDeckText = web.get("spice/S0.cir") ?? "";
    const webDeck = deckResistors(webDeckText);
    for (const [ref, ohms] of emitters) {
      const printed = formatOhms(ohms);
      expect([ref, parts.get(ref), bom.get(ref), webBom.get(ref)]).toEqual([ref, printed, printed, printed]);
      expect([ref, deck.get(ref), exportDeck.get(ref), webDeck.get(ref)]).toEqual([ref, ohms, ohms, ohms]);
    }
    // Every other resistor (the pull-downs) reads alike too.
    for (const [ref, ohms] of deck) {
      expect([ref, exportDeck.get(ref), webDeck.get(ref)]).toEqual([ref, ohms, ohms]);
      if (/^R\d+$/.test(ref)) expect([ref, parts.get(ref), bom.get(ref)]).toEqual([ref, formatOhms(ohms), formatOhms(ohms)]);
    }
    // And each says which design it is.
    const note =
      example === "relay-hex-monitor"
        ? new RegExp(`${resistors} resistors as in the project \\(the trim would change nothing\\)`)
        : new RegExp(`${resistors} resistors: the E24 trim, applied because it brings the segments nearer the target`);
    expect(synth.stdout).toMatch(note);
    expect(netlist.stdout).toMatch(note);
    expect(webDeckText).toMatch(note);
  });
});
