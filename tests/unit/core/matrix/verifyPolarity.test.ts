import { describe, expect, it } from "vitest";
import { MATRIX_SCHEMA, type Diode, type DiodeMatrix } from "../../../../src/core/matrix/matrix.ts";
import { verifyMatrix } from "../../../../src/core/matrix/verify.ts";
import type { OutputPolarity } from "../../../../src/core/spec/decodeSpec.ts";
import { litRows } from "../../../support/litSpec.ts";
import { polaritySpec } from "../../../support/polaritySpec.ts";

// Output 1o0 is lit in S0 and S2 (dark in S1); 1o1 is lit in S1 and S2 (dark in S0).
const LIT = litRows("10", "01", "11");
const LIMITS = { depthLimit: 2, policy: "mixed" as const };

function matrix(
  spec: ReturnType<typeof polaritySpec>,
  pairs: readonly (readonly [string, string])[],
  decode: Readonly<Record<string, OutputPolarity>>,
  extra: Partial<DiodeMatrix> = {},
): DiodeMatrix {
  const diodes: Diode[] = pairs.map(([from, to], i) => ({ ref: `D${i + 1}`, from, to }));
  const dark = Object.values(decode).filter((d) => d === "dark").length;
  const per = spec.polarity.inputDiodes ?? 0;
  return {
    schema: MATRIX_SCHEMA,
    states: spec.states,
    codes: [],
    lines: spec.lines,
    gates: [],
    outputs: spec.outputs,
    buses: [],
    diodes,
    tiedOn: spec.tiedOn,
    count: diodes.length,
    decode,
    ...(dark > 0 ? { inputNetwork: { kind: "level-shift" as const, outputs: dark, diodes: per * dark, resistors: 0 } } : {}),
    lowerBound: null,
    optimal: false,
    longestPath: 1,
    depthLimit: 2,
    policy: "mixed",
    method: "heuristic",
    deadlineHit: false,
    ...extra,
  };
}

describe("verifyPolarity: both directions", () => {
  it("proves a dark-decoded matrix: each output pulled down to the active-low line of its dark state", () => {
    const spec = polaritySpec(LIT, "dark", 2);
    const m = matrix(
      spec,
      [
        ["nS1", "1o0"],
        ["nS0", "1o1"],
      ],
      { "1o0": "dark", "1o1": "dark" },
    );
    const v = verifyMatrix(spec, m, LIMITS);
    expect(v.ok ? [] : v.error).toEqual([]);
  });

  it("proves a mixed matrix: 1o0 raised from S0 and S2, 1o1 pulled down to nS0", () => {
    const spec = polaritySpec(LIT, "either", 2);
    const m = matrix(
      spec,
      [
        ["S0", "1o0"],
        ["S2", "1o0"],
        ["nS0", "1o1"],
      ],
      { "1o0": "lit", "1o1": "dark" },
    );
    expect(verifyMatrix(spec, m, LIMITS).ok).toBe(true);
  });

  it("finds a dark-side sneak path: nS0 also pulls down 1o0, which state 0 lights", () => {
    const spec = polaritySpec(LIT, "dark", 0);
    const m = matrix(
      spec,
      [
        ["nS1", "1o0"],
        ["nS0", "1o1"],
        ["nS0", "1o0"],
      ],
      { "1o0": "dark", "1o1": "dark" },
    );
    const v = verifyMatrix(spec, m, LIMITS);
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.error).toContain('state S0 ("t0") also pulls 1o0 down to nS0 through a sneak path, so they would stay dark');
  });

  it("finds a dark output left unpulled in its dark state", () => {
    const spec = polaritySpec(LIT, "dark", 0);
    const m = matrix(spec, [["nS0", "1o1"]], { "1o0": "dark", "1o1": "dark" });
    const v = verifyMatrix(spec, m, LIMITS);
    expect(!v.ok && v.error).toContain('state S1 ("t1") does not pull 1o0 down to nS1, so they would light');
  });

  it("names a diode that joins the lit side to the dark side", () => {
    const spec = polaritySpec(LIT, "either", 0);
    // 1o1 (dark) is down only in S0, where 1o0 is lit: the link does not spoil exactness, but joins the sides.
    const m = matrix(
      spec,
      [
        ["S0", "1o0"],
        ["S2", "1o0"],
        ["nS0", "1o1"],
        ["1o0", "1o1"],
      ],
      { "1o0": "lit", "1o1": "dark" },
    );
    const v = verifyMatrix(spec, m, LIMITS);
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.error.some((e) => e.startsWith("D4 joins the lit side (1o0) to the dark side (1o1)"))).toBe(true);
  });

  it("refuses a polarity the spec does not allow, and an input network that does not follow the decode", () => {
    const spec = polaritySpec(LIT, "dark", 2);
    const m = matrix(
      spec,
      [
        ["S0", "1o0"],
        ["S2", "1o0"],
        ["nS0", "1o1"],
      ],
      { "1o0": "lit", "1o1": "dark" },
    );
    const v = verifyMatrix(spec, m, LIMITS);
    expect(!v.ok && v.error).toContain('output 1o0 is decoded lit, which "decode": "dark" does not allow');
    const wrongNet = matrix(
      spec,
      [
        ["nS1", "1o0"],
        ["nS0", "1o1"],
      ],
      { "1o0": "dark", "1o1": "dark" },
      {
        inputNetwork: { kind: "level-shift", outputs: 2, diodes: 2, resistors: 0 },
      },
    );
    const w = verifyMatrix(spec, wrongNet, LIMITS);
    expect(!w.ok && w.error).toContain("the input network has 2 diodes, 2 dark outputs need 4");
  });

  it("holds the bound to the matrix's diodes plus the input network's", () => {
    const spec = polaritySpec(LIT, "dark", 2);
    const ok = matrix(
      spec,
      [
        ["nS1", "1o0"],
        ["nS0", "1o1"],
      ],
      { "1o0": "dark", "1o1": "dark" },
      { lowerBound: 6, optimal: true },
    );
    expect(verifyMatrix(spec, ok, LIMITS).ok).toBe(true);
    const over = matrix(
      spec,
      [
        ["nS1", "1o0"],
        ["nS0", "1o1"],
      ],
      { "1o0": "dark", "1o1": "dark" },
      { lowerBound: 7 },
    );
    const v = verifyMatrix(spec, over, LIMITS);
    expect(!v.ok && v.error).toContain("lower bound 7 exceeds the diodes counted, 6");
  });
});

