/**
 * The matrix drawing of a project with dark-decoded outputs: every output
 * column says its polarity under its head; a dark column's pull-up hangs
 * from a VLOGIC rail above the matrix and joins the column's top; its
 * level-shift diodes (band towards the driver) or its divider's upper
 * resistor stand at the column's foot, above the driver's name; each part
 * carries its designator and, once the budget has sized it, its value (the
 * BOM's); the text collides with nothing and each part is drawn once, on
 * one sheet or several. A lit-only drawing has none of it.
 *
 * The circuit drawn is the dark decode's: a pull-up from the logic supply
 * to the node, series level-shift diodes from the node towards the driver's
 * input, or a divider (common practice of diode-transistor logic, no source).
 */
import { describe, expect, it } from "vitest";
import { solveBudget } from "../../../src/core/budget/budget.ts";
import { designators } from "../../../src/core/matrix/designators.ts";
import { darkOutputs, type VerifiedMatrix } from "../../../src/core/matrix/matrix.ts";
import type { Project } from "../../../src/core/project/project.ts";
import { compileSpec, type DecodeSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../src/core/synth/synthesize.ts";
import { boxesOverlap, type Box, type Label, type Sheet } from "../../../src/render/drawingModel.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../../src/render/layout.ts";
import { paperDarkValues } from "../../../src/render/papers.ts";
import { formatOhms } from "../../../src/render/units.ts";
import { arms, pieces, stubProblems, textProblems } from "../../support/layoutGeometry.ts";
import { crossReferenceProblems, pullUpProblems, zoneFromMarks } from "../../support/pullUpChecks.ts";
import { makeProject2 } from "../../support/projects.ts";

async function solved(
  texts: readonly string[],
  synthesis: Record<string, unknown>,
  positions = 1,
): Promise<{ project: Project; spec: DecodeSpec; matrix: VerifiedMatrix }> {
  const project = makeProject2({
    counter: { states: texts.length, drive: "complementary" },
    display: { positions, cell: "seg7" },
    show: texts,
    synthesis: { depth: "mixed", timeLimitMs: 5000, ...synthesis },
  });
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return { project, spec, matrix: r.value };
}

const texts = (sheet: Sheet): string[] => sheet.labels.map((l) => l.text);
const closedPolygons = (sheet: Sheet): Box[] =>
  sheet.polygons.map((p) => {
    const xs = p.points.map((q) => q.x);
    const ys = p.points.map((q) => q.y);
    return { x: Math.min(...xs), y: Math.min(...ys), w: Math.max(...xs) - Math.min(...xs), h: Math.max(...ys) - Math.min(...ys) };
  });
/** Text that sits on a resistor body or a level-shift diode's triangle (the matrix's own symbols are textProblems' job). */
const textOnBodies = (sheet: Sheet): string[] => {
  const bodies = closedPolygons(sheet);
  return sheet.labels.filter((l) => bodies.some((b) => boxesOverlap(l.box, b))).map((l) => `"${l.text}" sits on a part`);
};
/** The label of a column head, by its text, in the output columns' heads (bold, role column). */
const heads = (sheet: Sheet): Label[] => sheet.labels.filter((l) => l.role === "column" && l.bold);

describe("matrix drawing of dark-decoded columns", () => {
  it("level-shift: the pull-up at each dark column's top with its value, the shift diodes at its foot, each column's polarity", async () => {
    const { project, spec, matrix } = await solved([..."0123456789"], { decode: "either", darkInput: "level-shift" });
    const budget = solveBudget(project, spec, matrix);
    if (!budget.ok) throw new Error(budget.error.message);
    const values = paperDarkValues({ project, spec, budget });
    expect(values?.pullUpOhms).toBe(budget.value.dark?.pullUpOhms);
    const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project), values);
    expect(drawing.sheets).toHaveLength(1);
    const sheet = drawing.sheets[0] as Sheet;
    expect(textProblems(sheet)).toEqual([]);
    expect(stubProblems(sheet)).toEqual([]);
    expect(textOnBodies(sheet)).toEqual([]);
    const dark = darkOutputs(matrix);
    expect(dark.length).toBeGreaterThan(0);
    expect(dark.length).toBeLessThan(matrix.outputs.length);
    const parts = designators(spec, matrix, { ...project.electrical, darkNetwork: values });
    const all = pieces(sheet);
    // Every output column's head has its polarity under it, centred on the column.
    const marks = sheet.labels.filter((l) => l.role === "column" && !l.bold);
    expect(marks).toHaveLength(matrix.outputs.length);
    const columnHeads = heads(sheet).filter((h) => !h.text.startsWith("B"));
    for (const [i, o] of matrix.outputs.entries()) {
      const head = columnHeads[i] as Label;
      expect(head.text).toBe(o.slice(1));
      const mark = marks.find((m) => Math.abs(m.at.x - head.at.x) < 1e-9);
      expect(mark?.text).toBe(dark.includes(o) ? "dark" : "lit");
      expect(mark?.box.y).toBeGreaterThan(head.box.y + head.box.h - 1e-9);
    }
    // The VLOGIC rail, named like a row.
    const rail = sheet.segments.filter((s) => s.net === "VLOGIC");
    expect(rail).toHaveLength(1 + dark.length);
    expect(texts(sheet)).toContain("VLOGIC");
    for (const p of parts.darkInputs) {
      const col = sheet.segments.find((s) => s.net === p.output && s.a.x === s.b.x && s.b.y - s.a.y > 20);
      if (col === undefined) throw new Error(`no column for ${p.output}`);
      // The pull-up: its designator and the budget's value beside it, its lower lead ending on the column's top.
      const ref = sheet.labels.find((l) => l.text === p.pullUp.ref);
      expect(ref).toBeDefined();
      expect(ref?.at.x).toBeGreaterThan(col.a.x);
      expect(ref?.at.y).toBeLessThan(col.a.y);
      expect(sheet.labels.some((l) => l.text === formatOhms(p.pullUp.ohms) && l.at.x === ref?.at.x)).toBe(true);
      expect(arms(col.a, p.output, all)).toBe(2);
      const upper = sheet.segments.find((s) => s.net === "VLOGIC" && s.a.x === col.a.x && s.b.x === col.a.x);
      expect(upper).toBeDefined();
      // The shift diodes: below the matrix, in series from the node to the driver's input, each named.
      expect(p.shiftDiodes).toHaveLength(spec.polarity.inputDiodes ?? 0);
      for (const d of p.shiftDiodes) {
        const l = sheet.labels.find((x) => x.text === d);
        expect(l?.box.y).toBeGreaterThan(col.b.y);
      }
      const nets = [p.output, ...p.shiftDiodes.slice(1).map((_, j) => `${p.output}/${j + 1}`), `${p.output} in`];
      for (const net of nets) expect(sheet.segments.some((s) => s.net === net && s.a.x === col.a.x && s.a.y >= col.b.y - 1e-9)).toBe(true);
      // The driver's input ends above the driver's name.
      const input = sheet.segments.filter((s) => s.net === `${p.output} in`);
      const driver = parts.drivers.find((x) => x.output === p.output)?.transistor as string;
      const foot = sheet.labels.find((l) => l.text === driver && l.role === "terminal");
      expect(Math.max(...input.map((s) => s.b.y))).toBeLessThan(foot?.box.y ?? 0);
    }
    const triangles = sheet.polygons.filter((p) => p.filled && p.points.length === 3);
    expect(triangles.length).toBeGreaterThanOrEqual(dark.length * (spec.polarity.inputDiodes ?? 0));
    // A lit column runs on through the foot band to its driver.
    const lit = matrix.outputs.find((o) => !dark.includes(o)) as string;
    expect(sheet.segments.filter((s) => s.net === lit && s.a.x === s.b.x)).toHaveLength(2);
    // The note says it in one sentence, naming the parts drawn.
    const note = (await import("../../../src/render/matrixNotes.ts"))
      .matrixNotes(project, spec, matrix, false)
      .find((n) => n.startsWith("Columns marked dark"));
    expect(note).toMatch(/^Columns marked dark \([^)]+\) are held high by the pull-up at their top \(R\d+-R\d+,[^.]*\.$/);
    expect(note?.split(". ")).toHaveLength(1);
  }, 60_000);

  it("divider: the upper resistor at the foot of each dark column with its value; the designator alone before the budget", async () => {
    const { project, spec, matrix } = await solved([..."012345"], { decode: "dark", darkInput: "divider" });
    const budget = solveBudget(project, spec, matrix);
    if (!budget.ok) throw new Error(budget.error.message);
    const values = paperDarkValues({ project, spec, budget });
    const sized = layoutMatrix(project, spec, matrix, drawingOptions(project), values).sheets[0] as Sheet;
    expect(textProblems(sized)).toEqual([]);
    expect(textOnBodies(sized)).toEqual([]);
    const parts = designators(spec, matrix, { ...project.electrical, darkNetwork: values });
    for (const p of parts.darkInputs) {
      const divider = p.divider;
      if (divider === null) throw new Error("no divider");
      const ref = sized.labels.find((l) => l.text === divider.ref);
      expect(sized.labels.some((l) => l.text === formatOhms(divider.ohms) && l.at.x === ref?.at.x)).toBe(true);
      expect(sized.segments.some((s) => s.net === `${p.output} in`)).toBe(true);
      expect(sized.labels.some((l) => l.text === p.dividerLower?.ref)).toBe(false);
    }
    // Before the budget: the same parts by designator, no value printed, each where the sized sheet has it.
    const unsizedDrawing = layoutMatrix(project, spec, matrix, drawingOptions(project));
    const sizedDrawing = layoutMatrix(project, spec, matrix, drawingOptions(project), values);
    expect([...unsizedDrawing.placements]).toEqual([...sizedDrawing.placements]);
    for (const p of parts.darkInputs) expect(sizedDrawing.placements.get(p.divider?.ref ?? "")?.sheet).toBe(1);
    const unsized = unsizedDrawing.sheets[0] as Sheet;
    for (const p of parts.darkInputs) {
      expect(texts(unsized)).toContain(p.pullUp.ref);
      expect(texts(unsized)).toContain(p.divider?.ref);
    }
    expect(unsized.labels.filter((l) => l.role === "part").map((l) => l.text)).toEqual(
      parts.darkInputs.flatMap((p) => [p.pullUp.ref]).concat(parts.darkInputs.flatMap((p) => [p.divider?.ref as string])),
    );
  }, 60_000);

  it("several sheets: each pull-up and each shift diode drawn once, named with its sheet over its column on the sheets below, every sheet's text clear", async () => {
    const two = Array.from({ length: 24 }, (_, k) => String(k).padStart(2, "0"));
    const { project, spec, matrix } = await solved(two, { decode: "either" }, 2);
    const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project));
    expect(drawing.sheets.length).toBeGreaterThan(1);
    for (const s of drawing.sheets) {
      expect(textProblems(s)).toEqual([]);
      expect(stubProblems(s)).toEqual([]);
      expect(textOnBodies(s)).toEqual([]);
    }
    const parts = designators(spec, matrix, project.electrical).darkInputs;
    expect(parts.length).toBeGreaterThan(0);
    const count = (t: string): number => drawing.sheets.reduce((n, s) => n + texts(s).filter((x) => x === t).length, 0);
    const drawn = (t: string): Sheet[] => drawing.sheets.filter((s) => s.labels.some((l) => l.role === "part" && l.text === t));
    let crossed = 0;
    for (const p of parts) {
      for (const d of p.shiftDiodes) expect(count(d)).toBe(1);
      // The pull-up itself once, at its column's top, where the wiring list says; on every other sheet that shows
      // the column, its designator and that sheet's number over the column.
      const home = drawn(p.pullUp.ref);
      expect(home).toHaveLength(1);
      // Laid out before the budget: the designator alone.
      const part = { ref: p.pullUp.ref, value: null, node: p.output };
      const { at, problems } = pullUpProblems(home[0] as Sheet, part);
      expect(problems).toEqual([]);
      expect(drawing.placements.get(p.pullUp.ref)).toEqual({ sheet: home[0]?.number, zone: zoneFromMarks(home[0] as Sheet, at!) });
      for (const s of drawing.sheets) {
        if (s === home[0]) continue;
        expect(crossReferenceProblems(s, part, home[0]?.number as number)).toEqual([]);
        if (texts(s).includes(p.pullUp.ref)) crossed++;
      }
    }
    // The drawing has sheets below the first row of sheets, and they show dark columns.
    expect(crossed).toBeGreaterThan(0);
  }, 60_000);

  it("a lit-only drawing has no polarity line, no rail and no foot parts", async () => {
    const project = makeProject2({ counter: { states: 4 }, display: { positions: 1, cell: "seg7" }, show: [..."0123"] });
    const spec = compileSpec(project);
    const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
    if (!r.ok) throw new Error("synthesis failed");
    const sheet = layoutMatrix(project, spec, r.value, drawingOptions(project)).sheets[0] as Sheet;
    expect(texts(sheet)).not.toContain("VLOGIC");
    expect(texts(sheet)).not.toContain("lit");
    expect(sheet.labels.filter((l) => l.role === "part")).toEqual([]);
  });
});
