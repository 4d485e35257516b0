import { describe, expect, it } from "vitest";
import { defaultDrawingNumber, drawingOptions } from "../../../src/render/drawingOptions.ts";
import { makeProject } from "../../support/projects.ts";

describe("drawing options", () => {
  const p = makeProject({ title: "Bench", counter: { states: 2 }, display: { cell: "seg7" }, show: ["1", "2"] });

  it("fills fixed defaults: A4, revision A, no date, drawn by diodeloom", () => {
    expect(drawingOptions(p)).toEqual({
      paper: "a4",
      drawingNumber: defaultDrawingNumber(p),
      revision: "A",
      date: "",
      drawnBy: "diodeloom",
    });
  });

  it("keeps what is given", () => {
    expect(drawingOptions(p, { paper: "letter", date: "2026-01-02", revision: "C" })).toMatchObject({
      paper: "letter",
      date: "2026-01-02",
      revision: "C",
    });
  });

  it("derives the drawing number from the title and texts, the same every time", () => {
    const n = defaultDrawingNumber(p);
    expect(n).toMatch(/^DL-[0-9A-F]{8}$/);
    expect(defaultDrawingNumber(p)).toBe(n);
    const other = makeProject({ title: "Bench", counter: { states: 2 }, display: { cell: "seg7" }, show: ["1", "3"] });
    expect(defaultDrawingNumber(other)).not.toBe(n);
  });
});
