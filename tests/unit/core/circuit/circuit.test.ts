import { describe, expect, it } from "vitest";
import { buildCircuit, circuitFrame, lineNode, stateCircuit } from "../../../../src/core/circuit/circuit.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { designators } from "../../../../src/core/matrix/designators.ts";
import { countParts } from "../../../../src/core/papers/parts.ts";
import { directDesign, sharedDieRoller } from "../../../support/budgetFixtures.ts";
import { showing, showingWith } from "../../../support/projects.ts";

describe("buildCircuit", () => {
  it("builds the parts every state shares once: a frame's states differ only in the counter lines' sources", () => {
    const d = sharedDieRoller();
    const e = d.project.electrical;
    const frame = circuitFrame(d.spec, d.matrix, e);
    const lines = d.matrix.states.length;
    const circuits = d.matrix.states.map((_, k) => stateCircuit(frame, k));
    circuits.forEach((c, k) => {
      expect(c).toEqual(buildCircuit(d.spec, d.matrix, e, k));
      // Two elements per counter line (its source and its resistor), then the shared parts, the same objects.
      expect(c.elements.slice(0, 2 * lines).map((x) => x.name)).toEqual(d.matrix.states.flatMap((s) => [`V${s}`, `R${s}`]));
      c.elements.slice(2 * lines).forEach((x, i) => expect(x).toBe(circuits[0]?.elements[2 * lines + i]));
      expect(c.drivers).toBe(frame.drivers);
      expect(c.nodes).toBe(frame.nodes);
    });
    expect(() => stateCircuit(frame, lines)).toThrow(RangeError);
  });

  it("drives the active counter line high and the others low, each behind its source resistance", () => {
    const d = sharedDieRoller();
    const c = buildCircuit(d.spec, d.matrix, d.project.electrical, 3);
    const sources = c.elements.filter((e) => e.kind === "vsource" && /^VS\d+$/.test(e.name));
    expect(sources.map((s) => (s.kind === "vsource" ? s.volts : NaN))).toEqual([0, 0, 0, 2.4, 0, 0]);
    const rs = c.elements.filter((e) => e.kind === "resistor" && e.role === "counter");
    expect(rs).toHaveLength(6);
    expect(rs.every((r) => r.kind === "resistor" && r.ohms === 1000)).toBe(true);
    expect(c.state).toBe("S3");
  });

  it("follows the matrix: anode = from, cathode = to, buses and links included", () => {
    const d = sharedDieRoller();
    const c = buildCircuit(d.spec, d.matrix, d.project.electrical, 0);
    const diodes = c.elements.filter((e) => e.kind === "diode");
    expect(diodes).toHaveLength(d.matrix.count);
    const outs = new Set(d.matrix.outputs);
    for (const m of d.matrix.diodes) {
      const el = diodes.find((e) => e.name === m.ref);
      expect(el && el.kind === "diode" && [el.anode, el.cathode]).toEqual([lineNode(m.from, outs), lineNode(m.to, outs)]);
    }
    expect(c.nodes).toContain("b1");
    expect(diodes.some((e) => e.kind === "diode" && e.anode === "o1tl" && e.cathode === "o1br")).toBe(true);
  });

  it("gives every driven output (a format-1 sink) a pull-down, NPN, emitter resistor and segment; tied-on ones a resistor from the logic supply", () => {
    // " 1" / "12": 2b is lit in both states, so tied on; the rest of "1" and "2" is driven.
    const p = showing([" 1", "12"], 2);
    const d = directDesign("tied", p);
    const c = buildCircuit(d.spec, d.matrix, p.electrical, 0);
    expect(d.spec.tiedOn).toEqual(["2b"]);
    const tie = c.elements.find((e) => e.kind === "resistor" && e.role === "tie-on");
    expect(tie && tie.kind === "resistor" && [tie.a, tie.b, tie.ohms]).toEqual(["vlogic", "o2b", 1000]);
    // Format 1's tie-on came from the counter's high level: the logic supply keeps that voltage.
    const logic = c.elements.find((e) => e.name === "VLOGIC");
    expect(logic && logic.kind === "vsource" && logic.volts).toBe(2.4);
    const driven = [...d.spec.outputs, ...d.spec.tiedOn];
    expect(c.drivers.map((x) => x.output)).toEqual(d.spec.allOutputs.filter((o) => driven.includes(o)));
    expect(c.drivers.find((x) => x.output === "2b")?.tiedOn).toBe(true);
    for (const dr of c.drivers) {
      const q = c.elements.find((e) => e.name === dr.transistor);
      expect(q && q.kind === "npn" && [q.collector, q.base, q.emitter]).toEqual([dr.collectorNode, dr.baseNode, dr.emitterNode]);
      expect(dr.baseNode).toBe(dr.inputNode);
      const s = c.elements.find((e) => e.name === dr.display);
      expect(s && s.kind === "segment" && [s.anode, s.cathode, s.leds, s.rsOhms]).toEqual(["vsup", dr.collectorNode, 19, 0]);
      expect(c.elements.some((e) => e.kind === "resistor" && e.role === "pull-down" && e.a === dr.inputNode)).toBe(true);
    }
    // Never-lit outputs have no driver.
    for (const o of d.spec.neverLit) expect(c.nodes).not.toContain(`o${o}`);
  });

  it("builds a low-side switch: base resistor from the line, base-emitter resistor, emitter at ground, segment and series resistor from the supply", () => {
    const p = showingWith(["1", "7"], { preset: "bench-5v-switch" });
    const d = directDesign("switch", p);
    const c = buildCircuit(d.spec, d.matrix, p.electrical, 0);
    const e = p.electrical;
    for (const dr of c.drivers) {
      const o = dr.output;
      const at = (name: string | undefined) => c.elements.find((x) => x.name === name);
      const q = at(dr.transistor ?? undefined);
      expect(q && q.kind === "npn" && [q.collector, q.base, q.emitter]).toEqual([`c${o}`, `b${o}`, "0"]);
      const rb = at(dr.base?.ref);
      expect(rb && rb.kind === "resistor" && [rb.a, rb.b, rb.ohms, rb.role]).toEqual([`o${o}`, `b${o}`, e.driver.baseResistor, "base"]);
      const rbe = at(dr.baseEmitter?.ref);
      expect(rbe && rbe.kind === "resistor" && [rbe.a, rbe.b, rbe.ohms]).toEqual([`b${o}`, "0", 47_000]);
      const rs = at(dr.series?.ref);
      expect(rs && rs.kind === "resistor" && [rs.a, rs.b, rs.ohms, rs.role]).toEqual([`k${o}`, `c${o}`, 300, "series"]);
      const seg = at(dr.display);
      expect(seg && seg.kind === "segment" && [seg.anode, seg.cathode, seg.leds, seg.rsOhms]).toEqual(["vsup", `k${o}`, 1, 2]);
    }
  });

  it("builds an emitter follower: collector on the supply, base on the line, series resistor and segment from the emitter to ground", () => {
    const p = showingWith(["1", "7"], { preset: "cathode-5v-follower" });
    const d = directDesign("follower", p);
    const c = buildCircuit(d.spec, d.matrix, p.electrical, 0);
    for (const dr of c.drivers) {
      const o = dr.output;
      const q = c.elements.find((x) => x.name === dr.transistor);
      expect(q && q.kind === "npn" && [q.collector, q.base, q.emitter]).toEqual(["vsup", `o${o}`, `e${o}`]);
      const rs = c.elements.find((x) => x.name === dr.series?.ref);
      expect(rs && rs.kind === "resistor" && [rs.a, rs.b, rs.ohms]).toEqual([`e${o}`, `a${o}`, 110]);
      const seg = c.elements.find((x) => x.name === dr.display);
      expect(seg && seg.kind === "segment" && [seg.anode, seg.cathode]).toEqual([`a${o}`, "0"]);
    }
    const withRb = showingWith(["1", "7"], { preset: "cathode-5v-follower", driver: { baseResistor: 1000 } });
    const c2 = buildCircuit(d.spec, d.matrix, withRb.electrical, 0);
    const q2 = c2.elements.find((x) => x.kind === "npn");
    expect(q2 && q2.kind === "npn" && q2.base).toMatch(/^b1/);
  });

  it("builds direct drive: no transistor and no segment supply, the line through the series resistor and the segment to ground", () => {
    const p = showingWith(["1", "7"], { preset: "line-direct" });
    const d = directDesign("direct", p);
    const c = buildCircuit(d.spec, d.matrix, p.electrical, 0);
    expect(c.elements.some((x) => x.kind === "npn")).toBe(false);
    expect(c.elements.some((x) => x.name === "VSUP")).toBe(false);
    expect(c.nodes).not.toContain("vsup");
    for (const dr of c.drivers) {
      const rs = c.elements.find((x) => x.name === dr.series?.ref);
      expect(rs && rs.kind === "resistor" && [rs.a, rs.b, rs.ohms]).toEqual([`o${dr.output}`, `a${dr.output}`, 820]);
      const seg = c.elements.find((x) => x.name === dr.display);
      expect(seg && seg.kind === "segment" && [seg.anode, seg.cathode]).toEqual([`a${dr.output}`, "0"]);
    }
  });

  it("names parts as the parts count does", () => {
    const p = showing([" 1", "12"], 2);
    const d = directDesign("tied", p);
    const c = buildCircuit(d.spec, d.matrix, p.electrical, 1);
    const groups = countParts(designators(compileSpec(p), d.matrix, p.electrical));
    const names = new Set(c.elements.map((e) => e.name));
    for (const g of groups) {
      if (
        g.kind === "display" ||
        g.kind === "transistor" ||
        g.kind === "emitter-resistor" ||
        g.kind === "pull-down" ||
        g.kind === "tie-on-resistor" ||
        g.kind === "diode"
      ) {
        for (const r of g.refs) expect(names.has(r), `${g.kind} ${r}`).toBe(true);
      }
    }
  });

  it("takes each emitter resistor from the designators: the design, then the project's overrides, then the default", () => {
    const p = showing(["1", "7"], 1, { electrical: { driver: { emitterResistors: { "1a": 8200 } } } });
    const d = directDesign("1 7", p);
    const ohms = (c: ReturnType<typeof buildCircuit>, o: string): number => {
      const el = c.elements.find((e) => e.kind === "resistor" && e.role === "emitter" && e.a === `e${o}`);
      return el && el.kind === "resistor" ? el.ohms : NaN;
    };
    const plain = buildCircuit(d.spec, d.matrix, p.electrical, 0);
    expect([ohms(plain, "1a"), ohms(plain, "1b")]).toEqual([8200, 10_000]);
    const trimmed = buildCircuit(d.spec, d.matrix, p.electrical, 0, new Map([["1a", 9100]]));
    expect([ohms(trimmed, "1a"), ohms(trimmed, "1b")]).toEqual([9100, 10_000]);
  });

  it("rejects a state outside the counter", () => {
    const d = sharedDieRoller();
    expect(() => buildCircuit(d.spec, d.matrix, d.project.electrical, 6)).toThrow(RangeError);
  });
});
