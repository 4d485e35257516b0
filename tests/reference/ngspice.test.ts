/**
 * ngspice (the open reference simulator, Debian package `ngspice`, batch
 * mode `ngspice -b file.cir`; source: docs/sources.md "DC operating point")
 * runs the exported netlist of every state of designs of every driver kind
 * (current sink, low-side switch, emitter follower, direct drive), each
 * with the design its budget settles (the trim where it is applied), and
 * every segment current, transistor current, node voltage and diode
 * current agrees with diodeloom's own solver within 0.5 %; the budget's
 * `segmentA` of every segment above 1 µA agrees with ngspice within 0.5 %.
 *
 * The harness appends its own lines to a copy of each deck: tighter
 * tolerances (so ngspice's 0.1 % default does not blur the comparison) and a
 * `.control` block that prints the values. Values below a floor (1 nA, 1 mV)
 * are leakage set by each simulator's numerical details and are compared
 * against the floor instead.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { buildCircuit } from "../../src/core/circuit/circuit.ts";
import { solveDc } from "../../src/core/circuit/dcSolver.ts";
import { segmentLedNode, spiceNetlist } from "../../src/core/papers/netlist.ts";
import { budgetDesign, solveBudget } from "../../src/core/budget/budget.ts";
import type { Budget } from "../../src/core/budget/budgetTypes.ts";
import { clockProject, directDesign, sharedDieRoller, type Design } from "../support/budgetFixtures.ts";
import { exampleFormat1, makeProject2, showing, showingWith } from "../support/projects.ts";
import { exactSettings, specOf } from "../support/codedProjects.ts";
import { synthesize } from "../../src/core/synth/synthesize.ts";

const makeProjectOf = makeProject2;

const NGSPICE = "/usr/bin/ngspice";
const REL = 0.005;
const FLOOR_A = 1e-9;
const FLOOR_V = 1e-3;
/** Below this a segment is dark: the check is on every segment current above 1 µA. */
const SEGMENT_FLOOR_A = 1e-6;

