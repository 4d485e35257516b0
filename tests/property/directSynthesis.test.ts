/**
 * Invariants of the core pipeline on random valid projects: the direct
 * matrix always passes the independent verifier, and it has exactly one
 * diode per lit cell (outputs lit in every state are tied on, with none).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileSpec, litCellCount } from "../../src/core/spec/decodeSpec.ts";
import { parseProject } from "../../src/core/project/projectSchema.ts";
import { synthesizeDirect } from "../../src/core/synth/direct.ts";
import { verifyMatrix } from "../../src/core/matrix/verify.ts";
import { projectDoc } from "../support/arbitraries.ts";

const SEED = 20261201;

describe("direct synthesis on random projects (fast-check seed 20261201)", () => {
  it("verifies, and counts one diode per lit cell", () => {
    fc.assert(
      fc.property(projectDoc, (doc) => {
        const parsed = parseProject(JSON.stringify(doc));
        expect(parsed.ok).toBe(true);
        if (!parsed.ok) return;
        const spec = compileSpec(parsed.value);
        for (const depth of ["mixed", "per-segment", "uniform"] as const) {
          const m = synthesizeDirect(spec, 1, depth);
          const v = verifyMatrix(spec, m, { depthLimit: 1, policy: depth });
          expect(v.ok ? [] : v.error).toEqual([]);
          expect(m.count).toBe(litCellCount(spec));
        }
        // Every output is exactly one of driven, tied on, never lit.
        expect([...spec.outputs, ...spec.tiedOn, ...spec.neverLit].sort()).toEqual([...spec.allOutputs].sort());
      }),
      { seed: SEED, numRuns: 200 },
    );
  });
});
