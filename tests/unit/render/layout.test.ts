import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../src/core/spec/decodeSpec.ts";
import { buildMatrix, type DiodeMatrix } from "../../../src/core/matrix/matrix.ts";
import type { Project } from "../../../src/core/project/project.ts";
import type { DecodeSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesizeDirect } from "../../../src/core/synth/direct.ts";
import type { Segment, Sheet } from "../../../src/render/drawingModel.ts";
import { designators } from "../../../src/core/matrix/designators.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../../src/render/layout.ts";
import { PAPER_MM, FRAME_MM } from "../../../src/render/sheetFrame.ts";
import { makeProject } from "../../support/projects.ts";
import { arms, pieces, samePoint, stubProblems, textProblems, touches } from "../../support/layoutGeometry.ts";
import { dieRollerShared, directExample } from "../../support/sharedMatrix.ts";
import { codedDecoder, codedProject } from "../../support/codedProjects.ts";
import { logicMatrix } from "../../../src/core/logic/logicMatrix.ts";

/** 40 states on three positions: too big for one sheet. */
function bigProject(): { project: Project; spec: DecodeSpec; matrix: DiodeMatrix } {
  const texts = Array.from({ length: 40 }, (_, k) => String(100 + k * 7).slice(-3));
  const project = makeProject({ title: "Big", counter: { states: 40 }, display: { positions: 3, cell: "seg7dp" }, show: texts });
  const spec = compileSpec(project);
  return { project, spec, matrix: synthesizeDirect(spec, 1, "mixed") };
}

/** Ten states on six positions: too wide for one sheet. */
function wideProject(): { project: Project; spec: DecodeSpec; matrix: DiodeMatrix } {
  const texts = Array.from({ length: 10 }, (_, k) => String(123456 + k * 111111).slice(-6));
  const project = makeProject({ title: "Wide", counter: { states: 10 }, display: { positions: 6, cell: "seg7dp" }, show: texts });
  const spec = compileSpec(project);
  return { project, spec, matrix: synthesizeDirect(spec, 1, "mixed") };
}

const cases: Record<string, () => { project: Project; spec: DecodeSpec; matrix: DiodeMatrix; paper?: "a4" | "letter" }> = {
  "hex monitor, direct": () => directExample("relay-hex-monitor"),
  "turntable, direct, on Letter": () => ({ ...directExample("turntable-position"), paper: "letter" }),
  "die roller with two buses and a link": dieRollerShared,
  "40 states on three positions": bigProject,
  "10 states on six positions": wideProject,
  "BCD counter's two-level decoder": () => codedDecoder(codedProject("binary", "0123456789")),
  "gates feeding a bus node and a link (hand-made)": () => {
    const project = codedProject("binary", "0123");
    const spec = compileSpec(project);
    const plan = {
      gates: [
        ["nQ0", "nQ1"],
        ["Q0", "Q1"],
      ],
      edges: [
        { from: { gate: 0 }, to: "B1" },
        { from: { gate: 1 }, to: "B1" },
        { from: { node: "Q1" }, to: "B1" },
        { from: { node: "B1" }, to: "1a" },
        { from: { node: "B1" }, to: "1d" },
        { from: { node: "nQ0" }, to: "1e" },
        { from: { node: "1e" }, to: "1f" },
      ],
    };
    const matrix = logicMatrix(spec, plan, { lowerBound: null, optimal: false, depthLimit: 3, policy: "mixed", method: "heuristic" });
    return { project, spec, matrix };
  },
  "binary counter's decoder of 00-59, several sheets": () =>
    codedDecoder(
      makeProject({
        title: "Minutes",
        counter: { states: 60, code: "binary" },
        display: { positions: 2 },
        show: Array.from({ length: 60 }, (_, k) => String(k).padStart(2, "0")),
      }),
    ),
};

