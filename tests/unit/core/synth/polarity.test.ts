/**
 * The decode polarity on the reference figures: the specification of the
 * decode polarity lists the minimum matrices (matrix diodes only, depth 2,
 * buses and links) measured with an independent exact model (docs/sources.md
 * "Diode logic and matrices"). With a divider as the input network no diode
 * is added, so the objective is the matrix count and must equal them.
 */
import { describe, expect, it } from "vitest";
import { matrixObjective } from "../../../../src/core/matrix/matrix.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { makeProject2 } from "../../../support/projects.ts";

const HEX = { A: "abcefg", B: "cdefg", C: "adef", D: "bcdeg", E: "adefg", F: "aefg" };
const shows = { "0-5": [..."012345"], "0-9": [..."0123456789"], "0-F": [..."0123456789ABCDEF"] } as const;

function project(which: keyof typeof shows, policy: string, decode: string, darkInput = "divider") {
  const show = shows[which];
  return makeProject2({
    counter: { states: show.length, drive: "complementary" },
    display: {},
    glyphs: which === "0-F" ? HEX : {},
    show,
    synthesis: { depth: policy, decode, darkInput, maxDepth: 2, timeLimitMs: 20_000 },
  });
}

async function run(which: keyof typeof shows, policy: string, decode: string, darkInput = "divider") {
  const p = project(which, policy, decode, darkInput);
  const r = await synthesize(compileSpec(p), synthSettings(p));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return r.value;
}

const table: readonly [keyof typeof shows, string, number, number, number][] = [
  ["0-5", "mixed", 21, 13, 12],
  ["0-5", "per-segment", 21, 14, 12],
  ["0-9", "mixed", 33, 19, 18],
  ["0-9", "per-segment", 34, 20, 19],
];

describe("synthesize with dark-decoded outputs: the reference figures", () => {
  for (const [which, policy, lit, dark, either] of table) {
    it(`${which} ${policy}: lit ${lit}, dark ${dark}, either ${either}, each proven`, async () => {
      for (const [decode, want] of [
        ["lit", lit],
        ["dark", dark],
        ["either", either],
      ] as const) {
        const m = await run(which, policy, decode);
        expect(m.count, decode).toBe(want);
        expect(m.optimal, decode).toBe(true);
        expect(m.inputNetwork?.diodes ?? 0).toBe(0);
      }
    }, 60_000);
  }

  it("0-F mixed dark: 31, proven", async () => {
    const m = await run("0-F", "mixed", "dark");
    expect([m.count, m.optimal]).toEqual([31, true]);
  }, 60_000);

  it("counts the level-shift diodes in the objective: either then weighs each output's two extra diodes (0-9 mixed, 5 V preset)", async () => {
    const dark = await run("0-9", "mixed", "dark", "level-shift");
    expect([dark.count, dark.inputNetwork?.diodes, matrixObjective(dark)]).toEqual([19, 14, 33]);
    const either = await run("0-9", "mixed", "either", "level-shift");
    expect(matrixObjective(either)).toBe(29);
    expect(either.optimal).toBe(true);
    const darkOutputs = Object.values(either.decode ?? {}).filter((d) => d === "dark").length;
    expect(either.inputNetwork).toEqual({ kind: "level-shift", outputs: darkOutputs, diodes: 2 * darkOutputs, resistors: 0 });
  }, 60_000);
});

describe("synthesize for a high-side switch: lit cells onto the active-low lines", () => {
  async function highSide(which: keyof typeof shows, policy: string, decode: string, drive: string) {
    const show = shows[which];
    const p = makeProject2({
      counter: { states: show.length, drive },
      display: {},
      show,
      synthesis: { depth: policy, decode, maxDepth: 2, timeLimitMs: 20_000 },
      electrical: { preset: "bench-5v-high-side" },
    });
    const r = await synthesize(compileSpec(p), synthSettings(p));
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    return r.value;
  }

  // The lit decode's reference figures (the table above): turned round onto the nS lines, the covering problem is the same.
  for (const [which, policy, lit] of [
    ["0-5", "mixed", 21],
    ["0-9", "mixed", 33],
  ] as const) {
    it(`${which} ${policy} on a sink-drive counter: ${lit}, proven, every diode from an nS line, bus or output, no input network; either is the same`, async () => {
      for (const [decode, drive] of [
        ["lit", "sink"],
        ["either", "sink"],
        ["lit", "complementary"],
      ] as const) {
        const m = await highSide(which, policy, decode, drive);
        expect([m.count, m.optimal], `${decode}/${drive}`).toEqual([lit, true]);
        expect(m.inputNetwork).toBeUndefined();
        expect(Object.values(m.decode ?? {}).every((d) => d === "lit")).toBe(true);
        expect(m.diodes.every((d) => !/^S\d+$/.test(d.from))).toBe(true);
        expect(m.diodes.some((d) => /^nS\d+$/.test(d.from))).toBe(true);
      }
    }, 60_000);
  }
});
