/**
 * One design, one value per designator: the hex monitor run through the
 * real command as a user runs it (`synth`, `budget --json`, `netlist`,
 * `export`) and through the web app's Export files, and every paper must
 * give each resistor the same value. Once with the default trim setting
 * (auto: on the hex monitor the E24 trim would widen the spread, so the
 * design keeps the project's 10k) and once with `--trim on` (the trim's
 * values), so both kinds of design are checked.
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
const FILE = "public/examples/relay-hex-monitor.json";
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
  ["the default design", [] as string[], "auto" as const],
  ["the trimmed design (--trim on)", ["--trim", "on"], "on" as const],
])("%s of the hex monitor", (_, trimArgs, webTrim) => {
  // --fast: the heuristic matrix, the one the web app shows first, so the web app's files can be compared too.
  const synthArgs = ["--fast", ...trimArgs];

  it("gives every resistor one value in synth, budget --json, netlist, export (bom.csv, deck) and the web app's export", async () => {
    const [synth, budget, netlist, exp] = await Promise.all([
      run(["synth", FILE, ...synthArgs]),
      run(["budget", FILE, "--json", ...synthArgs]),
      run(["netlist", FILE, "--state", "0", ...synthArgs]),
      run(["export", FILE, "--out", join(dir, webTrim), ...synthArgs]),
    ]);
    for (const r of [synth, budget, netlist, exp]) expect(r.stderr).toBe("");
    expect([synth.code, budget.code, netlist.code, exp.code]).toEqual([0, 0, 0, 0]);

    const json = JSON.parse(budget.stdout) as Parameters<typeof budgetEmitters>[0] & { trim: { applied: boolean; effect: string } };
    const emitters = budgetEmitters(json);
    expect(emitters.size).toBe(7);
    // auto keeps the project's 10k (the trim would widen the spread); on takes the trim's values.
    if (webTrim === "auto") {
      expect([json.trim.applied, json.trim.effect]).toEqual([false, "widens-spread"]);
      expect([...emitters.values()].every((o) => o === 10_000)).toBe(true);
    } else {
      expect(json.trim.applied).toBe(true);
      expect([...emitters.values()].every((o) => o !== 10_000)).toBe(true);
    }

    const parts = synthPartValues(synth.stdout);
    const deck = deckResistors(netlist.stdout);
    const bom = bomValues(readFileSync(join(dir, webTrim, "bom.csv"), "utf8"));
    const exportDeck = deckResistors(readFileSync(join(dir, webTrim, "spice", "S0.cir"), "utf8"));
    // The web app's Export of the same project, heuristic matrix and trim setting.
    const web = await webExport("relay-hex-monitor", webTrim);
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
      webTrim === "auto"
        ? /Emitter resistors as in the project: the E24 trim is not applied/
        : /Emitter resistors: the E24 trim, applied on request/;
    expect(synth.stdout).toMatch(note);
    expect(netlist.stdout).toMatch(note);
    expect(webDeckText).toMatch(note);
  });
});
