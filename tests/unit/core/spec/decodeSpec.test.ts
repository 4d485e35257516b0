import { describe, expect, it } from "vitest";
import { compileSpec, decodeSides, litCellCount, outputSide } from "../../../../src/core/spec/decodeSpec.ts";
import { example, makeProject, makeProject2, showing } from "../../../support/projects.ts";

describe("compileSpec", () => {
  it("names states S0.. and outputs <position><segment>", () => {
    const spec = compileSpec(showing([" 1", "12"], 2));
    expect(spec.states).toEqual(["S0", "S1"]);
    expect(spec.allOutputs.slice(0, 3)).toEqual(["1a", "1b", "1c"]);
    expect(spec.allOutputs).toHaveLength(14);
  });

  it("leaves out outputs never lit and ties on outputs lit in every state", () => {
    // " 1" and "12": 1b and 1c are lit only in S1; 2b is lit in both (1: bc, 2: abdeg).
    const spec = compileSpec(showing([" 1", "12"], 2));
    expect(spec.tiedOn).toEqual(["2b"]);
    expect(spec.outputs).toEqual(["1b", "1c", "2a", "2c", "2d", "2e", "2g"]);
    expect(spec.neverLit).toEqual(["1a", "1d", "1e", "1f", "1g", "2f"]);
    expect(spec.lit[0]).toEqual([false, false, false, true, false, false, false]);
    expect(spec.lit[1]).toEqual([true, true, true, false, true, true, true]);
  });

  it("lights the decimal point of a seg7dp position", () => {
    const p = makeProject({ counter: { states: 2 }, display: { positions: 1, cell: "seg7dp" }, show: ["1.", "1"] });
    const spec = compileSpec(p);
    expect(spec.outputs).toEqual(["1dp"]);
    expect(spec.tiedOn).toEqual(["1b", "1c"]);
  });

  it("compiles the die roller on its custom cell", () => {
    const spec = compileSpec(example("die-roller"));
    expect(spec.outputs).toEqual(["1tl", "1tr", "1ml", "1c", "1mr", "1bl", "1br"]);
    expect(litCellCount(spec)).toBe(1 + 2 + 3 + 4 + 5 + 6);
  });
});

describe("compileSpec: the decode polarity", () => {
  const texts = ["0", "1", "7"];
  const project = (drive: string, decode: string) =>
    makeProject2({ counter: { states: 3, drive }, display: {}, show: texts, synthesis: { decode } });

  it("offers S<k> for source drive, nS<k> for sink, both for complementary", () => {
    expect(compileSpec(project("source", "lit")).lines).toEqual(["S0", "S1", "S2"]);
    expect(compileSpec(project("sink", "dark")).lines).toEqual(["nS0", "nS1", "nS2"]);
    expect(compileSpec(project("complementary", "either")).lines).toEqual(["S0", "S1", "S2", "nS0", "nS1", "nS2"]);
  });

  it("carries the dark cells, the complement of the lit ones, and each output's allowed polarity", () => {
    const spec = compileSpec(project("complementary", "either"));
    // 0: abcdef, 1: bc, 7: abc; b and c are tied on.
    expect(spec.outputs).toEqual(["1a", "1d", "1e", "1f"]);
    expect(spec.polarity.dark).toEqual([
      [false, false, false, false],
      [true, true, true, true],
      [false, true, true, true],
    ]);
    expect(spec.polarity.allowed).toEqual(spec.outputs.map(() => ["lit", "dark"]));
    expect(compileSpec(project("sink", "dark")).polarity.allowed).toEqual(spec.outputs.map(() => ["dark"]));
  });

  it("counts the level-shift diodes of a dark-decoded output, none for a divider", () => {
    const spec = compileSpec(project("sink", "dark"));
    expect(spec.polarity.inputDiodes).toBe(spec.polarity.levelShift.diodes);
    expect(spec.polarity.inputDiodes).toBeGreaterThan(0);
    const divider = makeProject2({
      counter: { states: 3, drive: "sink" },
      display: {},
      show: texts,
      synthesis: { decode: "dark", darkInput: "divider" },
    });
    expect(compileSpec(divider).polarity).toMatchObject({ inputDiodes: 0, inputResistors: 2 });
  });
});

describe("the decode polarity of a high-side switch", () => {
  it("marks the spec inverting, allows lit only (either too), no input network, and decodes onto the active-low lines", () => {
    for (const decode of ["lit", "either"] as const) {
      const spec = compileSpec(
        makeProject2({
          counter: { states: 3, drive: "complementary" },
          display: {},
          show: ["1", "7", "8"],
          synthesis: { decode },
          electrical: { preset: "bench-5v-high-side" },
        }),
      );
      expect(spec.polarity.inverting).toBe(true);
      expect(spec.polarity.allowed.every((a) => a.join() === "lit")).toBe(true);
      expect([spec.polarity.inputDiodes, spec.polarity.inputResistors]).toEqual([0, 0]);
      expect([...decodeSides(spec.polarity)]).toEqual(["low"]);
    }
    expect(outputSide("lit", true)).toBe("low");
    expect(outputSide("dark", true)).toBe("high");
    expect([...decodeSides({ decode: "either", inverting: false })].sort()).toEqual(["high", "low"]);
    expect([...decodeSides({ decode: "lit", inverting: false })]).toEqual(["high"]);
  });
});