describe.each(Object.entries(cases))("layout of the %s", (_, make) => {
  const { project, spec, matrix, paper } = make();
  const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project, { paper: paper ?? "a4" }));
  const sheets = drawing.sheets;

  it("draws every diode reference exactly once, as a symbol and as a label", () => {
    const symbols = sheets.flatMap((s) => s.diodes.map((d) => d.ref)).sort();
    const labels = sheets.flatMap((s) => s.labels.filter((l) => l.role === "diode-ref").map((l) => l.text)).sort();
    const refs = matrix.diodes.map((d) => d.ref).sort();
    expect(symbols).toEqual(refs);
    expect(labels).toEqual(refs);
    // The placements: every diode's, and every AND gate's pull-up's (drawn at the top of its column).
    const pullUps = designators(spec, matrix, project.electrical).gates.map((g) => g.pullUp.ref);
    expect([...drawing.placements.keys()].sort()).toEqual([...refs, ...pullUps].sort());
  });

  it("puts every diode symbol on the crossing of its own row and column, cathode bar toward the driven line", () => {
    const gates = new Set(matrix.gates.map((g) => g.ref));
    for (const sheet of sheets) {
      const wires = sheet.segments.filter((s) => s.net !== undefined);
      for (const d of sheet.diodes) {
        const m = matrix.diodes.find((x) => x.ref === d.ref)!;
        expect([d.from, d.to]).toEqual([m.from, m.to]);
        // An AND gate's input diode is drawn reversed: anode on the gate's column, cathode on the stage line's row.
        const gateInput = gates.has(m.from) && matrix.lines.includes(m.to);
        expect(d.reversed === true).toBe(gateInput);
        const [rowNet, rowTap, colNet, colTap] = gateInput ? [d.to, d.cathode, d.from, d.anode] : [d.from, d.anode, d.to, d.cathode];
        const row = wires.find((w) => w.net === rowNet && w.a.y === w.b.y && touches(rowTap, w) > 0);
        const column = wires.find((w) => w.net === colNet && w.a.x === w.b.x && touches(colTap, w) > 0);
        expect(row, `${d.ref}: no row of ${rowNet} at its tap`).toBeDefined();
        expect(column, `${d.ref}: no column of ${colNet} at its tap`).toBeDefined();
        // The crossing is where that row and that column meet, and it lies on both.
        expect(d.crossing.y).toBeCloseTo(row!.a.y, 9);
        expect(d.crossing.x).toBeCloseTo(column!.a.x, 9);
        expect(touches(d.crossing, row!)).toBeGreaterThan(0);
        expect(touches(d.crossing, column!)).toBeGreaterThan(0);
        // The symbol lies in the quadrant between its two taps, close to the crossing.
        expect(d.box.x + d.box.w).toBeLessThanOrEqual(d.crossing.x + 1);
        expect(d.box.y).toBeGreaterThanOrEqual(d.crossing.y - 1);
        const barMid = { x: (d.bar[0].x + d.bar[1].x) / 2, y: (d.bar[0].y + d.bar[1].y) / 2 };
        const baseMid = { x: (d.triangle[0].x + d.triangle[1].x) / 2, y: (d.triangle[0].y + d.triangle[1].y) / 2 };
        const toCathode = (p: { x: number; y: number }): number => Math.hypot(p.x - d.cathode.x, p.y - d.cathode.y);
        expect(toCathode(barMid)).toBeLessThan(toCathode(baseMid));
        expect(samePoint(d.triangle[2], barMid)).toBe(true);
      }
    }
  });

  it("puts junction dots exactly where three or more arms of one net meet", () => {
    for (const sheet of sheets) {
      const all = pieces(sheet);
      for (const dot of sheet.dots)
        expect(arms(dot.at, dot.net, all), `dot of ${dot.net} at ${dot.at.x},${dot.at.y}`).toBeGreaterThanOrEqual(3);
      for (const p of all) {
        for (const end of [p.a, p.b]) {
          if (arms(end, p.net, all) >= 3) {
            expect(
              sheet.dots.some((d) => d.net === p.net && samePoint(d.at, end)),
              `missing dot of ${p.net} at ${end.x},${end.y}`,
            ).toBe(true);
          }
        }
      }
    }
  });

  it("never lets a wire end on another net's wire, so only dots mean joints", () => {
    for (const sheet of sheets) {
      const all = pieces(sheet);
      for (const p of all) {
        for (const end of [p.a, p.b]) {
          const foreign = all.find((q) => q.net !== p.net && touches(end, q) > 0);
          expect(foreign, `${p.net} ends on ${foreign?.net} at ${end.x},${end.y}`).toBeUndefined();
        }
      }
    }
  });

  it("leaves no stub of a wire at a sheet edge", () => {
    for (const sheet of sheets) expect(stubProblems(sheet)).toEqual([]);
  });

  it("keeps texts apart and off the symbols", () => {
    for (const sheet of sheets) expect(textProblems(sheet)).toEqual([]);
  });

  it("keeps everything inside the 10 mm frame", () => {
    const p = PAPER_MM[paper ?? "a4"];
    for (const sheet of sheets) {
      expect([sheet.widthMm, sheet.heightMm]).toEqual(sheet.orientation === "landscape" ? [p.h, p.w] : [p.w, p.h]);
      const inside = (x: number, y: number): boolean =>
        x >= FRAME_MM - 1e-9 && y >= FRAME_MM - 1e-9 && x <= sheet.widthMm - FRAME_MM + 1e-9 && y <= sheet.heightMm - FRAME_MM + 1e-9;
      for (const s of sheet.segments) expect(inside(s.a.x, s.a.y) && inside(s.b.x, s.b.y)).toBe(true);
      for (const l of sheet.labels) expect(inside(l.box.x, l.box.y) && inside(l.box.x + l.box.w, l.box.y + l.box.h), l.text).toBe(true);
    }
  });

  it("numbers the sheets k of n in the title block", () => {
    sheets.forEach((s: Sheet, i) => {
      expect(s.number).toBe(i + 1);
      expect(s.labels.some((l) => l.role === "title-value" && l.text === `${i + 1} of ${sheets.length}`)).toBe(true);
      expect(s.labels.some((l) => l.role === "title-value" && l.text === String(matrix.count))).toBe(true);
      expect(s.labels.some((l) => l.role === "note" && l.text.includes("Band = cathode = bar on the symbol"))).toBe(true);
    });
  });

  it("is the same every time", () => {
    const again = layoutMatrix(project, spec, matrix, drawingOptions(project, { paper: paper ?? "a4" }));
    expect(again.sheets).toEqual(drawing.sheets);
  });
});

