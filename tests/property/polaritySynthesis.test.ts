/**
 * The decode polarity on random lit matrices: every result verifies in both
 * directions, `either` is never worse than the better of `lit` and `dark`
 * under the same objective, and on tiny instances the exact optimizer's
 * minimum equals an independent brute force that tries every set of diodes
 * (lines, one bus, outputs) and simulates both directions itself.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { DecodePolarity, DepthPolicy } from "../../src/core/project/project.ts";
import type { DecodeSpec } from "../../src/core/spec/decodeSpec.ts";
import { matrixObjective } from "../../src/core/matrix/matrix.ts";
import { verifyMatrix } from "../../src/core/matrix/verify.ts";
import { synthesize, type SynthMode, type SynthSettings } from "../../src/core/synth/synthesize.ts";
import { polaritySpec } from "../support/polaritySpec.ts";

const SEED = 20261203;

function settings(mode: SynthMode, policy: DepthPolicy, timeLimitMs = 4000): SynthSettings {
  return { mode, depthLimit: 2, policy, buses: true, links: true, timeLimitMs, seed: 1 };
}

/** Random lit matrices with at least one output lit in some but not all states. */
const litMatrix = (maxN: number, maxM: number) =>
  fc
    .integer({ min: 2, max: maxN })
    .chain((n) =>
      fc
        .integer({ min: 1, max: maxM })
        .chain((m) => fc.array(fc.array(fc.boolean(), { minLength: m, maxLength: m }), { minLength: n, maxLength: n })),
    )
    .filter((lit) => (lit[0] ?? []).some((_, o) => lit.some((r) => r[o]) && lit.some((r) => !r[o])));

async function solved(lit: boolean[][], decode: DecodePolarity, per: number, mode: SynthMode, policy: DepthPolicy) {
  const spec = polaritySpec(lit, decode, per);
  const r = await synthesize(spec, settings(mode, policy));
  expect(r.ok, JSON.stringify(r.ok ? null : r.error)).toBe(true);
  if (!r.ok) throw new Error("unreachable");
  // Verified again here, not trusted from synthesize.
  expect(verifyMatrix(spec, r.value, { depthLimit: 2, policy }).ok).toBe(true);
  return { spec, m: r.value };
}

describe(`decode polarity properties (seed ${SEED})`, () => {
  it("every fast result verifies in both directions, and dark decodes only dark outputs", async () => {
    await fc.assert(
      fc.asyncProperty(
        litMatrix(8, 5),
        fc.constantFrom<DecodePolarity>("dark", "either"),
        fc.integer({ min: 0, max: 2 }),
        async (lit, decode, per) => {
          const { m } = await solved(lit, decode, per, "fast", "per-segment");
          if (decode === "dark") expect(Object.values(m.decode ?? {}).every((d) => d === "dark")).toBe(true);
          const dark = Object.values(m.decode ?? {}).filter((d) => d === "dark").length;
          expect(m.inputNetwork?.diodes ?? 0).toBe(per * dark);
        },
      ),
      { seed: SEED, numRuns: 40 },
    );
  });

  it("exact either is never worse than the better of exact lit and exact dark", async () => {
    await fc.assert(
      fc.asyncProperty(
        litMatrix(6, 4),
        fc.integer({ min: 0, max: 2 }),
        fc.constantFrom<DepthPolicy>("mixed", "per-segment"),
        async (lit, per, policy) => {
          const lit1 = await solved(lit, "lit", per, "exact", policy);
          const dark = await solved(lit, "dark", per, "exact", policy);
          const either = await solved(lit, "either", per, "exact", policy);
          expect(matrixObjective(either.m)).toBeLessThanOrEqual(Math.min(matrixObjective(lit1.m), matrixObjective(dark.m)));
          // On instances this small every run is proven.
          for (const r of [lit1, dark, either]) expect(r.m.optimal).toBe(true);
        },
      ),
      { seed: SEED, numRuns: 8 },
    );
  }, 120_000);
});

// ---------------------------------------------------------------- the brute force

interface Edge {
  readonly from: number;
  readonly to: number;
}

interface Minima {
  lit: number;
  dark: number;
  either: number;
}

/**
 * The least objective (diodes plus `per` for each dark-decoded output) over
 * every decoder on the lines S<k> and nS<k>, one optional bus and the
 * outputs, with paths of at most two diodes (the mixed policy): with every
 * output lit-decoded, every one dark-decoded, and either. Nodes: 0..n-1 the
 * S lines, n..2n-1 the nS lines, 2n the bus, 2n+1.. the outputs. An
 * output's polarity is the side that reaches it; reached from both sides or
 * from neither, the set is no decoder. Written apart from the synthesizer
 * and the verifier: it tries every set of diodes, smallest first.
 */
