/**
 * The AND gates' pull-ups on the matrix drawing of a coded counter's
 * decoder: each drawn once, at the top of its gate's column, hanging from
 * the VLOGIC rail, with the BOM's designator and value; the wiring list
 * gives the sheet and zone where the drawing has it (read back from the
 * border's zone marks); a sheet further down that shows the gate's column
 * names the pull-up and the sheet it is on. Nothing new overlaps.
 *
 * The circuit drawn: a diode AND gate's node pulled up to the logic supply
 * through a resistor and held low by a diode to each input line (diode
 * logic, common practice, no source).
 */
import { describe, expect, it } from "vitest";
import { verifyLogic } from "../../../src/core/logic/verifyLogic.ts";
import { designators } from "../../../src/core/matrix/designators.ts";
import type { DiodeMatrix, VerifiedMatrix } from "../../../src/core/matrix/matrix.ts";
import { GATE_PULL_UP_HEADING } from "../../../src/core/papers/wiringList.ts";
import type { Project } from "../../../src/core/project/project.ts";
import type { DecodeSpec } from "../../../src/core/spec/decodeSpec.ts";
import { bomLines } from "../../../src/render/bom.ts";
import { boxesOverlap, type Box, type Sheet } from "../../../src/render/drawingModel.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../../src/render/layout.ts";
import { matrixNotes } from "../../../src/render/matrixNotes.ts";
import { paperDesign, paperFiles } from "../../../src/render/papers.ts";
import { codedDecoder, codedProject } from "../../support/codedProjects.ts";
import { parseCsv } from "../../support/csvRead.ts";
import { stubProblems, textProblems } from "../../support/layoutGeometry.ts";
import { makeProject } from "../../support/projects.ts";
import { crossReferenceProblems, pullUpProblems, zoneFromMarks, type PullUpPart } from "../../support/pullUpChecks.ts";

function verified(make: { project: Project; spec: DecodeSpec; matrix: DiodeMatrix }): {
  project: Project;
  spec: DecodeSpec;
  matrix: VerifiedMatrix;
} {
  const v = verifyLogic(make.spec, make.matrix, { depthLimit: make.matrix.depthLimit, policy: make.matrix.policy });
  if (!v.ok) throw new Error(v.error.join("\n"));
  return { ...make, matrix: v.value };
}

const cases = {
  "BCD counter showing 0-9 (one sheet)": () => verified(codedDecoder(codedProject("binary", "0123456789"))),
  "5-stage Johnson counter showing 0-9 (one sheet)": () => verified(codedDecoder(codedProject("johnson", "0123456789"))),
  "binary counter showing 00-59 (several sheets)": () =>
    verified(
      codedDecoder(
        makeProject({
          title: "Minutes",
          counter: { states: 60, code: "binary" },
          display: { positions: 2 },
          show: Array.from({ length: 60 }, (_, k) => String(k).padStart(2, "0")),
        }),
      ),
    ),
};

/** Resistor bodies and diode symbols: the boxes nothing may overlap. */
function symbolBoxes(sheet: Sheet): Box[] {
  const bodies = sheet.polygons
    .filter((p) => !p.filled && p.points.length === 4)
    .map((p) => {
      const xs = p.points.map((q) => q.x);
      const ys = p.points.map((q) => q.y);
      return { x: Math.min(...xs), y: Math.min(...ys), w: Math.max(...xs) - Math.min(...xs), h: Math.max(...ys) - Math.min(...ys) };
    });
  return [...bodies, ...sheet.diodes.map((d) => d.box)];
}

