/**
 * The drawing's text never collides, on random projects and random matrix
 * shapes (buses, links, several sheets): no two text boxes overlap, no text
 * sits on a diode symbol or a junction dot, no text runs off the paper, no
 * wire is cut into a stub at a sheet edge, and every diode is drawn once. Matrices here are built by hand from random
 * edges, so they need not be valid decoders; the layout must cope anyway.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { buildMatrix, type Edge } from "../../src/core/matrix/matrix.ts";
import { parseProject } from "../../src/core/project/projectSchema.ts";
import { drawingOptions } from "../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../src/render/layout.ts";
import { stubProblems, textProblems } from "../support/layoutGeometry.ts";
import { projectDoc } from "../support/arbitraries.ts";

const SEED = 5052026;

/** A small deterministic generator (mulberry32) for the matrix shape. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const scenario = fc.record({
  doc: projectDoc,
  longNames: fc.boolean(),
  longTitle: fc.boolean(),
  paper: fc.constantFrom("a4" as const, "a3" as const, "letter" as const),
  buses: fc.integer({ min: 0, max: 4 }),
  links: fc.integer({ min: 0, max: 3 }),
  shape: fc.integer({ min: 0, max: 2 ** 31 - 1 }),
});

describe(`drawing text on random projects (fast-check seed ${SEED})`, () => {
  it("never overlaps, never sits on a symbol or dot, and draws each diode once", () => {
    fc.assert(
      fc.property(scenario, ({ doc, longNames, longTitle, paper, buses, links, shape }) => {
        const d = structuredClone(doc) as Record<string, unknown> & {
          display: { cell: string; segments?: string[] };
          glyphs: Record<string, string[]>;
        };
        if (longTitle)
          d["title"] =
            "A long title that will need two lines or more in the title block, and then some more words to be cut off at the end".repeat(1);
        if (longNames && d.display.cell === "custom" && d.display.segments) {
          const rename = (s: string): string => `seg${s.slice(1)}long`.slice(0, 8);
          d.display.segments = d.display.segments.map(rename);
          d.glyphs = Object.fromEntries(Object.entries(d.glyphs).map(([k, v]) => [k, v.map(rename)]));
        }
        const parsed = parseProject(JSON.stringify(d));
        expect(parsed.ok).toBe(true);
        if (!parsed.ok) return;
        const project = parsed.value;
        const spec = compileSpec(project);
        const random = rng(shape);
        const edges = new Map<string, Edge>();
        const add = (from: string, to: string): void => void edges.set(`${from}>${to}`, { from, to });
        spec.lit.forEach((row, k) => row.forEach((on, j) => on && random() < 0.6 && add(spec.states[k]!, spec.outputs[j]!)));
        if (spec.outputs.length > 0) {
          for (let b = 0; b < buses; b++) {
            const name = `bus${b}`;
            add(spec.states[Math.floor(random() * spec.states.length)]!, name);
            for (const s of spec.states) if (random() < 0.3) add(s, name);
            add(name, spec.outputs[Math.floor(random() * spec.outputs.length)]!);
            for (const o of spec.outputs) if (random() < 0.3) add(name, o);
          }
          for (let l = 0; l < links && spec.outputs.length > 1; l++) {
            const i = Math.floor(random() * spec.outputs.length);
            const j = (i + 1 + Math.floor(random() * (spec.outputs.length - 1))) % spec.outputs.length;
            add(spec.outputs[i]!, spec.outputs[j]!);
          }
        }
        const matrix = buildMatrix(spec, [...edges.values()], {
          lowerBound: null,
          optimal: false,
          depthLimit: 3,
          policy: "mixed",
          method: "heuristic",
        });
        const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project, { paper }));
        const problems = [...drawing.sheets.flatMap(textProblems), ...drawing.sheets.flatMap(stubProblems)];
        expect(problems.slice(0, 5)).toEqual([]);
        const drawn = drawing.sheets.flatMap((s) => s.diodes.map((x) => x.ref)).sort();
        expect(drawn).toEqual(matrix.diodes.map((x) => x.ref).sort());
      }),
      { seed: SEED, numRuns: 60 },
    );
  });
});
