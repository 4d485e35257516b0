/**
 * Source: ngspice, the open reference simulator (docs/sources.md "DC
 * operating point").
 *
 * Projects driven by high-side switches (PNPs on the segment supply, their
 * lit cells decoded onto the counter's active-low lines), on the
 * `bench-5v-high-side` preset: 0-9 on a sink-drive counter, and 0, 8, 6 on
 * a complementary one (a, c, d, e and f lit in every state: tied on, held
 * down to ground). The budget settles the design; then, for every state:
 * - the SPICE deck the papers write (`spiceNetlist`, the PNP model card,
 *   every part under its designator) runs through ngspice, and every node
 *   voltage, every segment current (the unlit ones too), every matrix diode
 *   current and what the state's active-low line sinks agree with
 *   diodeloom's own DC solver within 0.5 % (values below 1 nA or 1 mV are
 *   compared against that floor);
 * - every unlit segment stays below the ghost limit in ngspice too, and the
 *   largest the budget reports (`offMaxA`) is ngspice's;
 * - the circuits of both tolerance corners run too: the budget's corner
 *   currents of the lit segments are ngspice's, and every unlit segment
 *   stays below the ghost limit there too (the high corner puts 5.25 V over
 *   lines idling at 5 V, at 50 °C);
 * - the budget's worst unlit segment at the nominal values and each corner
 *   (`unlit`: the current, the output and the state) is ngspice's largest.
 * And the hold-off estimate (highSideHold.ts) against ngspice on the chain
 * it describes: the supply, the line pull-up, Rbe, the PNP, Rb, one diode to
 * a stiff idle line.
 */