const dir = mkdtempSync(join(tmpdir(), "diodeloom-ngspice-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function ngspiceFound(): boolean {
  if (existsSync(NGSPICE)) return true;
  try {
    execFileSync("ngspice", ["--version"], { stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
}

/** Runs a deck through ngspice and returns every printed `name = value`. */
function runNgspice(deck: string, probes: readonly string[], file: string): Map<string, number> {
  const control = [
    ".options reltol=1e-6 vntol=1e-9 abstol=1e-15",
    ".control",
    "op",
    "print all",
    ...chunk(probes, 20).map((c) => `print ${c.join(" ")}`),
    ".endc",
  ];
  // Keep the deck's own `.op` (batch mode wants one analysis line) and add ours before `.end`.
  const copy = deck.replace(/^\.end$/m, [...control, ".end"].join("\n"));
  const path = join(dir, file);
  writeFileSync(path, copy);
  const out = execFileSync(existsSync(NGSPICE) ? NGSPICE : "ngspice", ["-b", path], {
    encoding: "utf8",
    stdio: ["ignore", "pipe", "pipe"],
  });
  const values = new Map<string, number>();
  for (const m of out.matchAll(/^\s*(\S+) = (\S+)\s*$/gm)) values.set((m[1] as string).toLowerCase(), Number(m[2]));
  return values;
}

function chunk<T>(xs: readonly T[], n: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < xs.length; i += n) out.push(xs.slice(i, i + n));
  return out;
}

interface Worst {
  rel: number;
  what: string;
  checks: number;
  /** Largest relative difference per kind of value (v, segment, budget, ic, i). */
  byKind: Map<string, number>;
}

function agree(a: number, b: number, floor: number, what: string, worst: Worst): void {
  worst.checks++;
  const kind = (/ (v|segment|budget|ic|i)[ (]/.exec(what)?.[1] ?? "other") as string;
  const diff = Math.abs(a - b);
  const big = Math.max(Math.abs(a), Math.abs(b));
  if (big < floor) {
    expect(diff, `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(floor);
    return;
  }
  const rel = diff / big;
  worst.byKind.set(kind, Math.max(worst.byKind.get(kind) ?? 0, rel));
  if (rel > worst.rel) {
    worst.rel = rel;
    worst.what = `${what} (diodeloom ${a.toPrecision(6)}, ngspice ${b.toPrecision(6)})`;
  }
  expect(rel, `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(REL);
}

function checkDesign(d: Design): { worst: Worst; budget: Budget } {
  const worst: Worst = { rel: 0, what: "", checks: 0, byKind: new Map() };
  const solved = solveBudget(d.project, d.spec, d.matrix);
  if (!solved.ok) throw new Error(solved.error.message);
  const budget = solved.value;
  // The design the budget settled: its values are what the deck, the BOM and the figures carry.
  const design = budgetDesign(budget);
  d.spec.states.forEach((state, k) => {
    const circuit = buildCircuit(d.spec, d.matrix, d.project.electrical, k, design.ohms);
    const op = solveDc(circuit, circuit.guess);
    if (!op.ok) throw new Error(op.error.message);
    const diodes = d.matrix.diodes.map((x) => x.ref.toLowerCase());
    const probes = [
      ...diodes.map((r) => `@${r}[id]`),
      ...circuit.drivers.flatMap((dr) => [
        ...(dr.transistor !== null ? [`@${dr.transistor.toLowerCase()}[ic]`] : []),
        `@d${dr.display.toLowerCase()}_1[id]`,
      ]),
    ];
    const ng = runNgspice(spiceNetlist(d.project, d.spec, d.matrix, k, design), probes, `${d.name.replace(/\W+/g, "-")}-${k}.cir`);
    for (const node of circuit.nodes) {
      const theirs = ng.get(node);
      expect(theirs, `ngspice printed no voltage for ${node}`).toBeDefined();
      agree(op.value.voltages[node] as number, theirs as number, FLOOR_V, `${state} v(${node})`, worst);
    }
    const leds = d.project.electrical.segment.leds;
    for (const dr of circuit.drivers) {
      // Inside a segment the LEDs share the voltage equally.
      const anodeV = op.value.voltages[dr.segmentAnode] as number;
      const cathodeV = op.value.voltages[dr.segmentCathode] as number;
      const inner = segmentLedNode(dr.segmentCathode === "0" ? dr.segmentAnode : dr.segmentCathode, 1);
      if (leds > 1) agree(anodeV - (anodeV - cathodeV) / leds, ng.get(inner) as number, FLOOR_V, `${state} v(${inner})`, worst);
      const led = ng.get(`@d${dr.display.toLowerCase()}_1[id]`) as number;
      agree(op.value.currents[dr.display] as number, led, FLOOR_A, `${state} segment ${dr.output}`, worst);
      agree(budget.states[k]?.outputs[dr.output]?.segmentA as number, led, SEGMENT_FLOOR_A, `${state} budget ${dr.output}`, worst);
      if (dr.transistor !== null) {
        const ic = ng.get(`@${dr.transistor.toLowerCase()}[ic]`) as number;
        agree(op.value.transistors[dr.transistor]?.icA as number, ic, FLOOR_A, `${state} ic ${dr.transistor}`, worst);
      }
    }
    for (const r of d.matrix.diodes) {
      const theirs = ng.get(`@${r.ref.toLowerCase()}[id]`);
      expect(theirs, `ngspice printed no current for ${r.ref}`).toBeDefined();
      agree(op.value.currents[r.ref] as number, theirs as number, FLOOR_A, `${state} i(${r.ref})`, worst);
    }
  });
  return { worst, budget };
}

describe("ngspice agrees with the DC solver", () => {
  it("has ngspice installed (CI installs the Debian package; this must not be skipped)", () => {
    expect(ngspiceFound(), "ngspice not found: install the Debian package `ngspice` (apt-get install ngspice)").toBe(true);
  });

  /** A format-2 copy of an example with an `electrical` section. */
  const asKind = (name: string, electrical: Record<string, unknown>) => {
    const base = exampleFormat1(name);
    const cell = base.display.cell;
    return {
      title: base.title,
      counter: { states: base.counter.states },
      display:
        cell.kind === "custom"
          ? { positions: base.display.positions, cell: "custom", segments: [...cell.segments] }
          : { positions: base.display.positions, cell: cell.kind },
      glyphs: Object.fromEntries(Object.entries(base.glyphOverrides).map(([k, v]) => [k, [...v]])),
      show: [...base.show],
      electrical,
    };
  };
  const designs: (() => Design)[] = [
    // Format 1's current sink at 100 V.
    () => directDesign("relay-hex-monitor direct", exampleFormat1("relay-hex-monitor")),
    () => sharedDieRoller(),
    () => directDesign("turntable two positions", exampleFormat1("turntable-position")),
    () => directDesign("clock 00-59 two positions", clockProject()),
    // A tied-on output (2b), diode series resistance and a temperature other than 27 °C.
    () =>
      directDesign(
        "tied-on, rs and 40 °C",
        showing([" 1", "12", " 7"], 2, { electrical: { temperatureC: 40, diode: { rs: 20 }, counterOutput: { high: 3.3 } } }),
      ),
  ];
  // Every driver kind: a bus and two links at depth 2, two positions, a tied-on output (2b).
  const kinds: [string, Record<string, unknown>][] = [
    ["low-side switch", { preset: "bench-5v-switch" }],
    ["12 V sink, collector resistor", { preset: "panel-12v-sink", segment: { seriesResistor: 56 } }],
    ["emitter follower, base resistor", { preset: "cathode-5v-follower", driver: { baseResistor: 220 } }],
    ["direct drive", { preset: "line-direct" }],
  ];
  for (const [name, electrical] of kinds) {
    designs.push(
      () => sharedDieRoller(electrical),
      () => directDesign(`${name}: turntable two positions`, makeProjectOf(asKind("turntable-position", electrical))),
      () => directDesign(`${name}: tied-on`, showingWith([" 1", "12", " 7"], electrical, 2)),
    );
  }
  designs.push(
    // A line resistance high enough that the spread depends on the state (a state-spread finding).
    () =>
      directDesign(
        "follower on a 1.5 kΩ line: hex monitor",
        makeProjectOf(asKind("relay-hex-monitor", { preset: "cathode-5v-follower", counterOutput: { resistance: 1500 } })),
      ),
    () =>
      directDesign(
        "switch on a 10 kΩ line: hex monitor",
        makeProjectOf(asKind("relay-hex-monitor", { preset: "bench-5v-switch", counterOutput: { resistance: 10_000 } })),
      ),
    () => sharedDieRoller({ preset: "string-hv-sink" }),
  );
  for (const make of designs) {
    const d = make();
    it(`every state of ${d.name} (${d.project.electrical.driver.kind}) within 0.5 %`, () => {
      expect(ngspiceFound(), "ngspice not found: install the Debian package `ngspice`").toBe(true);
      const { worst, budget } = checkDesign(d);
      if (d.name.includes(" line: ")) {
        expect(
          budget.warnings.some((w) => w.code === "state-spread" && w.causes.includes("line-sag")),
          "the spread depends on the state",
        ).toBe(true);
      }
      // The agreement figure, for the closing note.
      const kinds = [...worst.byKind].map(([k, r]) => `${k} ${(r * 100).toFixed(4)} %`).join(", ");
      console.info(
        `ngspice vs diodeloom, ${d.name}: ${worst.checks} values, worst ${(worst.rel * 100).toFixed(4)} % at ${worst.what}; by kind: ${kinds}`,
      );
      expect(worst.checks).toBeGreaterThan(d.spec.states.length * 10);
    });
  }
});

/**
 * A coded counter's decoder (issue 12): stage lines as Thevenin sources, AND
 * gates with their pull-ups, OR diodes and a direct literal, then each driver
 * kind. The BCD decade's minimum two-level decoder (40 diodes, 7 gates, one
 * direct literal Q1 -> 1a) and a 5-stage Johnson decade, every state
 * against ngspice within 0.5 %, as above (source: docs/sources.md "DC
 * operating point").
 */
describe("ngspice agrees with the DC solver on coded counters' decoders", () => {
  const coded = async (name: string, code: "binary" | "johnson", electrical: Record<string, unknown>): Promise<Design> => {
    const project = makeProject2({ counter: { states: 10, code }, display: {}, show: [..."0123456789"], electrical });
    const spec = specOf(project);
    const m = await synthesize(spec, exactSettings());
    if (!m.ok) throw new Error(`synthesis failed: ${JSON.stringify(m.error)}`);
    return { name, project, spec, matrix: m.value };
  };
  const cases: [string, "binary" | "johnson", Record<string, unknown>][] = [
    ["BCD decade, low-side switch", "binary", { preset: "bench-5v-switch" }],
    ["BCD decade, 12 V sink", "binary", { preset: "panel-12v-sink" }],
    ["BCD decade, emitter follower", "binary", { preset: "cathode-5v-follower" }],
    ["BCD decade, direct drive", "binary", { preset: "line-direct" }],
    ["Johnson-5 decade, low-side switch", "johnson", { preset: "bench-5v-switch" }],
  ];
  for (const [name, code, electrical] of cases) {
    it(`every state of ${name} within 0.5 %`, async () => {
      expect(ngspiceFound(), "ngspice not found: install the Debian package `ngspice`").toBe(true);
      const d = await coded(name, code, electrical);
      expect(d.matrix.gates.length).toBeGreaterThan(0);
      const { worst } = checkDesign(d);
      const kinds = [...worst.byKind].map(([k, r]) => `${k} ${(r * 100).toFixed(4)} %`).join(", ");
      console.info(
        `ngspice vs diodeloom, ${d.name}: ${worst.checks} values, worst ${(worst.rel * 100).toFixed(4)} % at ${worst.what}; by kind: ${kinds}`,
      );
      expect(worst.checks).toBeGreaterThan(d.spec.states.length * 10);
    }, 60_000);
  }
});
