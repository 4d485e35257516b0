import { describe, expect, it } from "vitest";
import {
  binaryCodes,
  binaryStages,
  counterCode,
  johnsonCodes,
  literalHigh,
  literalName,
  literalOf,
  stageBit,
  stageLines,
} from "../../../../src/core/spec/counterCode.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { makeProject } from "../../../support/projects.ts";

describe("counter codes", () => {
  it("counts a 5-stage Johnson counter as the specification writes it (Q4 leftmost)", () => {
    // The sequence given in the specification of coded counters (issue 12), which is also the
    // textbook twisted ring: see docs/sources.md, "Johnson (twisted-ring) counters".
    expect(johnsonCodes(10)).toEqual(["00000", "00001", "00011", "00111", "01111", "11111", "11110", "11100", "11000", "10000"]);
    expect(johnsonCodes(2)).toEqual(["0", "1"]);
    expect(() => johnsonCodes(7)).toThrow(RangeError);
  });

  it("gives state k the code k in binary, ceil(log2 N) stages (BCD for N = 10)", () => {
    expect(binaryStages(2)).toBe(1);
    expect(binaryStages(10)).toBe(4);
    expect(binaryStages(16)).toBe(4);
    expect(binaryStages(17)).toBe(5);
    expect(binaryStages(256)).toBe(8);
    const bcd = binaryCodes(10);
    expect(bcd[0]).toBe("0000");
    expect(bcd[9]).toBe("1001");
    bcd.forEach((c, k) => expect(parseInt(c, 2)).toBe(k));
  });

  it("reads stage i from the right end of the code, Q0 the least significant", () => {
    expect(stageBit("0010", 1)).toBe(true);
    expect(stageBit("0010", 0)).toBe(false);
    expect(stageBit("1000", 3)).toBe(true);
    expect(literalHigh({ stage: 1, high: false }, "0010")).toBe(false);
    expect(literalHigh({ stage: 0, high: false }, "0010")).toBe(true);
  });

  it("names the stage lines Q<i> and nQ<i>, stage by stage", () => {
    expect(stageLines(2)).toEqual(["Q0", "nQ0", "Q1", "nQ1"]);
    expect(literalName({ stage: 12, high: false })).toBe("nQ12");
    expect(literalOf("nQ3")).toEqual({ stage: 3, high: false });
    expect(literalOf("Q0")).toEqual({ stage: 0, high: true });
    expect(literalOf("S3")).toBeUndefined();
  });

  it("takes a custom table as given", () => {
    const gray = ["00", "01", "11", "10"];
    expect(counterCode({ states: 4, drive: "source", code: "custom", codes: gray })).toEqual({ kind: "custom", stages: 2, codes: gray });
    expect(counterCode({ states: 4, drive: "source", code: "one-hot", codes: [] })).toEqual({ kind: "one-hot", stages: 0, codes: [] });
  });

  it("gives a coded spec the stage lines and a one-hot spec its state lines", () => {
    const coded = compileSpec(makeProject({ counter: { states: 6, code: "johnson" }, display: {}, show: ["0", "1", "2", "3", "4", "5"] }));
    expect(coded.counter.stages).toBe(3);
    expect(coded.lines).toEqual(["Q0", "nQ0", "Q1", "nQ1", "Q2", "nQ2"]);
    expect(coded.states).toEqual(["S0", "S1", "S2", "S3", "S4", "S5"]);
    const ring = compileSpec(makeProject({ counter: { states: 2 }, display: {}, show: ["0", "1"] }));
    expect(ring.counter.kind).toBe("one-hot");
    expect(ring.lines).toEqual(["S0", "S1"]);
  });
});
