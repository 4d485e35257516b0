import { describe, expect, it } from "vitest";
import { INSPECTION_CHECKLIST, WIRING_HEADER, wiringCsv, wiringRows } from "../../../../src/core/papers/wiringList.ts";
import { drawingOptions } from "../../../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../../../src/render/layout.ts";
import { dieRollerShared, directExample } from "../../../support/sharedMatrix.ts";
import { parseCsv } from "../../../support/csvRead.ts";

describe("wiring list", () => {
  for (const [name, make] of [
    ["hex monitor, direct", () => directExample("relay-hex-monitor")],
    ["die roller with buses and a link", dieRollerShared],
  ] as const) {
    it(`has one CSV row per diode of the ${name}, in assembly order, with its place on the drawing`, () => {
      const { project, spec, matrix } = make();
      const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project));
      const records = parseCsv(wiringCsv(wiringRows(matrix, drawing.placements)));
      expect(records[0]).toEqual([...WIRING_HEADER]);
      const rows = records.slice(1, 1 + matrix.diodes.length);
      expect(rows.map((r) => [r[1], r[2], r[3]])).toEqual(matrix.diodes.map((d) => [d.ref, d.from, d.to]));
      rows.forEach((r, i) => {
        expect(r[0]).toBe(String(i + 1));
        const sheet = drawing.sheets[Number(r[4]) - 1]!;
        const symbol = sheet.diodes.find((d) => d.ref === r[1]);
        expect(symbol, `${r[1]} is on sheet ${r[4]}`).toBeDefined();
        expect(r[5]).toMatch(/^[A-Z]\d+$/);
        expect(r[6]).toBe("");
      });
      // Assembly order: counter lines in state order before any bus or link row.
      const stateOf = (from: string): number => (spec.states.includes(from) ? spec.states.indexOf(from) : 1e9);
      const order = matrix.diodes.map((d) => stateOf(d.from));
      expect(order).toEqual([...order].sort((a, b) => a - b));
      // Then a blank record and the checklist: polarity, joints, no bridges.
      const tail = records.slice(1 + matrix.diodes.length);
      expect(tail[0]).toEqual([""]);
      expect(tail[1]?.[0]).toBe("Inspection checklist");
      expect(tail.slice(2).map((r) => r[1])).toEqual(INSPECTION_CHECKLIST.map((c) => c.item));
      expect(tail.slice(2).map((r) => r[1])).toEqual(expect.arrayContaining(["Polarity", "Joints", "No bridges"]));
    });
  }

  it("leaves sheet and zone empty when there is no drawing", () => {
    const { matrix } = directExample("die-roller");
    const rows = wiringRows(matrix);
    expect(rows[0]).toEqual({ step: 1, ref: "D1", from: "S0", to: "1c", sheet: null, zone: "" });
    expect(parseCsv(wiringCsv(rows))[1]).toEqual(["1", "D1", "S0", "1c", "", "", ""]);
  });
});