describe("verifyPolarity: a high-side switch, on while its node is pulled low", () => {
  /** The spec of a high-side switch: lit cells decoded onto the active-low lines, no input network. */
  const highSide = () => {
    const s = polaritySpec(LIT, "lit", 0);
    return { ...s, polarity: { ...s.polarity, inverting: true, allowed: s.outputs.map(() => ["lit"] as const) } };
  };
  const LIT_ON_LOW = [
    ["nS0", "1o0"],
    ["nS2", "1o0"],
    ["nS1", "1o1"],
    ["nS2", "1o1"],
  ] as const;

  it("proves lit cells pulled down to the active-low line of each state that lights them", () => {
    const spec = highSide();
    const v = verifyMatrix(spec, matrix(spec, LIT_ON_LOW, { "1o0": "lit", "1o1": "lit" }), LIMITS);
    expect(v.ok ? [] : v.error).toEqual([]);
  });

  it("finds a lit cell left unpulled (the segment would stay dark) and a sneak pull (it would light)", () => {
    const spec = highSide();
    const missing = verifyMatrix(spec, matrix(spec, LIT_ON_LOW.slice(1), { "1o0": "lit", "1o1": "lit" }), LIMITS);
    expect(!missing.ok && missing.error).toContain('state S0 ("t0") does not pull 1o0 down to nS0, so they would stay dark');
    const sneak = verifyMatrix(spec, matrix(spec, [...LIT_ON_LOW, ["nS1", "1o0"]], { "1o0": "lit", "1o1": "lit" }), LIMITS);
    expect(!sneak.ok && sneak.error).toContain('state S1 ("t1") also pulls 1o0 down to nS1 through a sneak path, so they would light');
  });

  it("refuses lit cells raised from the active-high lines, and an input network, for a high-side switch", () => {
    const spec = highSide();
    const raised = verifyMatrix(
      spec,
      matrix(spec, [["S0", "1o0"], ["S2", "1o0"], ...LIT_ON_LOW.slice(2)], { "1o0": "lit", "1o1": "lit" }),
      LIMITS,
    );
    expect(raised.ok).toBe(false);
    if (!raised.ok)
      expect(raised.error.some((e) => e.startsWith("D1 joins the active-high side (S0) to the active-low side (1o0)"))).toBe(true);
    const networked = verifyMatrix(
      spec,
      matrix(
        spec,
        LIT_ON_LOW,
        { "1o0": "lit", "1o1": "lit" },
        { inputNetwork: { kind: "level-shift", outputs: 2, diodes: 4, resistors: 0 } },
      ),
      LIMITS,
    );
    expect(!networked.ok && networked.error).toContain("no output is decoded dark, yet the matrix lists an input network");
  });
});