/** The sheet numbers a continuation mark names: `sh.4` or `sh.4,7`. */
function sheetsOfMark(text: string): number[] {
  const m = /^sh\.(\d+(?:,\d+)*)$/.exec(text);
  if (!m) throw new Error(`not a continuation mark: ${text}`);
  return (m[1] ?? "").split(",").map(Number);
}

/** The nets of the wires that end at a sheet's continuation marks, with the sheets each mark names. */
function marksWithNets(sheet: Sheet): { net: string; to: number[] }[] {
  const wires = sheet.segments.filter((w) => w.net !== undefined);
  return sheet.polygons.map((arrow, i) => {
    const mark = sheet.labels.filter((l) => l.role === "continuation")[i]!;
    // The arrow's tip touches its wire's cut end, on the wire's line.
    const tip = arrow.points[1]!;
    const wire = wires.find((w) => (w.a.y === w.b.y ? Math.abs(w.a.y - tip.y) < 1e-6 : Math.abs(w.a.x - tip.x) < 1e-6) && near(w, tip));
    return { net: wire?.net ?? "?", to: sheetsOfMark(mark.text) };
  });
}

function near(w: { a: { x: number; y: number }; b: { x: number; y: number } }, p: { x: number; y: number }): boolean {
  const d = Math.min(Math.hypot(w.a.x - p.x, w.a.y - p.y), Math.hypot(w.b.x - p.x, w.b.y - p.y));
  return d < 3;
}

