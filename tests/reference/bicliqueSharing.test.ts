/**
 * Bus arithmetic against the sources in docs/sources.md ("Diode logic and
 * matrices").
 */
import { describe, expect, it } from "vitest";
import { litCellCount } from "../../src/core/spec/decodeSpec.ts";
import { synthesize, type SynthSettings } from "../../src/core/synth/synthesize.ts";
import { litRows, specFromLit } from "../support/litSpec.ts";

// Links off: identical columns could otherwise share through output-to-output
// links, which the cited arithmetic does not count.
const BUSES_ONLY: SynthSettings = { mode: "exact", depthLimit: 2, policy: "mixed", buses: true, links: false, timeLimitMs: 5000, seed: 1 };

/** An r-by-c all-ones block plus one blank state, so no output is lit in every state (tied on). */
function block(r: number, c: number): boolean[][] {
  return [...Array.from({ length: r }, () => Array(c).fill(true) as boolean[]), Array(c).fill(false) as boolean[]];
}

describe("sharing through a common node", () => {
  // Source: docs/sources.md, "Sharing through a common node": r*c diodes direct,
  // r+c through one node; 2x2 saves nothing, 2x3 saves 1, 3x3 saves 3.
  for (const [r, c, saved] of [
    [2, 2, 0],
    [2, 3, 1],
    [3, 2, 1],
    [3, 3, 3],
  ] as const) {
    it(`a ${r}x${c} block saves ${saved}`, async () => {
      const spec = specFromLit(block(r, c));
      expect(litCellCount(spec)).toBe(r * c);
      const res = await synthesize(spec, BUSES_ONLY);
      expect(res.ok).toBe(true);
      if (!res.ok) return;
      expect(res.value.optimal).toBe(true);
      expect(res.value.count).toBe(Math.min(r * c, r + c));
      expect(r * c - res.value.count).toBe(saved);
      expect(res.value.buses.length).toBe(saved > 0 ? 1 : 0);
    });
  }

  // Source: docs/sources.md: the general problem is the minimum-total-vertex
  // biclique cover/partition (T. Feder and R. Motwani, "Clique partitions,
  // graph compression and speeding-up algorithms", JCSS 1995; NP-complete),
  // related to Boolean rank / set basis (J. Orlin 1977; L. J. Stockmeyer,
  // "The set basis problem is NP-complete", 1975). A cover may overlap, since
  // the diodes OR their currents: two 3x3 blocks sharing one cell are two
  // nodes (12 diodes), where splitting them into disjoint rectangles costs more.
  it("overlapping rectangles: two 3x3 blocks sharing a corner cost 12 through two nodes", async () => {
    const lit = litRows("11100", "11100", "11111", "00111", "00111", "00000");
    const spec = specFromLit(lit);
    expect(litCellCount(spec)).toBe(17);
    const res = await synthesize(spec, BUSES_ONLY);
    expect(res.ok && res.value.optimal).toBe(true);
    if (res.ok) {
      expect(res.value.count).toBe(12);
      expect(res.value.buses.length).toBe(2);
    }
  });
});
