import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { buildMatrix } from "../../../../src/core/matrix/matrix.ts";
import { example } from "../../../support/projects.ts";

const spec = compileSpec(example("die-roller"));
const meta = { lowerBound: null, optimal: false, depthLimit: 2, policy: "mixed", method: "heuristic" } as const;

describe("buildMatrix", () => {
  it("renumbers buses B1.. in order of first use and orders diodes for assembly", () => {
    const m = buildMatrix(
      spec,
      [
        { from: "zz", to: "1br" },
        { from: "1bl", to: "1tr" },
        { from: "S5", to: "zz" },
        { from: "S3", to: "zz" },
        { from: "S1", to: "1bl" },
      ],
      meta,
    );
    expect(m.buses).toEqual(["B1"]);
    expect(m.diodes.map((d) => `${d.ref} ${d.from}>${d.to}`)).toEqual(["D1 S1>1bl", "D2 S3>B1", "D3 S5>B1", "D4 B1>1br", "D5 1bl>1tr"]);
    expect(m.count).toBe(5);
    expect(m.longestPath).toBe(2);
  });

  it("measures the longest path through links", () => {
    const m = buildMatrix(
      spec,
      [
        { from: "S5", to: "1ml" },
        { from: "1ml", to: "1mr" },
        { from: "1mr", to: "1tl" },
      ],
      { ...meta, depthLimit: 3 },
    );
    expect(m.longestPath).toBe(3);
    expect(m.buses).toEqual([]);
  });
});
