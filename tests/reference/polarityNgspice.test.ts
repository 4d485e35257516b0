/**
 * Source: ngspice, the open reference simulator (docs/sources.md "DC
 * operating point").
 *
 * A dark-decoded project (0-5, every output dark, level-shift diodes), a
 * mixed-polarity one (0-9, each output in its cheaper polarity) and a
 * dark one with dividers (0-5), on the 5 V switch preset. The budget sizes
 * the pull-ups and the network; then, for every state:
 * - the SPICE deck the papers write (`spiceNetlist`, the design's values,
 *   every part under its designator) is run through ngspice, and every node
 *   voltage, every segment current (the unlit ones too: those are what the
 *   ghost check judges) and every matrix and level-shift diode current
 *   agrees with diodeloom's own DC solver within 0.5 % (values below 1 nA or
 *   1 mV are compared against that floor);
 * - the circuit of each tolerance corner is written out and run too, and
 *   the budget's ghost check figures of that state and corner (the largest
 *   unlit and the smallest lit segment of a dark-decoded output, what the
 *   active-low line sinks) agree with ngspice's currents.
 */
import { describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../src/core/budget/budget.ts";
import { cornerConditions, cornerModel } from "../../src/core/budget/corners.ts";
import { designModel } from "../../src/core/budget/segmentDesign.ts";
import { buildCircuit } from "../../src/core/circuit/circuit.ts";
import { isLit } from "../../src/core/circuit/stateSweep.ts";
import { solveDc } from "../../src/core/circuit/dcSolver.ts";
import { designators } from "../../src/core/matrix/designators.ts";
import { darkOutputs } from "../../src/core/matrix/matrix.ts";
import { circuitNetlist, spiceNetlist } from "../../src/core/papers/netlist.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { ngspiceOpRunner } from "../support/ngspiceOp.ts";
import { makeProject2 } from "../support/projects.ts";

const REL = 0.005;
const FLOOR_A = 1e-9;
const FLOOR_V = 1e-3;
const runNgspice = ngspiceOpRunner("polarity-ngspice");

function agree(a: number, b: number, floor: number, what: string): void {
  const diff = Math.abs(a - b);
  const big = Math.max(Math.abs(a), Math.abs(b));
  if (big < floor) expect(diff, `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(floor);
  else expect(diff / big, `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(REL);
}

const cases = [
  { name: "dark 0-5", show: [..."012345"], decode: "dark", darkInput: "level-shift" },
  { name: "mixed 0-9", show: [..."0123456789"], decode: "either", darkInput: "level-shift" },
  { name: "divider 0-5", show: [..."012345"], decode: "dark", darkInput: "divider" },
] as const;

describe("ngspice agrees with the budget on dark-decoded outputs", () => {
  for (const c of cases) {
    it(`${c.name}: the papers' deck of every state, every node, every segment lit or unlit, every diode; the ghost check at every corner`, async () => {
      const project = makeProject2({
        counter: { states: c.show.length, drive: "complementary" },
        display: {},
        show: c.show,
        synthesis: { depth: "mixed", decode: c.decode, darkInput: c.darkInput, timeLimitMs: 10_000 },
      });
      const spec = compileSpec(project);
      const r = await synthesize(spec, synthSettings(project));
      if (!r.ok) throw new Error(JSON.stringify(r.error));
      const matrix = r.value;
      if (c.decode === "either") {
        const polarities = new Set(Object.values(matrix.decode ?? {}));
        expect(polarities.size, "a mixed-polarity decoder").toBe(2);
      }
      const b = solveBudget(project, spec, matrix);
      if (!b.ok) throw new Error(b.error.message);
      const dark = b.value.dark;
      if (dark === null) throw new Error("the budget has no dark section");
      expect(dark.passes, dark.verdict).toBe(true);
      const design = budgetDesign(b.value);
      const model = designModel(project.electrical, design);
      // Every pull-up, divider and level-shift diode is in the deck under its designator.
      const parts = designators(spec, matrix, model, design.ohms);
      expect(parts.darkInputs.map((p) => p.output)).toEqual(darkOutputs(matrix));
      let unlitChecked = 0;
      spec.states.forEach((state, k) => {
        const deck = spiceNetlist(project, spec, matrix, k, design);
        for (const p of parts.darkInputs) {
          expect(deck).toMatch(new RegExp(`^${p.pullUp.ref} vlogic o${p.output} ${p.pullUp.ohms}$`, "m"));
          if (p.divider !== null) expect(deck).toMatch(new RegExp(`^${p.divider.ref} o${p.output} i${p.output} ${p.divider.ohms}$`, "m"));
          for (const ref of p.shiftDiodes) expect(deck).toMatch(new RegExp(`^${ref} \\S+ \\S+ DMTX$`, "m"));
        }
        const circuit = buildCircuit(spec, matrix, model, k, design.ohms);
        const op = solveDc(circuit, circuit.guess);
        if (!op.ok) throw new Error(op.error.message);
        const diodes = circuit.elements.filter((e) => e.kind === "diode").map((e) => e.name);
        const probes = [
          ...diodes.map((n) => `@${n.toLowerCase()}[id]`),
          ...circuit.drivers.map((d) => `@d${d.display.toLowerCase()}_1[id]`),
        ];
        const ng = runNgspice(deck, probes, `${c.name.replace(/\W+/g, "-")}-${k}.cir`);
        for (const node of circuit.nodes) {
          expect(ng.get(node), `ngspice printed no voltage for ${node}`).toBeDefined();
          agree(op.value.voltages[node] as number, ng.get(node) as number, FLOOR_V, `${state} v(${node})`);
        }
        for (const d of circuit.drivers) {
          const led = ng.get(`@d${d.display.toLowerCase()}_1[id]`) as number;
          agree(op.value.currents[d.display] as number, led, FLOOR_A, `${state} segment ${d.output}`);
          if (!isLit(spec, k, d.output)) {
            unlitChecked++;
            expect(led, `${state} unlit ${d.output}`).toBeLessThanOrEqual(dark.ghostLimitA);
          }
        }
        for (const n of diodes)
          agree(op.value.currents[n] as number, ng.get(`@${n.toLowerCase()}[id]`) as number, FLOOR_A, `${state} i(${n})`);

        // The ghost check's figures of this state, at the nominal values and both corners, from ngspice.
        const driven = [...matrix.outputs, ...matrix.tiedOn];
        const runs = [
          { name: "nominal", m: model },
          ...cornerConditions(model).map((x) => ({ name: x.name, m: cornerModel(model, x, driven, design.ohms) })),
        ];
        for (const run of runs) {
          const cc = buildCircuit(spec, matrix, run.m, k, run.name === "nominal" ? design.ohms : undefined);
          const line = spec.polarity.activeLow[k] as string;
          const used = cc.elements.some((e) => e.name === `R${line}`);
          const darkDrivers = cc.drivers.filter((d) => dark.outputs.some((o) => o.output === d.output));
          const probesC = [
            ...darkDrivers.map((d) => `@d${d.display.toLowerCase()}_1[id]`),
            ...(used ? [`@r${line.toLowerCase()}[i]`] : []),
          ];
          const ngc = runNgspice(circuitNetlist(cc, c.name), probesC, `${c.name.replace(/\W+/g, "-")}-${k}-${run.name}.cir`);
          const fig = dark.states.find((s) => s.state === state && s.corner === run.name);
          if (fig === undefined) throw new Error(`no ghost figures for ${state} at ${run.name}`);
          const unlit = darkDrivers
            .filter((d) => !isLit(spec, k, d.output))
            .map((d) => ngc.get(`@d${d.display.toLowerCase()}_1[id]`) as number);
          const lit = darkDrivers
            .filter((d) => isLit(spec, k, d.output))
            .map((d) => ngc.get(`@d${d.display.toLowerCase()}_1[id]`) as number);
          if (unlit.length > 0) agree(fig.worstUnlit?.currentA ?? NaN, Math.max(...unlit), FLOOR_A, `${state} ${run.name} worst unlit`);
          else expect(fig.worstUnlit).toBeNull();
          if (lit.length > 0) agree(fig.weakestLit?.currentA ?? NaN, Math.min(...lit), FLOOR_A, `${state} ${run.name} weakest lit`);
          // ngspice's resistor current runs from its first node (the source) to the line: the line sinks its negative.
          if (used) agree(fig.lineSinkA, -(ngc.get(`@r${line.toLowerCase()}[i]`) as number), FLOOR_A, `${state} ${run.name} ${line} sink`);
        }
      });
      expect(unlitChecked).toBeGreaterThan(0);
    }, 240_000);
  }
});