describe("sheets that are never empty (lap timer 00-59, heuristic matrix with 14 buses)", async () => {
  const { synthesize, synthSettings } = await import("../../../src/core/synth/synthesize.ts");
  const texts = Array.from({ length: 60 }, (_, k) => String(k).padStart(2, "0"));
  const project = makeProject({ title: "Lap timer", counter: { states: 60 }, display: { positions: 2 }, show: texts });
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
  if (!r.ok) throw new Error(r.error.message);
  const matrix = r.value;
  const drawings = Object.fromEntries(
    (["a4", "a3", "letter"] as const).map((paper) => [paper, layoutMatrix(project, spec, matrix, drawingOptions(project, { paper }))]),
  );

  it.each(["a4", "a3", "letter"] as const)("gives every %s sheet a diode or a driver, never only bare lines and headings", (paper) => {
    // Before, A4 took 9 sheets here, two of them with counter lines and bus headings and no diode.
    for (const sheet of drawings[paper]!.sheets) {
      const drivers = sheet.labels.filter((l) => l.role === "terminal");
      expect(sheet.diodes.length + drivers.length, `sheet ${sheet.number} of ${sheet.count} on ${paper}`).toBeGreaterThan(0);
    }
  });

  it("takes fewer sheets on A3 than on A4", () => {
    expect(drawings["a3"]!.sheets.length).toBeLessThan(drawings["a4"]!.sheets.length);
  });

  it.each(["a4", "a3", "letter"] as const)("marks every cut line on %s with a sheet where the same net shows again", (paper) => {
    const sheets = drawings[paper]!.sheets;
    for (const sheet of sheets) {
      for (const { net, to } of marksWithNets(sheet)) {
        expect(net).not.toBe("?");
        for (const k of to) {
          const there = sheets[k - 1]!;
          expect(
            there.segments.some((w) => w.net === net),
            `${net} on sheet ${sheet.number} is marked sh.${k}, which does not show it`,
          ).toBe(true);
        }
      }
    }
  });

  it("draws every diode and every driver once over the sheets, in either orientation", () => {
    for (const paper of ["a4", "a3", "letter"] as const) {
      const sheets = drawings[paper]!.sheets;
      expect(sheets.flatMap((s) => s.diodes.map((d) => d.ref)).sort()).toEqual(matrix.diodes.map((d) => d.ref).sort());
      const feet = sheets.flatMap((s) => s.labels.filter((l) => l.role === "terminal").map((l) => l.text));
      expect(feet.sort()).toEqual(matrix.outputs.map((_, i) => `Q${i + 1}`).sort());
      for (const s of sheets) {
        expect(stubProblems(s)).toEqual([]);
        expect(textProblems(s)).toEqual([]);
      }
    }
  });
});

