/**
 * The high-side switch's stage and its circuit: a PNP with its emitter on
 * the segment supply, the output line pulled up to the supply and pulled
 * down through the matrix to the active-low lines of the states that light
 * its segment; and its budget on the 5 V preset.
 */
import { describe, expect, it } from "vitest";
import { solveBudget } from "../../../../src/core/budget/budget.ts";
import { buildCircuit } from "../../../../src/core/circuit/circuit.ts";
import { solveDc } from "../../../../src/core/circuit/dcSolver.ts";
import { isLit } from "../../../../src/core/circuit/stateSweep.ts";
import { countParts } from "../../../../src/core/papers/parts.ts";
import { designators } from "../../../../src/core/matrix/designators.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { makeProject2 } from "../../../support/projects.ts";

async function design(show: readonly string[], electrical: Record<string, unknown> = {}) {
  const project = makeProject2({
    counter: { states: show.length, drive: "sink" },
    display: {},
    show,
    synthesis: { depth: "mixed", decode: "lit", timeLimitMs: 5000 },
    electrical: { preset: "bench-5v-high-side", ...electrical },
  });
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return { project, spec, matrix: r.value };
}

describe("highSideSwitchStage", () => {
  it("puts the PNP's emitter on the supply, Rb from the line, Rbe and the line's pull-up from the supply, Rs and the segment from the collector to ground", async () => {
    const d = await design([..."0123456789"]);
    const e = d.project.electrical;
    const c = buildCircuit(d.spec, d.matrix, e, 0);
    for (const dr of c.drivers) {
      const o = dr.output;
      const named = (n: string | null | undefined) => c.elements.find((x) => x.name === n);
      const q = named(dr.transistor);
      expect(q && q.kind === "pnp" && [q.collector, q.base, q.emitter, q.betaF]).toEqual([`c${o}`, `b${o}`, "vsup", e.driver.betaF]);
      const ends = (n: string | null | undefined) => {
        const r = named(n);
        return r && r.kind === "resistor" ? [r.a, r.b, r.ohms] : null;
      };
      expect(ends(dr.base?.ref)).toEqual([`o${o}`, `b${o}`, 6800]);
      expect(ends(dr.baseEmitter?.ref)).toEqual(["vsup", `b${o}`, 10_000]);
      expect(ends(dr.pullDown.ref)).toEqual(["vsup", `o${o}`, 100_000]);
      expect(dr.pullDown.role).toBe("line-pull-up");
      expect(ends(dr.series?.ref)).toEqual([`c${o}`, `a${o}`, 300]);
      const seg = named(dr.display);
      expect(seg && seg.kind === "segment" && [seg.anode, seg.cathode]).toEqual([`a${o}`, "0"]);
    }
    // Every matrix diode is turned round: its anode at the output or bus it pulls down, its cathode towards an nS line.
    for (const m of d.matrix.diodes) {
      const el = c.elements.find((x) => x.name === m.ref);
      expect(el && el.kind === "diode" && el.cathode).toBe(m.from.toLowerCase().replace(/^(\d)/, "o$1"));
    }
    // The active-low lines are the only counter lines the diodes meet; no logic supply is needed.
    expect(c.elements.some((x) => x.kind === "vsource" && x.name === "VnS0" && x.volts === e.lowLine.low)).toBe(true);
    expect(c.elements.some((x) => x.kind === "vsource" && x.name === "VnS1" && x.volts === e.lowLine.high)).toBe(true);
    expect(c.elements.some((x) => x.name === "VLOGIC")).toBe(false);
    // The parts: PNPs, a line pull-up per output, no pull-down.
    const kinds = countParts(designators(d.spec, d.matrix, e)).map((g) => g.kind);
    expect(kinds).toContain("line-pull-up");
    expect(kinds).not.toContain("pull-down");
  });

  it("lights exactly each state's glyph: every lit segment near 10 mA, every unlit one below a nanoampere", async () => {
    const d = await design([..."0123456789"]);
    d.spec.states.forEach((s, k) => {
      const c = buildCircuit(d.spec, d.matrix, d.project.electrical, k);
      const op = solveDc(c, c.guess);
      if (!op.ok) throw new Error(op.error.message);
      for (const dr of c.drivers) {
        const i = op.value.currents[dr.display] as number;
        if (isLit(d.spec, k, dr.output)) expect(i, `${s} ${dr.output}`).toBeGreaterThan(0.009);
        else expect(i, `${s} ${dr.output}`).toBeLessThan(1e-9);
      }
    });
  });

  it("budgets the 5 V preset: lit window met at both corners, switches saturated, unlit below the ghost limit, each nS line within its rating", async () => {
    const d = await design([..."0123456789"]);
    const b = solveBudget(d.project, d.spec, d.matrix);
    if (!b.ok) throw new Error(b.error.message);
    const e = d.project.electrical;
    expect(b.value.kind).toBe("high-side-switch");
    expect(b.value.corners.meetsTarget).toBe(true);
    expect(Object.values(b.value.drivers).every((x) => x.saturated === true && (x.forcedBeta ?? 0) > 1)).toBe(true);
    expect(Math.max(...Object.values(b.value.outputs).map((o) => o.offMaxA))).toBeLessThan(e.ghostFraction * e.segment.targetA);
    const lines = Object.entries(b.value.counterLines);
    expect(lines.map(([l]) => l)).toEqual(d.spec.polarity.activeLow);
    // "8" lights all seven: nS8 sinks seven base currents and line pull-ups, the most of any line.
    const [worst, line] = lines.reduce((a, x) => (x[1].sinkCurrentA > a[1].sinkCurrentA ? x : a));
    expect(worst).toBe("nS8");
    expect(line.sinkCurrentA).toBeGreaterThan(7 * 0.0004);
    expect(line.sinkCurrentA).toBeLessThanOrEqual(e.lowLine.maxCurrentA);
    expect(b.value.warnings.filter((w) => w.level !== "info")).toEqual([]);
  });

  it("warns when the base resistor asks more of an active-low line than its rating", async () => {
    const d = await design([..."0123456789"], { driver: { baseResistor: 2200 } });
    const b = solveBudget(d.project, d.spec, d.matrix);
    if (!b.ok) throw new Error(b.error.message);
    const sinks = b.value.warnings.flatMap((w) => (w.code === "line-sink" ? [w] : []));
    expect(sinks.map((w) => w.line)).toContain("nS8");
    expect(sinks.every((w) => w.currentA > d.project.electrical.lowLine.maxCurrentA && w.ratedA === 0.005)).toBe(true);
    // What the line sinks is the switches' bases and line pull-ups, not a coded counter's gate pull-ups.
    expect(sinks.every((w) => w.from === "switch-bases")).toBe(true);
  });
});
