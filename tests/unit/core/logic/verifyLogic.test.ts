import { describe, expect, it } from "vitest";
import { verifyLogic } from "../../../../src/core/logic/verifyLogic.ts";
import { verifyMatrix } from "../../../../src/core/matrix/verify.ts";
import type { DiodeMatrix } from "../../../../src/core/matrix/matrix.ts";
import { codedProject, specOf } from "../../../support/codedProjects.ts";

// 0-3 on a 2-stage binary counter: 0 abcdef, 1 bc, 2 abdeg, 3 abcdg. Hand-made decoder:
//   a = nQ0 + Q1, b tied on, c = nQ1 + Q0, d = a, e = nQ0, f = G1 (nQ0·nQ1), g = Q1.
const spec = specOf(codedProject("binary", "0123"));
const limits = { depthLimit: 2, policy: "per-segment" as const };
const good: DiodeMatrix = {
  schema: "diodeloom/matrix@3",
  states: ["S0", "S1", "S2", "S3"],
  codes: ["00", "01", "10", "11"],
  lines: ["Q0", "nQ0", "Q1", "nQ1"],
  gates: [{ ref: "G1", inputs: ["nQ0", "nQ1"] }],
  outputs: spec.outputs,
  buses: [],
  diodes: [
    ["G1", "nQ0"],
    ["G1", "nQ1"],
    ["G1", "1f"],
    ["Q0", "1c"],
    ["nQ0", "1a"],
    ["nQ0", "1d"],
    ["nQ0", "1e"],
    ["Q1", "1a"],
    ["Q1", "1d"],
    ["Q1", "1g"],
    ["nQ1", "1c"],
  ].map(([from, to], i) => ({ ref: `D${i + 1}`, from: from as string, to: to as string })),
  tiedOn: ["1b"],
  count: 11,
  lowerBound: null,
  optimal: false,
  longestPath: 1,
  depthLimit: 2,
  policy: "per-segment",
  method: "heuristic",
  deadlineHit: false,
};
const withDiodes = (diodes: [string, string][]): DiodeMatrix => ({
  ...good,
  diodes: diodes.map(([from, to], i) => ({ ref: `D${i + 1}`, from, to })),
  count: diodes.length,
});
const pairs = good.diodes.map((d): [string, string] => [d.from, d.to]);
const errorsOf = (m: DiodeMatrix): string[] => {
  const r = verifyLogic(spec, m, limits);
  return r.ok ? [] : r.error;
};

describe("verifyLogic", () => {
  it("accepts a correct hand-made decoder, and verifyMatrix sends coded specs to it", () => {
    expect(spec.outputs).toEqual(["1a", "1c", "1d", "1e", "1f", "1g"]);
    expect(errorsOf(good)).toEqual([]);
    expect(verifyMatrix(spec, good, limits).ok).toBe(true);
  });

  it("finds an output left dark in a state", () => {
    expect(errorsOf(withDiodes(pairs.filter(([f, t]) => !(f === "Q0" && t === "1c"))))).toEqual([
      'state S3 (code 11, "3") does not light 1c',
    ]);
  });

  it("finds an output lit in a wrong state (a sneak path)", () => {
    expect(errorsOf(withDiodes([...pairs, ["Q0", "1e"]]))).toEqual([
      'state S1 (code 01, "1") also lights 1e',
      'state S3 (code 11, "3") also lights 1e',
    ]);
  });

  it("refuses a gate whose diodes do not match its inputs, and a diode into a gate", () => {
    expect(errorsOf(withDiodes(pairs.filter(([f, t]) => !(f === "G1" && t === "nQ1"))))).toContain(
      "gate G1 lists inputs nQ0, nQ1 but has diodes to nQ0",
    );
    expect(errorsOf(withDiodes([...pairs, ["Q1", "G1"]]))).toContain("D12 drives gate G1; a gate's node is raised only by its pull-up");
    expect(errorsOf(withDiodes([...pairs, ["1a", "nQ1"]]))).toContain(
      "D12 drives stage line nQ1 from 1a, which is not a gate with that input",
    );
  });

  it("refuses a gate of one stage twice or of a single input", () => {
    expect(errorsOf({ ...good, gates: [{ ref: "G1", inputs: ["nQ0", "Q0"] }] })).toContain("gate G1 uses stage 0 twice");
    expect(errorsOf({ ...good, gates: [{ ref: "G1", inputs: ["nQ0"] }] })).toContain(
      "gate G1 has 1 input(s); a gate ANDs two or more stage lines",
    );
  });

  it("checks the depth and the policy on OR paths, and finds loops", () => {
    const linked = withDiodes([...pairs.filter(([f, t]) => !(t === "1d")), ["1a", "1d"]]);
    expect(errorsOf({ ...linked, longestPath: 2 })).toEqual([]);
    expect(verifyLogic(spec, { ...linked, longestPath: 2 }, { depthLimit: 1, policy: "mixed" }).ok).toBe(false);
    const mixed = withDiodes([...pairs.filter(([f, t]) => !(f === "Q1" && t === "1d")), ["1a", "1d"]]);
    expect(errorsOf({ ...mixed, longestPath: 2 })).toContain(
      "output 1d is reached through paths of 1 and 2 diodes; the per-segment policy wants one length",
    );
    const loop = withDiodes([...pairs, ["1a", "1g"], ["1g", "1a"]]);
    expect(errorsOf(loop)[0]).toMatch(/^the OR diodes form a loop through/);
  });

  it("holds the bound to the count", () => {
    expect(errorsOf({ ...good, lowerBound: 12 })).toEqual(["lower bound 12 exceeds the count 11"]);
    expect(errorsOf({ ...good, lowerBound: 10, optimal: true })).toEqual(["marked optimal but the lower bound does not equal the count"]);
  });

  it("checks the code table and the lines against the spec", () => {
    expect(errorsOf({ ...good, codes: ["00", "01", "11", "10"] })).toEqual(["the matrix's codes differ from the counter's code table"]);
    expect(errorsOf({ ...good, lines: ["S0", "S1", "S2", "S3"] })).toEqual(["the matrix's stage lines differ from the counter's"]);
  });
});
