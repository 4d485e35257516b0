/**
 * Coded counters on random code tables and glyph sets: every decoder lights
 * exactly its state's segments by an independent simulation of its logic,
 * is never larger than the two-rank decoder, and on codes of up to three
 * stages the proven two-level minimum equals an independent brute-force
 * minimum (tests/support/logicCheck.ts).
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { DepthPolicy } from "../../src/core/project/project.ts";
import { synthesizeCoded } from "../../src/core/logic/synthesizeCoded.ts";
import { synthesize, type SynthMode } from "../../src/core/synth/synthesize.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { makeProject } from "../support/projects.ts";
import { bruteForceTwoLevel, decoderLights } from "../support/logicCheck.ts";
import { exactSettings } from "../support/codedProjects.ts";

const SEED = 20261212;
const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];
const SEGMENTS = ["s0", "s1", "s2", "s3", "s4"];
const CHARS = "abcdefghijklmnop";

/** A custom code table of 2..maxStages stages (distinct codes) and a glyph per state on a custom cell of 1-5 segments. */
const codedCase = (maxStages: number, maxStates: number) =>
  fc
    .integer({ min: 2, max: maxStages })
    .chain((stages) =>
      fc
        .uniqueArray(fc.integer({ min: 0, max: 2 ** stages - 1 }), { minLength: 2, maxLength: Math.min(maxStates, 2 ** stages) })
        .chain((codes) =>
          fc
            .integer({ min: 1, max: SEGMENTS.length })
            .chain((m) =>
              fc
                .array(fc.subarray(SEGMENTS.slice(0, m)), { minLength: codes.length, maxLength: codes.length })
                .map((glyphs) => ({ stages, codes: codes.map((c) => c.toString(2).padStart(stages, "0")), m, glyphs })),
            ),
        ),
    );

function projectOf(c: { stages: number; codes: string[]; m: number; glyphs: string[][] }) {
  return makeProject({
    counter: { states: c.codes.length, code: "custom", codes: c.codes },
    display: { cell: "custom", segments: SEGMENTS.slice(0, c.m) },
    glyphs: Object.fromEntries(c.glyphs.map((g, k) => [CHARS[k] as string, g])),
    show: c.codes.map((_, k) => CHARS[k] as string),
  });
}

describe("coded synthesis on random code tables (fast-check seed 20261212)", () => {
  it("every decoder lights exactly its glyph for every used code, and is never above the two-rank decoder", async () => {
    await fc.assert(
      fc.asyncProperty(
        codedCase(4, 10),
        fc.constantFrom<SynthMode>("fast", "exact"),
        fc.integer({ min: 1, max: 3 }),
        fc.constantFrom(...POLICIES),
        async (c, mode, depthLimit, policy) => {
          const project = projectOf(c);
          const spec = compileSpec(project);
          const r = await synthesizeCoded(spec, exactSettings({ mode, depthLimit, policy, timeLimitMs: 3000 }), { oneHot: synthesize });
          expect(r.ok).toBe(true);
          if (!r.ok) return;
          for (const m of [r.value.matrix, r.value.twoLevel.matrix, r.value.twoRank.matrix]) {
            c.codes.forEach((code, k) => {
              const want = new Set((c.glyphs[k] ?? []).map((s) => `1${s}`));
              expect([...decoderLights(m, code)].sort(), `code ${code}`).toEqual([...want].sort());
            });
          }
          expect(r.value.matrix.count).toBeLessThanOrEqual(r.value.twoRank.matrix.count);
          expect(r.value.matrix.count).toBeLessThanOrEqual(r.value.twoLevel.matrix.count);
          if (r.value.matrix.lowerBound !== null) expect(r.value.matrix.lowerBound).toBeLessThanOrEqual(r.value.matrix.count);
        },
      ),
      { seed: SEED, numRuns: 40 },
    );
  }, 240_000);

  it("the proven two-level minimum equals the brute-force minimum, diodes then gates, up to 3 stages", async () => {
    await fc.assert(
      fc.asyncProperty(codedCase(3, 8), async (c) => {
        const spec = compileSpec(projectOf(c));
        const r = await synthesizeCoded(spec, exactSettings({ timeLimitMs: 3000 }), { oneHot: synthesize });
        expect(r.ok).toBe(true);
        if (!r.ok) return;
        const two = r.value.twoLevel;
        expect(two.matrix.optimal).toBe(true);
        const brute = spec.outputs.length === 0 ? { diodes: 0, gates: 0 } : bruteForceTwoLevel(spec.counter.codes, spec.lit);
        expect({ diodes: two.matrix.count, gates: two.gates }).toEqual(brute);
      }),
      { seed: SEED, numRuns: 60 },
    );
  }, 240_000);
});
