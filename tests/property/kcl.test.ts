/**
 * Kirchhoff's current law holds at every node of every solved state: for
 * random lit tables, random matrices (direct, with a shared bus and with
 * output links), every driver kind (current sink, with or without a
 * collector resistor; low-side switch, with or without a base-emitter
 * resistor; emitter follower, with or without a base resistor; direct
 * drive) and random electrical values, the currents the device equations
 * give at the solved node voltages sum to zero at every node within
 * 1e-9 A + 1e-6 of the currents meeting there.
 *
 * The currents are recomputed here from the node voltages alone, element by
 * element, with SPICE's GMIN placement (across each junction, GMIN/leds
 * across a segment's junctions, collector to substrate), not taken from the
 * solver.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { buildCircuit, type Circuit } from "../../src/core/circuit/circuit.ts";
import { DEFAULT_GMIN_S, solveDc, type OperatingPoint } from "../../src/core/circuit/dcSolver.ts";
import { compileSpec, type DecodeSpec } from "../../src/core/spec/decodeSpec.ts";
import { diodeJunction, npnTransport } from "../../src/core/circuit/deviceModels.ts";
import { buildMatrix, type Edge } from "../../src/core/matrix/matrix.ts";
import { shockleyVoltage, thermalVoltage } from "../../src/core/circuit/physics.ts";
import type { Project } from "../../src/core/project/project.ts";
import { verifyMatrix } from "../../src/core/matrix/verify.ts";
import type { DriverKind } from "../../src/core/project/project.ts";
import { makeProject2 } from "../support/projects.ts";
import { codedDecoder } from "../support/codedProjects.ts";
import { serializeProject } from "../../src/core/project/projectWriter.ts";

const SEED = 4243;
const KINDS: readonly DriverKind[] = ["current-sink", "low-side-switch", "emitter-follower", "direct"];
const SEGMENTS = ["p", "q", "r", "s", "t"];

/** Sum of currents leaving each node, and the sum of their magnitudes. */
function kclResiduals(c: Circuit, op: OperatingPoint): Map<string, { sum: number; scale: number }> {
  const v = (n: string): number => {
    const x = op.voltages[n];
    if (x === undefined) throw new Error(`no voltage for ${n}`);
    return x;
  };
  const res = new Map<string, { sum: number; scale: number }>();
  const leave = (n: string, i: number): void => {
    const r = res.get(n) ?? { sum: 0, scale: 0 };
    r.sum += i;
    r.scale += Math.abs(i);
    res.set(n, r);
  };
  const vt = thermalVoltage(c.temperatureC);
  for (const el of c.elements) {
    switch (el.kind) {
      case "vsource":
        break;
      case "resistor": {
        const i = (v(el.a) - v(el.b)) / el.ohms;
        leave(el.a, i);
        leave(el.b, -i);
        break;
      }
      case "diode": {
        let anode = el.anode;
        if (el.rsOhms > 0) {
          anode = `${el.name}#j`;
          const i = (v(el.anode) - v(anode)) / el.rsOhms;
          leave(el.anode, i);
          leave(anode, -i);
        }
        const i = diodeJunction(v(anode) - v(el.cathode), el.isA, el.n * vt, DEFAULT_GMIN_S).currentA;
        leave(anode, i);
        leave(el.cathode, -i);
        break;
      }
      case "segment": {
        let anode = el.anode;
        if (el.rsOhms > 0) {
          anode = `${el.name}#j`;
          const i = (v(el.anode) - v(anode)) / (el.leds * el.rsOhms);
          leave(el.anode, i);
          leave(anode, -i);
        }
        const i = diodeJunction(v(anode) - v(el.cathode), el.isA, el.leds * el.n * vt, DEFAULT_GMIN_S / el.leds).currentA;
        leave(anode, i);
        leave(el.cathode, -i);
        break;
      }
      case "npn": {
        const p = npnTransport(
          v(el.base) - v(el.emitter),
          v(el.base) - v(el.collector),
          { isA: el.isA, betaF: el.betaF, betaR: el.betaR },
          vt,
          DEFAULT_GMIN_S,
        );
        leave(el.collector, p.icA + DEFAULT_GMIN_S * v(el.collector));
        leave(el.base, p.ibA);
        leave(el.emitter, -(p.icA + p.ibA));
        break;
      }
    }
  }
  return res;
}

