import { describe, expect, it } from "vitest";
import { notesBlock, notesHeight, sheetFrame, titleBlock, zoneOf } from "../../../src/render/sheetFrame.ts";
import { textProblems } from "../../support/layoutGeometry.ts";
import type { Sheet } from "../../../src/render/drawingModel.ts";

function asSheet(labels: Sheet["labels"], widthMm = 297, heightMm = 210): Sheet {
  return {
    number: 1,
    count: 1,
    paper: "a4",
    orientation: "landscape",
    widthMm,
    heightMm,
    segments: [],
    polygons: [],
    rects: [],
    circles: [],
    diodes: [],
    dots: [],
    labels,
  };
}

describe("sheet frame", () => {
  it("names zones by row letter and column number, from the top left", () => {
    const { zones } = sheetFrame("a4", "landscape");
    expect(zoneOf(zones, { x: zones.area.x + 1, y: zones.area.y + 1 })).toBe("A1");
    expect(zoneOf(zones, { x: zones.area.x + zones.area.w - 1, y: zones.area.y + zones.area.h - 1 })).toBe(
      `${String.fromCharCode(64 + zones.rows)}${zones.columns}`,
    );
  });

  it("sets the zone marks apart from each other", () => {
    const f = sheetFrame("letter", "portrait");
    expect(textProblems(asSheet(f.labels, f.widthMm, f.heightMm))).toEqual([]);
  });

  it("cuts a long title to fit the title block", () => {
    const tb = titleBlock(
      {
        title: "word ".repeat(80),
        drawingNumber: "DL-1",
        revision: "A",
        date: "",
        drawnBy: "me",
        documentType: "x",
        extra: ["Diodes", "1"],
      },
      1,
      1,
      { x: 280, y: 190 },
    );
    const titleLines = tb.labels.filter((l) => l.role === "title-value" && l.text.startsWith("word"));
    expect(titleLines.length).toBe(2);
    expect(titleLines[1]!.text.endsWith("...")).toBe(true);
    for (const l of tb.labels) expect(l.box.x + l.box.w).toBeLessThanOrEqual(280);
    expect(textProblems(asSheet(tb.labels))).toEqual([]);
  });

  it("gives the notes the height they ask for, and says so when they are cut", () => {
    const notes = ["one two three ".repeat(20), "four"];
    const h = notesHeight(notes, 100);
    const full = notesBlock(notes, { x: 0, y: 0, w: 100, h });
    expect(full.labels.some((l) => l.text.includes("did not fit"))).toBe(false);
    expect(full.labels.some((l) => l.text === "2. four")).toBe(true);
    const cut = notesBlock(notes, { x: 0, y: 0, w: 100, h: h / 2 });
    expect(cut.labels[cut.labels.length - 1]!.text).toContain("did not fit");
  });
});
