/**
 * Source: ngspice, the open reference simulator (docs/sources.md "DC
 * operating point").
 *
 * A dark-decoded project (0-5, every output dark, level-shift diodes) and a
 * mixed-polarity one (0-9, each output in its cheaper polarity) on the 5 V
 * switch preset: the circuit of every state (polarityCircuit.ts, with the
 * pull-ups the ghost check sizes) is written as a SPICE deck and run through
 * ngspice, and every node voltage, every segment current (the unlit ones
 * too: those are what the ghost check judges) and every matrix and
 * level-shift diode current agrees with diodeloom's own DC solver within
 * 0.5 % (values below 1 nA or 1 mV are compared against that floor).
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { ghostCheck } from "../../src/core/budget/ghostCheck.ts";
import { buildPolarityCircuit } from "../../src/core/circuit/polarityCircuit.ts";
import { solveDc } from "../../src/core/circuit/dcSolver.ts";
import { circuitNetlist } from "../../src/core/papers/netlist.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { makeProject2 } from "../support/projects.ts";

const REL = 0.005;
const FLOOR_A = 1e-9;
const FLOOR_V = 1e-3;
const dir = mkdtempSync(join(tmpdir(), "diodeloom-polarity-ngspice-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function runNgspice(deck: string, probes: readonly string[], file: string): Map<string, number> {
  const control = [".options reltol=1e-6 vntol=1e-9 abstol=1e-15", ".control", "op", "print all", `print ${probes.join(" ")}`, ".endc"];
  const path = join(dir, file);
  writeFileSync(path, deck.replace(/^\.end$/m, [...control, ".end"].join("\n")));
  const out = execFileSync("ngspice", ["-b", path], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
  const values = new Map<string, number>();
  for (const m of out.matchAll(/^\s*(\S+) = (\S+)\s*$/gm)) values.set((m[1] as string).toLowerCase(), Number(m[2]));
  return values;
}

function agree(a: number, b: number, floor: number, what: string): void {
  const diff = Math.abs(a - b);
  const big = Math.max(Math.abs(a), Math.abs(b));
  if (big < floor) expect(diff, `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(floor);
  else expect(diff / big, `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(REL);
}

const cases = [
  { name: "dark 0-5", show: [..."012345"], decode: "dark" },
  { name: "mixed 0-9", show: [..."0123456789"], decode: "either" },
] as const;

describe("ngspice agrees with the DC solver on dark-decoded outputs", () => {
  for (const c of cases) {
    it(`${c.name}: every state, every node, every segment lit or unlit, every diode`, async () => {
      const project = makeProject2({
        counter: { states: c.show.length, drive: "complementary" },
        display: {},
        show: c.show,
        synthesis: { depth: "mixed", decode: c.decode, timeLimitMs: 10_000 },
      });
      const spec = compileSpec(project);
      const r = await synthesize(spec, synthSettings(project));
      if (!r.ok) throw new Error(JSON.stringify(r.error));
      const matrix = r.value;
      if (c.decode === "either") {
        const polarities = new Set(Object.values(matrix.decode ?? {}));
        expect(polarities.size, "a mixed-polarity decoder").toBe(2);
      }
      const g = ghostCheck(project, spec, matrix);
      if (!g.ok) throw new Error(g.error.message);
      let unlitChecked = 0;
      spec.states.forEach((state, k) => {
        const circuit = buildPolarityCircuit(spec, matrix, project.electrical, k, g.value.values);
        const op = solveDc(circuit, circuit.guess);
        if (!op.ok) throw new Error(op.error.message);
        const diodes = circuit.elements.filter((e) => e.kind === "diode").map((e) => e.name);
        const probes = [
          ...diodes.map((n) => `@${n.toLowerCase()}[id]`),
          ...circuit.drivers.map((d) => `@d${d.display.toLowerCase()}_1[id]`),
        ];
        const ng = runNgspice(circuitNetlist(circuit, c.name), probes, `${c.name.replace(/\W+/g, "-")}-${k}.cir`);
        for (const node of circuit.nodes) {
          expect(ng.get(node), `ngspice printed no voltage for ${node}`).toBeDefined();
          agree(op.value.voltages[node] as number, ng.get(node) as number, FLOOR_V, `${state} v(${node})`);
        }
        for (const d of circuit.drivers) {
          const led = ng.get(`@d${d.display.toLowerCase()}_1[id]`) as number;
          agree(op.value.currents[d.display] as number, led, FLOOR_A, `${state} segment ${d.output}`);
          const j = spec.outputs.indexOf(d.output);
          if (j >= 0 && !spec.lit[k]?.[j]) {
            unlitChecked++;
            // The ghost check's limit holds in ngspice too, at the nominal values.
            expect(led, `${state} unlit ${d.output}`).toBeLessThanOrEqual(g.value.ghostLimitA);
          }
        }
        for (const n of diodes)
          agree(op.value.currents[n] as number, ng.get(`@${n.toLowerCase()}[id]`) as number, FLOOR_A, `${state} i(${n})`);
      });
      expect(unlitChecked).toBeGreaterThan(0);
    }, 120_000);
  }
});
