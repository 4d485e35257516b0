/**
 * The AND gates' pull-ups on the drawings of random coded counters (binary
 * or Johnson, random texts, one to three positions, every paper): each
 * gate's pull-up is drawn exactly once, from the VLOGIC rail to the top of
 * its gate's column, with its designator and value, at the sheet and zone
 * the wiring list gives; every other sheet that shows the gate's column
 * names it with that sheet; no text collides and no wire is a stub.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { designators } from "../../src/core/matrix/designators.ts";
import type { Sheet } from "../../src/render/drawingModel.ts";
import { drawingOptions } from "../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../src/render/layout.ts";
import { formatOhms } from "../../src/render/units.ts";
import { codedDecoder } from "../support/codedProjects.ts";
import { stubProblems, textProblems } from "../support/layoutGeometry.ts";
import { makeProject } from "../support/projects.ts";
import { crossReferenceProblems, pullUpProblems, zoneFromMarks } from "../support/pullUpChecks.ts";

const SEED = 3122026;

const CHARS = "0123456789AbCdEF";

const scenario = fc.record({
  code: fc.constantFrom("binary" as const, "johnson" as const),
  half: fc.integer({ min: 2, max: 12 }),
  positions: fc.integer({ min: 1, max: 3 }),
  paper: fc.constantFrom("a4" as const, "a3" as const, "letter" as const),
  picks: fc.array(fc.integer({ min: 0, max: CHARS.length - 1 }), { minLength: 72, maxLength: 72 }),
});

describe(`gate pull-ups on random coded counters' drawings (fast-check seed ${SEED})`, () => {
  it("draws each gate's pull-up once at its column's top, names it on the other sheets, and keeps every text clear", () => {
    fc.assert(
      fc.property(scenario, ({ code, half, positions, paper, picks }) => {
        const states = 2 * half;
        const show = Array.from({ length: states }, (_, k) =>
          Array.from({ length: positions }, (_, p) => CHARS[picks[(k * positions + p) % picks.length]!]).join(""),
        );
        const project = makeProject({ counter: { states, code }, display: { positions }, show });
        const { spec, matrix } = codedDecoder(project);
        const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project, { paper }));
        const problems = [...drawing.sheets.flatMap(textProblems), ...drawing.sheets.flatMap(stubProblems)];
        for (const g of designators(spec, matrix, project.electrical).gates) {
          const part = { ref: g.pullUp.ref, value: formatOhms(g.pullUp.ohms), node: g.gate };
          const home = drawing.sheets.filter((s) => s.labels.some((l) => l.role === "part" && l.text === part.ref));
          if (home.length !== 1) {
            problems.push(`${part.ref} drawn on ${home.length} sheets`);
            continue;
          }
          const sheet = home[0] as Sheet;
          const { at, problems: own } = pullUpProblems(sheet, part);
          problems.push(...own);
          if (at !== null) expect(drawing.placements.get(part.ref)).toEqual({ sheet: sheet.number, zone: zoneFromMarks(sheet, at) });
          for (const s of drawing.sheets) if (s !== sheet) problems.push(...crossReferenceProblems(s, part, sheet.number));
        }
        expect(problems.slice(0, 5)).toEqual([]);
      }),
      { seed: SEED, numRuns: 40 },
    );
  }, 120_000);
});
