import { describe, expect, it } from "vitest";
import { circuitNetlist, segmentLedNode, spiceNetlist, spiceNetlists } from "../../../../src/core/papers/netlist.ts";
import { codedDecoder } from "../../../support/codedProjects.ts";
import { makeProject2 } from "../../../support/projects.ts";
import { buildCircuit } from "../../../../src/core/circuit/circuit.ts";
import { projectDesign, type SegmentDesign } from "../../../../src/core/budget/segmentDesign.ts";
import { sharedDieRoller } from "../../../support/budgetFixtures.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";

describe("spiceNetlist", () => {
  const d = sharedDieRoller();
  const own = projectDesign(d.project.electrical, d.matrix, { mode: "off", series: "E24" });
  const deck = spiceNetlist(d.project, d.spec, d.matrix, 2, own);
  const lines = deck.trimEnd().split("\n");

  it("writes every state's deck in turn from one frame exactly as it writes each alone, with a coded counter's code note", () => {
    const trimmed: SegmentDesign = { ...own, trimmed: true, ohms: new Map([...own.ohms].map(([o, r]) => [o, r * 1.5])) };
    expect([...spiceNetlists(d.project, d.spec, d.matrix, trimmed)]).toEqual(
      d.matrix.states.map((_, k) => spiceNetlist(d.project, d.spec, d.matrix, k, trimmed)),
    );
    const c = codedDecoder(makeProject2({ counter: { states: 10, code: "binary" }, display: {}, show: [..."0123456789"] }));
    const m = { ...c.matrix, verified: true as const };
    const design = projectDesign(c.project.electrical, m);
    const decks = [...spiceNetlists(c.project, c.spec, m, design)];
    expect(decks).toEqual(m.states.map((_, k) => spiceNetlist(c.project, c.spec, m, k, design)));
    expect(decks[3]).toMatch(/^\* Code \S+ \(highest stage leftmost\): high stage lines /m);
  });

  it("is a standard deck: title comment, .model cards, elements, .op, .end", () => {
    expect(lines[0]).toMatch(/^\* Die roller.*state S2 active$/);
    expect(lines.filter((l) => l.startsWith(".model"))).toEqual([
      ".model DMTX D (IS=4e-9 N=1.9 RS=0)",
      ".model QDRV NPN (IS=1e-14 BF=150 BR=3)",
      ".model DLED D (IS=1e-27 N=2)",
    ]);
    expect(lines.slice(-2)).toEqual([".op", ".end"]);
    expect(lines).toContain(".temp 27");
    expect(lines).toContain("VS2 s2_v 0 DC 2.4");
    expect(lines).toContain("VS0 s0_v 0 DC 0");
  });

  it("writes each segment LED by LED from the supply to the collector", () => {
    const dies = lines.filter((l) => l.startsWith("DDS1_"));
    expect(dies).toHaveLength(19);
    expect(dies[0]).toBe(`DDS1_1 vsup ${segmentLedNode("c1tl", 1)} DLED`);
    expect(dies[18]).toBe(`DDS1_19 ${segmentLedNode("c1tl", 18)} c1tl DLED`);
  });

  it("writes a follower's segment from its anode pin to ground, each LED's series resistance in its model card", () => {
    const f = sharedDieRoller({
      preset: "cathode-5v-follower",
      counterOutput: { high: 9 },
      supply: { volts: 9, minVolts: 9, maxVolts: 9 },
      segment: { leds: 2 },
    });
    const deck = spiceNetlist(f.project, f.spec, f.matrix, 0, projectDesign(f.project.electrical, f.matrix)).split("\n");
    expect(deck).toContain(".model DLED D (IS=2e-19 N=2 RS=2)");
    expect(deck).toContain(`DDS1_1 a1tl ${segmentLedNode("a1tl", 1)} DLED`);
    expect(deck).toContain(`DDS1_2 ${segmentLedNode("a1tl", 1)} 0 DLED`);
    expect(deck).toContain("Q1 vsup o1tl e1tl QDRV");
    expect(deck).toContain("R1 e1tl a1tl 110");
  });

  it("writes a switch: base resistor, base-emitter resistor, emitter at ground, series resistor in the collector", () => {
    const f = sharedDieRoller({ preset: "bench-5v-switch" });
    const deck = spiceNetlist(f.project, f.spec, f.matrix, 0, projectDesign(f.project.electrical, f.matrix)).split("\n");
    expect(deck).toContain("Q1 c1tl b1tl 0 QDRV");
    expect(deck).toContain("R1 k1tl c1tl 300");
    expect(deck).toContain("R8 o1tl b1tl 3300");
    expect(deck).toContain("R15 b1tl 0 47000");
    expect(deck).toContain("DDS1_1 vsup k1tl DLED");
    expect(deck).toContain("* Series resistors as in the project (the trim could not be worked out).");
  });

  it("has one element per matrix diode, unique names and no unit suffixes", () => {
    for (const m of d.matrix.diodes) expect(lines.some((l) => l.startsWith(`${m.ref} `))).toBe(true);
    const names = lines.filter((l) => /^[A-Z]/.test(l)).map((l) => l.split(" ")[0]);
    expect(new Set(names).size).toBe(names.length);
    for (const l of lines.filter((x) => /^R/.test(x))) expect(l).toMatch(/ \d+(\.\d+)?(e[+-]?\d+)?$/);
  });

  it("writes the design's emitter resistors and says which they are", () => {
    expect(lines).toContain("* Emitter resistors as in the project (the trim is turned off).");
    expect(lines.filter((l) => /^R\d+ e\S+ 0 /.test(l)).every((l) => l.endsWith(" 10000"))).toBe(true);
    const trim = new Map([...own.ohms].map(([o], i) => [o, i % 2 === 0 ? 6200 : 9100]));
    const design: SegmentDesign = { mode: "auto", series: "E24", role: "emitter", trimmed: true, effect: "improves", ohms: trim };
    const trimmed = spiceNetlist(d.project, d.spec, d.matrix, 2, design);
    expect(trimmed).toMatch(/^\* Emitter resistors: the E24 trim, applied because it /m);
    for (const [o, ohms] of trim) expect(trimmed).toMatch(new RegExp(`^R\\d+ e${o} 0 ${ohms}$`, "m"));
  });

  it("gives distinct parameter sets their own model cards", () => {
    const c = buildCircuit(d.spec, d.matrix, d.project.electrical, 0);
    const odd = { ...c, elements: c.elements.map((e) => (e.kind === "diode" && e.name === "D1" ? { ...e, isA: 1e-8 } : e)) };
    const text = circuitNetlist(odd, "t");
    expect(text).toContain(".model DMTX D (IS=1e-8 N=1.9 RS=0)");
    expect(text).toContain(".model DMTX2 D (IS=4e-9 N=1.9 RS=0)");
    expect(text).toMatch(/^D1 .* DMTX$/m);
    expect(text).toMatch(/^D2 .* DMTX2$/m);
  });
});

