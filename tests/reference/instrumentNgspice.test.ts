/**
 * ngspice (the open reference simulator, Debian package `ngspice`, batch
 * mode `ngspice -b file.cir`; source: docs/sources.md "DC operating point")
 * reads the decks of an instrument's decoder, whose parts carry the
 * decoder's number in front (`2R3`, written `R2R3` for SPICE), as it reads
 * the same decoder's decks without the prefix: every node voltage of every
 * state is the same, and agrees with diodeloom's own solver within 0.5 %;
 * one decoder drives its segments through PNP high-side switches, the others
 * through the shared section's NPN switches.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../src/core/budget/budget.ts";
import { buildCircuit } from "../../src/core/circuit/circuit.ts";
import { solveDc } from "../../src/core/circuit/dcSolver.ts";
import { withRefPrefix } from "../../src/core/matrix/designators.ts";
import { spiceNetlist } from "../../src/core/papers/netlist.ts";
import { validateInstrument } from "../../src/core/project/instrument.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";

const dir = mkdtempSync(join(tmpdir(), "diodeloom-instrument-ngspice-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Every node voltage ngspice prints for a deck's operating point, by node name. */
function nodeVoltages(deck: string, file: string): Map<string, number> {
  const path = join(dir, file);
  writeFileSync(
    path,
    deck.replace(/^\.end$/m, [".options reltol=1e-6 vntol=1e-9 abstol=1e-15", ".control", "op", "print all", ".endc", ".end"].join("\n")),
  );
  const out = execFileSync("ngspice", ["-b", path], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
  const values = new Map<string, number>();
  // `print all` lists every node voltage as `node = value` (and branch currents as `vs0#branch = value`).
  for (const m of out.matchAll(/^\s*([a-z0-9_]+) = (\S+)\s*$/gm)) values.set(m[1] as string, Number(m[2]));
  return values;
}

describe("ngspice on an instrument decoder's decks", () => {
  it("gives the prefixed decks the node voltages of the plain ones, which diodeloom's solver matches", async () => {
    const inst = validateInstrument({
      schema: "diodeloom/project@2",
      title: "Lap timer",
      electrical: { preset: "bench-5v-switch" },
      decoders: [
        { name: "seconds", counter: { states: 4 }, display: {}, show: ["0", "1", "2", "3"] },
        { name: "laps", counter: { states: 6, code: "binary" }, display: {}, show: ["0", "1", "2", "3", "4", "5"] },
        // PNP high-side switches on a sink-drive ring, the decoder's own preset (the model card QHSW, the nS lines).
        {
          name: "heat",
          counter: { states: 4, drive: "sink" },
          display: {},
          show: ["1", "2", "3", "F"],
          electrical: { preset: "bench-5v-high-side" },
        },
      ],
    });
    if (!inst.ok) throw new Error(JSON.stringify(inst.error));
    for (const [i, d] of inst.value.decoders.entries()) {
      const spec = compileSpec(d.project);
      const m = await synthesize(spec, synthSettings(d.project, { mode: "fast" }));
      if (!m.ok) throw new Error(m.error.message);
      const prefixed = withRefPrefix(m.value, String(i + 1));
      const budget = solveBudget(d.project, spec, prefixed);
      if (!budget.ok) throw new Error(budget.error.message);
      const design = budgetDesign(budget.value);
      for (const k of spec.states.keys()) {
        const deck = spiceNetlist(d.project, spec, prefixed, k, design);
        expect(deck).toMatch(new RegExp(`^R${i + 1}R1 `, "m"));
        expect(deck).toMatch(new RegExp(`^Q${i + 1}Q1 .* ${d.name === "heat" ? "QHSW" : "QDRV"}$`, "m"));
        const plain = nodeVoltages(spiceNetlist(d.project, spec, m.value, k, design), `plain-${i}-${k}.cir`);
        const ours = nodeVoltages(deck, `prefixed-${i}-${k}.cir`);
        expect(ours.size).toBeGreaterThan(5);
        expect(ours).toEqual(plain);
        const circuit = buildCircuit(spec, prefixed, d.project.electrical, k, design.ohms);
        const solved = solveDc(circuit);
        if (!solved.ok) throw new Error(solved.error.message);
        let compared = 0;
        for (const [node, v] of ours) {
          const own = solved.value.voltages[node];
          if (own === undefined) continue;
          compared++;
          expect(Math.abs(own - v), `${d.name} S${k} ${node}`).toBeLessThanOrEqual(Math.max(1e-3, Math.abs(v) * 0.005));
        }
        expect(compared).toBeGreaterThan(5);
      }
    }
  }, 120_000);
});