function bruteForce(lit: readonly (readonly boolean[])[], outputs: readonly number[], per: number): Minima {
  const n = lit.length;
  const m = outputs.length;
  const bus = 2 * n;
  const out = (j: number): number => 2 * n + 1 + j;
  const nodes = 2 * n + 1 + m;
  const candidates: Edge[] = [];
  for (let l = 0; l < 2 * n; l++) {
    for (let j = 0; j < m; j++) candidates.push({ from: l, to: out(j) });
    candidates.push({ from: l, to: bus });
  }
  for (let j = 0; j < m; j++) candidates.push({ from: bus, to: out(j) });
  for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) if (a !== b) candidates.push({ from: out(a), to: out(b) });

  // Wanted reach of each line, as bit masks over the outputs: S<k> raises the lit cells, nS<k> pulls down the dark ones.
  const litMask = (k: number): number => outputs.reduce((a, o, j) => (lit[k]?.[o] ? a | (1 << out(j)) : a), 0);
  const allOut = outputs.reduce((a, _, j) => a | (1 << out(j)), 0);
  const adj = new Array<number>(nodes).fill(0);
  const best: Minima = { lit: Infinity, dark: Infinity, either: Infinity };
  let size = 0;
  const evaluate = (): void => {
    const reach: number[] = [];
    for (let l = 0; l < 2 * n; l++) {
      const r1 = adj[l] as number;
      let r2 = 0;
      for (let x = 0; x < nodes; x++) if (r1 & (1 << x)) r2 |= adj[x] as number;
      let r3 = 0;
      for (let x = 0; x < nodes; x++) if (r2 & (1 << x)) r3 |= adj[x] as number;
      if (r3 !== 0) return; // a path of three diodes, or a loop
      reach.push((r1 | r2) & allOut);
    }
    let byS = 0;
    let byN = 0;
    for (let k = 0; k < n; k++) {
      byS |= reach[k] as number;
      byN |= reach[n + k] as number;
    }
    if ((byS & byN) !== 0 || (byS | byN) !== allOut) return;
    for (let k = 0; k < n; k++) {
      const want = litMask(k);
      if (((reach[k] as number) & byS) !== (want & byS)) return;
      if (((reach[n + k] as number) & byN) !== (~want & allOut & byN)) return;
    }
    let dark = 0;
    for (let j = 0; j < m; j++) if (byN & (1 << out(j))) dark++;
    const total = size + per * dark;
    if (dark === 0) best.lit = Math.min(best.lit, total);
    if (dark === m) best.dark = Math.min(best.dark, total);
    best.either = Math.min(best.either, total);
  };
  const choose = (start: number, left: number): void => {
    if (left === 0) {
      evaluate();
      return;
    }
    for (let i = start; i <= candidates.length - left; i++) {
      const e = candidates[i] as Edge;
      adj[e.from] = (adj[e.from] as number) | (1 << e.to);
      choose(i + 1, left - 1);
      adj[e.from] = (adj[e.from] as number) & ~(1 << e.to);
    }
  };
  // A set of s diodes costs at least s: stop once every minimum is below the size.
  for (size = 0; size < Math.max(best.lit, best.dark, best.either); size++) choose(0, size);
  return best;
}

const tiny = [
  ["110", "011", "101"],
  ["101", "101", "010"],
  ["111", "111", "000"],
  ["10", "01", "11"],
  ["11", "11", "01", "00"],
  ["100", "110", "011"],
] as const;

describe("the exact optimizer against an independent brute force, both polarities", () => {
  for (const rows of tiny) {
    for (const per of [0, 1]) {
      it(`${rows.join("/")} with ${per} input diode(s) per dark output`, async () => {
        const lit = rows.map((r) => [...r].map((c) => c === "1"));
        const spec: DecodeSpec = polaritySpec(lit, "either", per);
        const cols = spec.outputs.map((name) => Number(name.slice(2)));
        const brute = bruteForce(lit, cols, per);
        for (const decode of ["lit", "dark", "either"] as const) {
          const { m } = await solved(lit, decode, per, "exact", "mixed");
          expect(m.optimal).toBe(true);
          expect(matrixObjective(m), decode).toBe(brute[decode]);
        }
      }, 60_000);
    }
  }
});