import { afterAll, describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../src/core/budget/budget.ts";
import { cornerConditions, cornerModel } from "../../src/core/budget/corners.ts";
import { designModel } from "../../src/core/budget/segmentDesign.ts";
import { buildCircuit } from "../../src/core/circuit/circuit.ts";
import { isLit } from "../../src/core/circuit/stateSweep.ts";
import { solveDc } from "../../src/core/circuit/dcSolver.ts";
import { spiceNetlist, circuitNetlist } from "../../src/core/papers/netlist.ts";
import { electricalOf } from "../../src/core/project/electricalSchema.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { highSideHold } from "../../src/core/spec/highSideHold.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { ngspiceOpRunner } from "../support/ngspiceOp.ts";
import { makeProject2 } from "../support/projects.ts";

const REL = 0.005;
const FLOOR_A = 1e-9;
const FLOOR_V = 1e-3;
const runNgspice = ngspiceOpRunner("high-side-ngspice");

/** The largest relative deviation above the floors, over every comparison of the file (reported at the end). */
let worstRel = 0;
/** The largest unlit segment current ngspice finds at either corner, amperes (reported at the end). */
let worstUnlitCorner = 0;
/** The largest worst unlit segment current the budget reports, amperes (reported at the end). */
let worstUnlitBudget = 0;

function agree(a: number, b: number, floor: number, what: string): void {
  const diff = Math.abs(a - b);
  const big = Math.max(Math.abs(a), Math.abs(b));
  if (big < floor) expect(diff, `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(floor);
  else {
    worstRel = Math.max(worstRel, diff / big);
    expect(diff / big, `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(REL);
  }
}

const cases = [
  { name: "sink 0-9", show: [..."0123456789"], drive: "sink" },
  { name: "complementary 0-8-6 tied", show: ["0", "8", "6"], drive: "complementary" },
] as const;

describe("ngspice agrees with the budget on high-side switches", () => {
  for (const c of cases) {
    it(`${c.name}: the papers' deck of every state, every node, every segment lit or unlit, every diode, each nS line; both corners`, async () => {
      const project = makeProject2({
        counter: { states: c.show.length, drive: c.drive },
        display: {},
        show: c.show,
        synthesis: { depth: "mixed", decode: "lit", timeLimitMs: 10_000 },
        electrical: { preset: "bench-5v-high-side" },
      });
      const spec = compileSpec(project);
      const r = await synthesize(spec, synthSettings(project));
      if (!r.ok) throw new Error(JSON.stringify(r.error));
      const matrix = r.value;
      const b = solveBudget(project, spec, matrix);
      if (!b.ok) throw new Error(b.error.message);
      const design = budgetDesign(b.value);
      const model = designModel(project.electrical, design);
      const ghostA = project.electrical.ghostFraction * project.electrical.segment.targetA;
      const offMax = new Map<string, number>();
      // Per case (nominal, low, high): ngspice's current of every unlit segment, by `output in state`.
      const unlitNg = new Map<string, Map<string, number>>(["nominal", "low", "high"].map((n) => [n, new Map()]));
      let unlitChecked = 0;
      spec.states.forEach((state, k) => {
        const deck = spiceNetlist(project, spec, matrix, k, design);
        expect(deck).toMatch(/^\.model QHSW PNP \(IS=1e-14 BF=150 BR=3\)$/m);
        const circuit = buildCircuit(spec, matrix, model, k, design.ohms);
        const op = solveDc(circuit, circuit.guess);
        if (!op.ok) throw new Error(op.error.message);
        const diodes = circuit.elements.filter((e) => e.kind === "diode").map((e) => e.name);
        const line = spec.polarity.activeLow[k] as string;
        const used = circuit.elements.some((e) => e.name === `R${line}`);
        const probes = [
          ...diodes.map((n) => `@${n.toLowerCase()}[id]`),
          ...circuit.drivers.map((d) => `@d${d.display.toLowerCase()}_1[id]`),
          ...(used ? [`@r${line.toLowerCase()}[i]`] : []),
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
            expect(led, `${state} unlit ${d.output}`).toBeLessThanOrEqual(ghostA);
            offMax.set(d.output, Math.max(offMax.get(d.output) ?? 0, led));
            unlitNg.get("nominal")?.set(`${d.output} in ${state}`, led);
          }
        }
        for (const n of diodes)
          agree(op.value.currents[n] as number, ng.get(`@${n.toLowerCase()}[id]`) as number, FLOOR_A, `${state} i(${n})`);
        // ngspice's resistor current runs from its first node (the source) to the line: the line sinks its negative.
        if (used) {
          const sink = b.value.counterLines[line]?.sinkCurrentA ?? NaN;
          agree(sink, -(ng.get(`@r${line.toLowerCase()}[i]`) as number), FLOOR_A, `${state} ${line} sink`);
        }

        // Both corners: the circuit of each, written out, and the budget's corner figures of the lit segments.
        const driven = [...matrix.outputs, ...matrix.tiedOn];
        for (const x of cornerConditions(model)) {
          const cc = buildCircuit(spec, matrix, cornerModel(model, x, driven, design.ohms), k);
          const leds = cc.drivers.map((d) => `@d${d.display.toLowerCase()}_1[id]`);
          const ngc = runNgspice(circuitNetlist(cc, c.name), leds, `${c.name.replace(/\W+/g, "-")}-${k}-${x.name}.cir`);
          const corner = x.name === "low" ? b.value.corners.low : b.value.corners.high;
          for (const d of cc.drivers) {
            const i = ngc.get(`@d${d.display.toLowerCase()}_1[id]`) as number;
            if (!isLit(spec, k, d.output)) {
              // The ghost check at the corner: the highest supply over lines idling at 5 V, at 50 °C, still dark.
              expect(i, `${state} ${x.name} unlit ${d.output}`).toBeLessThanOrEqual(ghostA);
              worstUnlitCorner = Math.max(worstUnlitCorner, i);
              unlitNg.get(x.name)?.set(`${d.output} in ${state}`, i);
              continue;
            }
            const range = corner.outputs[d.output];
            if (range === undefined) throw new Error(`no ${x.name} corner range for ${d.output}`);
            // ngspice's current lies within the budget's range at this corner (within the tolerance).
            expect(i, `${state} ${x.name} ${d.output}`).toBeGreaterThanOrEqual(range.minA * (1 - REL));
            expect(i, `${state} ${x.name} ${d.output}`).toBeLessThanOrEqual(range.maxA * (1 + REL));
          }
        }
      });
      expect(unlitChecked).toBeGreaterThan(0);
      // The budget's largest unlit current of each output is ngspice's.
      for (const [o, a] of offMax) agree(b.value.outputs[o]?.offMaxA ?? NaN, a, FLOOR_A, `offMaxA ${o}`);
      // The budget's worst unlit segment at the nominal values and each corner (`unlit`) is ngspice's largest, and
      // ngspice's current where the budget says it is that largest. Picoamperes: compared against a 1 fA floor, as
      // both solvers put the same GMIN across every junction.
      for (const [name, currents] of unlitNg) {
        const figure = b.value.unlit[name as "nominal" | "low" | "high"];
        if (figure === null) throw new Error(`no worst unlit segment at ${name}`);
        const largest = Math.max(...currents.values());
        agree(figure.currentA, largest, 1e-15, `worst unlit at ${name}`);
        agree(
          currents.get(`${figure.output} in ${figure.state}`) ?? NaN,
          largest,
          1e-15,
          `unlit ${figure.output} in ${figure.state} at ${name}`,
        );
        worstUnlitBudget = Math.max(worstUnlitBudget, figure.currentA);
      }
    }, 240_000);
  }

  it("the hold-off estimate is ngspice's operating point of the chain it describes, where the supply is above the idle lines", () => {
    const collectors: number[] = [];
    for (const supply of [5.25, 5.8, 6.2, 6.6]) {
      const e = electricalOf({ preset: "bench-5v-high-side", supply: { volts: supply, minVolts: supply, maxVolts: supply } });
      const h = highSideHold(e);
      const dr = e.driver;
      const d = e.diode;
      const deck = [
        "* high-side switch held off by an idle line",
        `.options TNOM=${e.temperatureC}`,
        `.temp ${e.temperatureC}`,
        `.model DMTX D (IS=${d.is} N=${d.n} RS=${d.rs})`,
        `.model QHSW PNP (IS=${dr.is} BF=${dr.betaF} BR=${dr.betaR})`,
        `VSUP vsup 0 DC ${supply}`,
        `VLINE line 0 DC ${e.lowLine.high}`,
        `RPU vsup node ${e.pullDown}`,
        `RBE vsup base ${dr.baseEmitterResistor}`,
        `RB node base ${dr.baseResistor}`,
        "D1 node line DMTX",
        "Q1 0 base vsup QHSW",
        ".op",
        ".end",
      ].join("\n");
      const ng = runNgspice(deck, ["@q1[ic]"], `hold-${supply}.cir`);
      agree(h.nodeV, ng.get("node") as number, FLOOR_V, `${supply} V node`);
      agree(h.junctionV, supply - (ng.get("base") as number), FLOOR_V, `${supply} V junction`);
      // ngspice's collector current is into the collector: a PNP's is negative. Below a nanoampere, GMIN across
      // the reverse-biased collector junction (5 pA here) is as large as the current itself.
      const ic = -(ng.get("@q1[ic]") as number);
      agree(h.collectorA, ic, FLOOR_A, `${supply} V collector`);
      collectors.push(ic);
    }
    // The supplies span a switch held off (5.25 V, the preset's highest) to one the check refuses.
    expect(collectors[0]).toBeLessThan(1e-9);
    expect(collectors[collectors.length - 1]).toBeGreaterThan(1e-4);
  });

  afterAll(() =>
    console.log(
      `high-side ngspice: largest relative deviation above the floors ${(worstRel * 100).toFixed(4)} %; ` +
        `largest unlit segment current at a corner ${worstUnlitCorner.toExponential(3)} A (the budget's ${worstUnlitBudget.toExponential(3)} A)`,
    ),
  );
});