/** Random sharing on a direct matrix: one bus over a pair of outputs, then output links where they fit. */
function sharedEdges(spec: DecodeSpec, pick: number, link: boolean): Edge[] {
  const litBy = (o: string): string[] => spec.states.filter((_, k) => spec.lit[k]?.[spec.outputs.indexOf(o)]);
  let edges: Edge[] = [];
  spec.states.forEach((s, k) => spec.outputs.forEach((o, j) => spec.lit[k]?.[j] && edges.push({ from: s, to: o })));
  const n = spec.outputs.length;
  if (n >= 2) {
    const o1 = spec.outputs[pick % n] as string;
    const o2 = spec.outputs[(pick + 1) % n] as string;
    const both = litBy(o1).filter((s) => litBy(o2).includes(s));
    if (both.length >= 2) {
      edges = edges.filter((e) => !(both.includes(e.from) && (e.to === o1 || e.to === o2)));
      edges.push(...both.map((s) => ({ from: s, to: "X" })), { from: "X", to: o1 }, { from: "X", to: o2 });
    }
  }
  if (link) {
    // o -> p when p is lit whenever o is, both reached straight from the counter, p with nothing downstream.
    for (const o of spec.outputs) {
      for (const p of spec.outputs) {
        if (o === p) continue;
        const lo = litBy(o);
        const lp = litBy(p);
        const fromStatesOnly = (x: string): boolean => edges.filter((e) => e.to === x).every((e) => spec.states.includes(e.from));
        const drivesNothing = (x: string): boolean => !edges.some((e) => e.from === x);
        if (!lo.every((st) => lp.includes(st)) || !fromStatesOnly(o) || !fromStatesOnly(p) || !drivesNothing(o) || !drivesNothing(p))
          continue;
        edges = edges.filter((e) => !(lo.includes(e.from) && e.to === p));
        edges.push({ from: o, to: p });
        return edges;
      }
    }
  }
  return edges;
}

const logUniform = (lo: number, hi: number) => fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }).map((x) => 10 ** x);