/**
 * Every node of a deck but ground, with the elements whose terminals meet
 * it (a segment written LED by LED counts each LED).
 */
function nodeUse(deck: string): Map<string, string[]> {
  const use = new Map<string, string[]>();
  for (const line of deck.split("\n")) {
    if (!/^[VRDQ]/.test(line)) continue;
    const f = line.split(" ");
    const name = f[0] as string;
    const terminals = name.startsWith("Q") ? f.slice(1, 4) : f.slice(1, 3);
    for (const n of terminals) if (n !== "0") use.set(n, [...(use.get(n) ?? []), name]);
  }
  return use;
}

describe("spiceNetlist writes only what is wired", () => {
  const cases = [
    // The quiz scoreboard's drive: a sink-drive ring (active-low lines only) through PNP high-side switches.
    { name: "sink drive, high-side switches", drive: "sink", show: [..."0123456789"], decode: "lit", preset: "bench-5v-high-side" },
    {
      name: "sink drive, decoded dark onto NPN switches",
      drive: "sink",
      show: [..."0123456789"],
      decode: "dark",
      preset: "bench-5v-switch",
    },
    {
      name: "complementary drive, every output decoded dark",
      drive: "complementary",
      show: [..."0123"],
      decode: "dark",
      preset: "bench-5v-switch",
    },
    { name: "source drive, a state that lights nothing", drive: "source", show: ["1", " ", "7"], decode: "lit", preset: "bench-5v-switch" },
  ] as const;
  for (const c of cases) {
    it(`${c.name}: no source or resistor of a line no diode meets, no node met by one terminal only`, async () => {
      const project = makeProject2({
        counter: { states: c.show.length, drive: c.drive },
        display: { positions: 1, cell: "seg7" },
        show: c.show,
        synthesis: { decode: c.decode },
        electrical: { preset: c.preset },
      });
      const spec = compileSpec(project);
      const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
      if (!r.ok) throw new Error(r.error.message);
      const matrix = r.value;
      const met = new Set(matrix.diodes.flatMap((x) => [x.from, x.to]));
      const unwired = [...matrix.states, ...spec.polarity.activeLow].filter((l) => !met.has(l));
      expect(unwired.length, "the case has a line no diode meets").toBeGreaterThan(0);
      const design = projectDesign(project.electrical, matrix);
      for (const deck of spiceNetlists(project, spec, matrix, design)) {
        for (const l of unwired) expect(deck).not.toMatch(new RegExp(`^[VR]${l} |\\b${l.toLowerCase()}(_v)?\\b`, "m"));
        for (const [node, by] of nodeUse(deck)) expect(by.length, `${node} is met only by ${by.join(", ")}`).toBeGreaterThan(1);
      }
    });
  }
});