describe.each(Object.entries(cases))("gate pull-ups on the drawing of the %s", (name, make) => {
  const { project, spec, matrix } = make();
  const options = drawingOptions(project);
  const drawing = layoutMatrix(project, spec, matrix, options);
  const parts = designators(spec, matrix, project.electrical);
  const gateOf = new Map(parts.gates.map((g) => [g.pullUp.ref, g.gate]));
  // The BOM's gate pull-ups, one by one, with the value it prints.
  const bom = bomLines(project.electrical, parts, paperDesign({ project, matrix, budget: undefined })).filter((l) =>
    l.refs.some((r) => gateOf.has(r)),
  );
  const pullUps: PullUpPart[] = bom.flatMap((l) => l.refs.map((ref) => ({ ref, value: l.value, node: gateOf.get(ref) as string })));
  const several = name.includes("several");

  it("has one pull-up per gate in the BOM, described as the gate's", () => {
    expect(matrix.gates.length).toBeGreaterThan(0);
    expect(pullUps.map((p) => p.node).sort()).toEqual(matrix.gates.map((g) => g.ref).sort());
    for (const l of bom) expect(l.description).toMatch(/^AND gate pull-up/);
    expect(drawing.sheets.length > 1).toBe(several);
  });

  it("draws every gate pull-up once, with the BOM's designator and value, from the VLOGIC rail to the top of its gate's column", () => {
    for (const p of pullUps) {
      const on = drawing.sheets.filter((s) => s.labels.some((l) => l.role === "part" && l.text === p.ref));
      expect(on, p.ref).toHaveLength(1);
      const sheet = on[0] as Sheet;
      const { at, problems } = pullUpProblems(sheet, p);
      expect(problems).toEqual([]);
      // Where the wiring list will say it is: this sheet, the zone its body is in.
      expect(drawing.placements.get(p.ref)).toEqual({ sheet: sheet.number, zone: zoneFromMarks(sheet, at!) });
    }
  });

  it("keeps the pull-ups' texts and bodies clear of everything else", () => {
    for (const sheet of drawing.sheets) {
      expect(textProblems(sheet)).toEqual([]);
      expect(stubProblems(sheet)).toEqual([]);
      const boxes = symbolBoxes(sheet);
      for (const l of sheet.labels) for (const b of boxes) expect(boxesOverlap(l.box, b), `"${l.text}" on a symbol`).toBe(false);
      boxes.forEach((b, i) => boxes.slice(i + 1).forEach((c) => expect(boxesOverlap(b, c)).toBe(false)));
    }
  });

  it("lists every gate pull-up in the wiring list from VLOGIC to its gate, at the sheet and zone the drawing has it", () => {
    const [csv] = paperFiles({ project, spec, matrix, options, drawing, budget: undefined }, "wiring");
    const records = parseCsv(csv?.text ?? "");
    const at = records.findIndex((r) => r[0] === GATE_PULL_UP_HEADING);
    expect(at).toBeGreaterThan(0);
    const rows = records.slice(at + 1, at + 1 + pullUps.length);
    expect(rows.map((r) => r[1])).toEqual(parts.gates.map((g) => g.pullUp.ref));
    for (const r of rows) {
      const p = pullUps.find((x) => x.ref === r[1]) as PullUpPart;
      const sheet = drawing.sheets[Number(r[4]) - 1] as Sheet;
      const { at: body } = pullUpProblems(sheet, p);
      expect([r[2], r[3], r[5]]).toEqual(["VLOGIC", p.node, zoneFromMarks(sheet, body!)]);
    }
  });

  it.runIf(several)("names each pull-up over its gate's column on every other sheet that shows the column", () => {
    let crossed = 0;
    for (const p of pullUps) {
      const home = drawing.placements.get(p.ref)!.sheet;
      for (const sheet of drawing.sheets) {
        if (sheet.number === home) continue;
        expect(crossReferenceProblems(sheet, p, home)).toEqual([]);
        if (sheet.labels.some((l) => l.text === p.ref)) crossed++;
      }
    }
    // Some of the 00-59 decoder's gate columns run down into the sheets below the first row of sheets.
    expect(crossed).toBeGreaterThan(0);
    // The notes say how to read the cross-reference.
    expect(matrixNotes(project, spec, matrix, true)).toContain(
      "A designator with sh.N over a column names the column's pull-up, drawn at its top on sheet N.",
    );
  });
});