const projectArb = fc
  .record({
    kind: fc.constantFrom(...KINDS),
    states: fc.integer({ min: 2, max: 7 }),
    segs: fc.integer({ min: 2, max: 5 }),
    seedBits: fc.array(fc.integer({ min: 0, max: 31 }), { minLength: 7, maxLength: 7 }),
    lineHeadroom: fc.double({ min: 0.5, max: 5, noNaN: true }),
    resistance: logUniform(10, 10_000),
    dIs: logUniform(1e-12, 1e-7),
    dN: fc.double({ min: 1, max: 2, noNaN: true }),
    rs: fc.oneof(fc.constant(0), fc.double({ min: 0.5, max: 100, noNaN: true })),
    pullDown: logUniform(10_000, 1_000_000),
    qIs: logUniform(1e-16, 1e-13),
    betaF: fc.double({ min: 20, max: 500, noNaN: true }),
    betaR: fc.double({ min: 0.5, max: 10, noNaN: true }),
    re: logUniform(100, 100_000),
    rb: logUniform(100, 100_000),
    rbe: fc.oneof(fc.constant(null), logUniform(1000, 1_000_000)),
    series: logUniform(10, 10_000),
    collector: fc.oneof(fc.constant(0), logUniform(10, 1000)),
    leds: fc.integer({ min: 1, max: 30 }),
    lowLeds: fc.integer({ min: 1, max: 4 }),
    sIs: logUniform(1e-30, 1e-18),
    sN: fc.double({ min: 1.5, max: 3, noNaN: true }),
    ledRs: fc.oneof(fc.constant(0), fc.double({ min: 0.5, max: 20, noNaN: true })),
    targetA: logUniform(1e-4, 2e-2),
    headroom: fc.double({ min: 1, max: 60, noNaN: true }),
    temperatureC: fc.double({ min: -20, max: 80, noNaN: true }),
    tied: fc.boolean(),
    pick: fc.nat(20),
    link: fc.boolean(),
  })
  .map((r) => {
    const segments = SEGMENTS.slice(0, r.segs);
    // Glyph k lights the segments of a bit pattern; every state shows its own glyph (and, if asked, segment p in all of them: tied on).
    const glyphs: Record<string, string[]> = {};
    const show: string[] = [];
    for (let k = 0; k < r.states; k++) {
      const bits = (r.seedBits[k] ?? 1) || 1;
      const ch = String.fromCharCode(65 + k);
      glyphs[ch] = segments.filter((_, i) => bits & (1 << i) || (r.tied && i === 0));
      if ((glyphs[ch] as string[]).length === 0) glyphs[ch] = [segments[0] as string];
      show.push(ch);
    }
    const leds = r.kind === "current-sink" ? r.leds : r.lowLeds;
    const vt = thermalVoltage(r.temperatureC);
    const dropV = leds * (shockleyVoltage(r.targetA, r.sIs, r.sN, vt) + r.targetA * r.ledRs);
    // A supply above the segment's drop, and a counter high enough for a follower's or direct drive's segment.
    const volts = Math.min(900, dropV + r.headroom);
    const high = Math.min(99, (r.kind === "emitter-follower" ? dropV + 1.3 : r.kind === "direct" ? dropV + 0.7 : 1.5) + r.lineHeadroom);
    const followerSupply = r.kind === "emitter-follower" ? Math.max(volts, high) : volts;
    const project: Project = makeProject2({
      counter: { states: r.states },
      display: { positions: 1, cell: "custom", segments },
      glyphs,
      show,
      electrical: {
        temperatureC: r.temperatureC,
        counterOutput: { high, low: 0, resistance: r.resistance },
        logicSupply: { volts: Math.max(1, high) },
        diode: { is: r.dIs, n: r.dN, rs: r.rs },
        pullDown: r.pullDown,
        driver: {
          kind: r.kind,
          is: r.qIs,
          betaF: r.betaF,
          betaR: r.betaR,
          emitterResistor: r.re,
          baseResistor: r.kind === "emitter-follower" && r.rbe === null ? 0 : r.rb,
          baseEmitterResistor: r.rbe,
        },
        segment: {
          leds,
          is: r.sIs,
          n: r.sN,
          rs: r.ledRs,
          seriesResistor: r.kind === "current-sink" ? r.collector : r.series,
          targetA: r.targetA,
          maxA: 10,
        },
        supply: { volts: followerSupply, minVolts: followerSupply * 0.99, maxVolts: followerSupply * 1.01 },
      },
    });
    return { project, pick: r.pick, link: r.link };
  });

describe("Kirchhoff's current law", () => {
  it(`holds at every node of every solved state (seed ${SEED})`, () => {
    const seen = { buses: 0, links: 0, rs: 0, tied: 0, fallback: 0, kinds: {} as Record<string, number> };
    fc.assert(
      fc.property(projectArb, ({ project, pick, link }) => {
        const spec = compileSpec(project);
        const edges = sharedEdges(spec, pick, link);
        const m = buildMatrix(spec, edges, { lowerBound: null, optimal: false, depthLimit: 2, policy: "mixed", method: "heuristic" });
        const v = verifyMatrix(spec, m, { depthLimit: 2, policy: "mixed" });
        expect(v.ok, v.ok ? "" : v.error.join("; ")).toBe(true);
        if (!v.ok) return;
        if (v.value.buses.length > 0) seen.buses++;
        if (v.value.diodes.some((d) => spec.outputs.includes(d.from))) seen.links++;
        if (project.electrical.diode.rs > 0) seen.rs++;
        if (spec.tiedOn.length > 0) seen.tied++;
        const kind = project.electrical.driver.kind;
        seen.kinds[kind] = (seen.kinds[kind] ?? 0) + 1;
        for (let k = 0; k < spec.states.length; k++) {
          const c = buildCircuit(spec, v.value, project.electrical, k);
          const op = solveDc(c, c.guess);
          expect(op.ok, op.ok ? "" : op.error.message).toBe(true);
          if (!op.ok) return;
          if (op.value.method !== "newton") seen.fallback++;
          const fixed = new Set(c.elements.flatMap((e) => (e.kind === "vsource" ? [e.node] : [])));
          for (const [node, r] of kclResiduals(c, op.value)) {
            if (node === "0" || fixed.has(node)) continue;
            expect(Math.abs(r.sum), `state ${spec.states[k]} node ${node}: ${r.sum} A of ${r.scale} A`).toBeLessThanOrEqual(
              1e-9 + 1e-6 * r.scale,
            );
          }
        }
      }),
      { seed: SEED, numRuns: 160 },
    );
    // The runs must have covered shared buses, output links, diode series resistance, tied-on outputs and every kind.
    expect(seen.buses).toBeGreaterThan(10);
    expect(seen.links).toBeGreaterThan(5);
    expect(seen.rs).toBeGreaterThan(10);
    expect(seen.tied).toBeGreaterThan(10);
    for (const k of KINDS) expect(seen.kinds[k], k).toBeGreaterThan(20);
    console.info(`KCL: ${JSON.stringify(seen)} of 160 runs`);
  });
});