describe("layout details", () => {
  it("continues a big matrix over several sheets with marks that name the other sheet", () => {
    const { project, spec, matrix } = bigProject();
    const { sheets } = layoutMatrix(project, spec, matrix, drawingOptions(project));
    expect(sheets.length).toBeGreaterThan(1);
    for (const s of sheets) {
      const marks = s.labels.filter((l) => l.role === "continuation");
      expect(marks.length).toBeGreaterThan(0);
      for (const m of marks) {
        for (const k of sheetsOfMark(m.text)) {
          expect(k).toBeGreaterThanOrEqual(1);
          expect(k).toBeLessThanOrEqual(sheets.length);
          expect(k).not.toBe(s.number);
        }
      }
      expect(s.polygons.length).toBe(marks.length);
    }
  });

  it("leaves no stub when a link row starts at the first column of a later sheet", () => {
    // Find the first output column of a sheet that continues one to its left,
    // then feed exactly that column from a link row.
    const { project, spec, matrix } = wideProject();
    const first = layoutMatrix(project, spec, matrix, drawingOptions(project));
    // Marks of lines coming in from the left are the right-aligned ones.
    const later = first.sheets.find((s) => s.labels.some((l) => l.role === "continuation" && l.anchor === "end"))!;
    expect(later, "the wide project continues to the right").toBeDefined();
    const leftmost = later.segments
      .filter((s) => s.net !== undefined && spec.outputs.includes(s.net) && s.a.x === s.b.x)
      .sort((a, b) => a.a.x - b.a.x)[0]!;
    const source = spec.outputs[spec.outputs.length - 1]!;
    const edges = [...matrix.diodes.map((d) => ({ from: d.from, to: d.to })), { from: source, to: leftmost.net! }];
    const linked = buildMatrix(spec, edges, { lowerBound: null, optimal: false, depthLimit: 2, policy: "mixed", method: "heuristic" });
    const drawing = layoutMatrix(project, spec, linked, drawingOptions(project));
    expect(drawing.sheets.length).toBe(first.sheets.length);
    for (const sheet of drawing.sheets) expect(stubProblems(sheet)).toEqual([]);
  });

  it("gives a bus a column and a row joined at a corner without a dot, and a link row a dot where it taps its output", () => {
    const { project, spec, matrix } = dieRollerShared();
    const [sheet] = layoutMatrix(project, spec, matrix, drawingOptions(project)).sheets;
    const wires = sheet!.segments.filter((s) => s.net === "B1");
    expect(wires.length).toBe(2);
    const column = wires.find((w) => w.a.x === w.b.x)!;
    const row = wires.find((w) => w.a.y === w.b.y)!;
    expect(samePoint(column.b, row.a)).toBe(true);
    expect(sheet!.dots.some((d) => samePoint(d.at, row.a))).toBe(false);
    const link = sheet!.segments.find((s) => s.net === "1ml" && s.a.y === s.b.y)!;
    expect(sheet!.dots.some((d) => d.net === "1ml" && samePoint(d.at, link.a))).toBe(true);
  });

  it("draws an AND gate as a column holding its input diodes, turning at a corner without a dot into the row that feeds the outputs", () => {
    const { project, spec, matrix } = codedDecoder(codedProject("binary", "0123456789"));
    const [sheet] = layoutMatrix(project, spec, matrix, drawingOptions(project)).sheets;
    const gate = matrix.gates[0]!;
    const wires = sheet!.segments.filter((s) => s.net === gate.ref);
    // The column, the row, and the lead of the pull-up above the column's top.
    expect(wires.length).toBe(3);
    const [lead, column] = wires.filter((w) => w.a.x === w.b.x).sort((a, b) => a.a.y - b.a.y) as [Segment, Segment];
    const row = wires.find((w) => w.a.y === w.b.y)!;
    expect(samePoint(lead.b, column.a)).toBe(true);
    expect(samePoint(column.b, row.a)).toBe(true);
    expect(sheet!.dots.some((d) => samePoint(d.at, row.a))).toBe(false);
    const inputs = sheet!.diodes.filter((d) => d.from === gate.ref && matrix.lines.includes(d.to));
    expect(inputs.map((d) => d.to).sort()).toEqual([...gate.inputs].sort());
    for (const d of inputs) expect(d.crossing.x).toBeCloseTo(column.a.x, 9);
    // The stage lines are the first rows, then the gates; the column heads start with the gates.
    const rowLabels = sheet!.labels.filter((l) => l.role === "row").map((l) => l.text);
    expect(rowLabels.slice(0, 2)).toEqual(["Q0", "nQ0"]);
    expect(rowLabels).toContain(`${gate.ref} (gate)`);
    expect(sheet!.labels.some((l) => l.role === "group" && l.text === "AND gates")).toBe(true);
  });

  it("takes the date from its input and leaves the field blank without one", () => {
    const { project, spec, matrix } = directExample("die-roller");
    const dated = layoutMatrix(project, spec, matrix, drawingOptions(project, { date: "2026-03-01" })).sheets[0]!;
    expect(dated.labels.some((l) => l.text === "2026-03-01")).toBe(true);
    const blank = layoutMatrix(project, spec, matrix, drawingOptions(project)).sheets[0]!;
    expect(blank.labels.filter((l) => l.role === "title-field").length).toBe(dated.labels.filter((l) => l.role === "title-field").length);
    expect(blank.labels.filter((l) => l.role === "title-value").length).toBe(
      dated.labels.filter((l) => l.role === "title-value").length - 1,
    );
  });
});
