/**
 * Sheet sizes, frame and title-block fields against their sources
 * (docs/sources.md, "Drawings and shop papers").
 */
import { describe, expect, it } from "vitest";
import { drawingOptions } from "../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../src/render/layout.ts";
import { FRAME_MM, PAPER_MM, sheetFrame } from "../../src/render/sheetFrame.ts";
import { directExample } from "../support/sharedMatrix.ts";

describe("drawing sheets", () => {
  it("uses A4 210 x 297 mm (source: ISO 216) and Letter 8.5 x 11 in (source: US Letter, 25.4 mm per inch)", () => {
    expect(PAPER_MM.a4).toEqual({ w: 210, h: 297 });
    expect(PAPER_MM.letter.w).toBeCloseTo(8.5 * 25.4, 9);
    expect(PAPER_MM.letter.h).toBeCloseTo(11 * 25.4, 9);
  });

  it("draws the frame 10 mm in from the paper edge (source: frame at least 10 mm on A4-A2)", () => {
    expect(FRAME_MM).toBeGreaterThanOrEqual(10);
    for (const paper of ["a4", "letter"] as const) {
      const f = sheetFrame(paper, "landscape");
      const frame = f.rects[0]!.box;
      expect(frame.x).toBe(FRAME_MM);
      expect(frame.y).toBe(FRAME_MM);
      expect(f.widthMm - (frame.x + frame.w)).toBeCloseTo(FRAME_MM, 9);
      expect(f.heightMm - (frame.y + frame.h)).toBeCloseTo(FRAME_MM, 9);
    }
  });

  it("fills the ISO 7200 fields that apply: title, identification number, revision, date of issue, sheet, creator, approver, document type (source: ISO 7200 field list)", () => {
    const { project, spec, matrix } = directExample("die-roller");
    const sheet = layoutMatrix(project, spec, matrix, drawingOptions(project, { date: "2026-12-01", drawnBy: "A. Builder" })).sheets[0]!;
    const fields = sheet.labels.filter((l) => l.role === "title-field").map((l) => l.text);
    expect(fields).toEqual([
      "Title",
      "Drawing number",
      "Rev.",
      "Date of issue",
      "Document type",
      "Sheet",
      "Drawn by",
      "Approved",
      "Diodes",
    ]);
    const values = sheet.labels.filter((l) => l.role === "title-value").map((l) => l.text);
    expect(values).toEqual(expect.arrayContaining([project.title, "A", "2026-12-01", "1 of 1", "A. Builder", String(matrix.count)]));
  });
});