/**
 * The same on coded counters' decoders (issue 12): random code tables of 3
 * stages, their two-level decoder (AND gates with pull-ups, OR diodes,
 * direct literals), random gate pull-ups and low-level resistances, every
 * driver kind.
 */
const codedArb = fc
  .record({
    base: projectArb,
    order: fc.shuffledSubarray([0, 1, 2, 3, 4, 5, 6, 7], { minLength: 8, maxLength: 8 }),
    gatePullUp: logUniform(1000, 100_000),
    lowResistance: logUniform(5, 2000),
  })
  .map(({ base, order, gatePullUp, lowResistance }) => {
    const doc = JSON.parse(serializeProject(base.project));
    const states = base.project.counter.states;
    doc.counter = { states, code: "custom", codes: order.slice(0, states).map((c) => c.toString(2).padStart(3, "0")) };
    doc.electrical.gatePullUp = gatePullUp;
    doc.electrical.counterOutput.lowResistance = lowResistance;
    return makeProject2(doc);
  });

describe("Kirchhoff's current law on coded decoders", () => {
  it(`holds at every node of every solved state (seed ${SEED + 1})`, () => {
    const seen = { gates: 0, literals: 0, kinds: {} as Record<string, number> };
    fc.assert(
      fc.property(codedArb, (project) => {
        const { spec, matrix } = codedDecoder(project);
        const v = verifyMatrix(spec, matrix, { depthLimit: 2, policy: "per-segment" });
        expect(v.ok, v.ok ? "" : v.error.join("; ")).toBe(true);
        if (!v.ok) return;
        seen.gates += v.value.gates.length > 0 ? 1 : 0;
        seen.literals += v.value.diodes.some((d) => v.value.lines.includes(d.from)) ? 1 : 0;
        const kind = project.electrical.driver.kind;
        seen.kinds[kind] = (seen.kinds[kind] ?? 0) + 1;
        for (let k = 0; k < spec.states.length; k++) {
          const c = buildCircuit(spec, v.value, project.electrical, k);
          const op = solveDc(c, c.guess);
          expect(op.ok, op.ok ? "" : op.error.message).toBe(true);
          if (!op.ok) return;
          const fixed = new Set(c.elements.flatMap((e) => (e.kind === "vsource" ? [e.node] : [])));
          for (const [node, r] of kclResiduals(c, op.value)) {
            if (node === "0" || fixed.has(node)) continue;
            expect(Math.abs(r.sum), `state ${spec.states[k]} node ${node}: ${r.sum} A of ${r.scale} A`).toBeLessThanOrEqual(
              1e-9 + 1e-6 * r.scale,
            );
          }
        }
      }),
      { seed: SEED + 1, numRuns: 80 },
    );
    expect(seen.gates).toBeGreaterThan(40);
    expect(seen.literals).toBeGreaterThan(10);
    for (const k of KINDS) expect(seen.kinds[k], k).toBeGreaterThan(5);
    console.info(`KCL on coded decoders: ${JSON.stringify(seen)} of 80 runs`);
  });
});
