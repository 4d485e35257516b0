import { describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../../src/core/budget/budget.ts";
import type { Budget } from "../../../src/core/budget/budgetTypes.ts";
import { designators } from "../../../src/core/matrix/designators.ts";
import type { Label, Sheet } from "../../../src/render/drawingModel.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import { stageSchematic } from "../../../src/render/driverSchematic.ts";
import { layoutDriverSheets } from "../../../src/render/driverSheet.ts";
import { driverSheets } from "../../../src/render/papers.ts";
import { ohmsText } from "../../../src/render/units.ts";
import { directDesign, type Design } from "../../support/budgetFixtures.ts";
import { textProblems } from "../../support/layoutGeometry.ts";
import { makeProject2, showingWith } from "../../support/projects.ts";

function solved(d: Design): Budget {
  const b = solveBudget(d.project, d.spec, d.matrix);
  if (!b.ok) throw new Error(b.error.message);
  return b.value;
}

function sheetsOf(d: Design, budget: Budget | null, paper: "a4" | "a3" | "letter" = "a4"): Sheet[] {
  const design = budget ? budgetDesign(budget) : budgetDesign(solved(d));
  return layoutDriverSheets({
    project: d.project,
    spec: d.spec,
    matrix: d.matrix,
    design,
    options: drawingOptions(d.project, { paper }),
    budget,
  });
}

const texts = (s: Sheet, role?: Label["role"]): string[] =>
  s.labels.filter((l) => role === undefined || l.role === role).map((l) => l.text);

/** Every part name the stage of a kind must draw (docs/electrical-model.md, "The circuit"). */
const KINDS: readonly [string, Record<string, unknown>, readonly string[], readonly string[]][] = [
  ["low-side-switch", { preset: "bench-5v-switch" }, ["Q", "Rb", "Rbe", "Rs", "DS", "Rpd"], ["Re", "Rc"]],
  ["current-sink", { preset: "panel-12v-sink", segment: { seriesResistor: 56 } }, ["Q", "Re", "Rc", "DS", "Rpd"], ["Rs", "Rb", "Rbe"]],
  [
    "emitter-follower",
    { preset: "cathode-5v-follower", driver: { baseResistor: 220 } },
    ["Q", "Rb", "Rs", "DS", "Rpd"],
    ["Re", "Rbe", "Rc"],
  ],
  ["direct", { preset: "line-direct" }, ["Rs", "DS", "Rpd"], ["Q", "Re", "Rb", "Rbe", "Rc"]],
];

describe("the driver-stage sheet", () => {
  for (const [kind, electrical, drawn, absent] of KINDS) {
    it(`draws the ${kind} stage once, with a row per output carrying the design's values`, () => {
      const d = directDesign(kind, showingWith([" 1", "12", " 7"], electrical, 2));
      expect(d.project.electrical.driver.kind).toBe(kind);
      const budget = solved(d);
      const [sheet, ...more] = sheetsOf(d, budget);
      expect(more).toEqual([]);
      if (!sheet) throw new Error("no sheet");
      const parts = texts(sheet, "part");
      // Drawn once: each part name appears exactly once on the stage.
      for (const p of drawn)
        expect(
          parts.filter((t) => t === p),
          p,
        ).toHaveLength(1);
      for (const p of absent) expect(parts, p).not.toContain(p);
      // The tied-on output (2b) hangs from the logic supply, a real net with its tie-on resistor.
      expect(d.matrix.tiedOn).toContain("2b");
      expect(parts.filter((t) => t === "Rt")).toHaveLength(1);
      expect(texts(sheet, "terminal")).toContain(`VLOGIC ${d.project.electrical.logicSupply.volts} V`);
      if (kind === "direct") expect(texts(sheet, "terminal").some((t) => t.startsWith("+VSUP"))).toBe(false);
      else expect(texts(sheet, "terminal")).toContain(`+VSUP ${d.project.electrical.supply.volts} V`);
      // One table row per driven output, with every resistor of its stage as the BOM numbers and values it
      // (the budget's design: the trim where it is applied).
      const design = budgetDesign(budget);
      const all = designators(d.spec, d.matrix, d.project.electrical, design.ohms);
      const table = texts(sheet, "table");
      for (const dr of all.drivers) {
        expect(table).toContain(dr.tiedOn ? `${dr.output} (on)` : dr.output);
        const own = [dr.current, dr.base, dr.baseEmitter, dr.pullDown, dr.tieOn, dr.emitter === null ? null : dr.series];
        for (const r of own) if (r !== null) expect(table).toContain(`${r.ref} ${ohmsText(r.ohms)}`);
        expect(table).toContain(dr.display);
        expect(design.ohms.get(dr.output)).toBe(budget.drivers[dr.output]?.currentResistor.ohms);
      }
      expect(textProblems(sheet)).toEqual([]);
      expect(texts(sheet, "note")).not.toContain("(further notes did not fit)");
      expect(texts(sheet).some((t) => t.startsWith("DANGER"))).toBe(false);
    });
  }

  it("shows the trimmed value, not the project's, where the trim is applied", () => {
    const d = directDesign(
      "12 V sink",
      makeProject2({ counter: { states: 3 }, display: { positions: 1 }, show: ["1", "7", "8"], electrical: { preset: "panel-12v-sink" } }),
    );
    const budget = solved(d);
    const design = budgetDesign(budget);
    const [sheet] = sheetsOf(d, budget);
    const table = texts(sheet as Sheet, "table");
    for (const [o, dr] of Object.entries(budget.drivers)) {
      expect(table).toContain(`${dr.currentResistor.ref} ${ohmsText(design.ohms.get(o) as number)}`);
    }
    if (budget.trim.applied) {
      // At least one output's value differs from the project's 180 Ω, and the sheet shows the new one.
      expect(Object.values(budget.drivers).some((dr) => dr.currentResistor.ohms !== 180)).toBe(true);
    }
  });

  it("carries the hazard note above 60 V DC, and the supply voltage", () => {
    const d = directDesign("hv", showingWith([" 1", "12", " 7"], { preset: "string-hv-sink" }, 2));
    const [sheet] = sheetsOf(d, solved(d));
    const all = texts(sheet as Sheet);
    expect(all).toContain("DANGER: HAZARDOUS VOLTAGE");
    expect(all.join(" ")).toContain("88 V DC, above the 60 V DC limit");
    expect(texts(sheet as Sheet, "terminal")).toContain("+VSUP 80 V");
    expect(textProblems(sheet as Sheet)).toEqual([]);
  });

  it("continues a long table on further sheets, every output once, numbered as one document", () => {
    // Eight positions: 56 outputs, more than the first A4 sheet holds beside the stage.
    const show = ["01234567", "12345678", "23456789", "34567890"];
    const d = directDesign("eight positions", makeProject2({ counter: { states: 4 }, display: { positions: 8 }, show }));
    const budget = solved(d);
    for (const paper of ["a4", "letter", "a3"] as const) {
      const sheets = sheetsOf(d, budget, paper);
      if (paper !== "a3") expect(sheets.length, paper).toBeGreaterThan(1);
      const rows = sheets.flatMap((s) => texts(s, "table").filter((t) => /^\d[a-g]( \(on\))?$/.test(t)));
      const outputs = designators(d.spec, d.matrix, d.project.electrical).drivers.map((x) => (x.tiedOn ? `${x.output} (on)` : x.output));
      expect(rows.sort()).toEqual([...outputs].sort());
      sheets.forEach((s, i) => {
        expect(s.number).toBe(i + 1);
        expect(s.count).toBe(sheets.length);
        expect(texts(s, "title-value")).toContain(`${i + 1} of ${sheets.length}`);
        expect(textProblems(s), `${paper} sheet ${i + 1}`).toEqual([]);
      });
    }
  });

  it("without a budget shows the project's values and says the currents follow", () => {
    const d = directDesign("switch", showingWith(["1", "7"], { preset: "bench-5v-switch" }));
    const [sheet] = driverSheets({
      project: d.project,
      spec: d.spec,
      matrix: d.matrix,
      options: drawingOptions(d.project),
      budget: undefined,
    });
    expect(texts(sheet as Sheet, "table")).toContain("R1 300 Ω");
    expect(texts(sheet as Sheet, "table")).not.toContain("Lit mA");
    expect(texts(sheet as Sheet, "note").join(" ")).toContain("The currents follow when the budget has been worked out.");
  });
});

describe("the driver-stage sheet of a high-side switch", () => {
  it("draws the PNP stage once: the emitter on +VSUP with its arrow pointing in, Rpu and Rbe from the supply, Rs and DS to ground, a tied-on output held down by Rt", () => {
    const project = makeProject2({
      counter: { states: 3, drive: "sink" },
      display: { positions: 2 },
      show: [" 1", "12", " 7"],
      electrical: { preset: "bench-5v-high-side" },
    });
    const d = directDesign("high-side", project);
    const budget = solved(d);
    const [sheet, ...more] = sheetsOf(d, budget);
    expect(more).toEqual([]);
    if (!sheet) throw new Error("no sheet");
    const parts = texts(sheet, "part");
    for (const p of ["Q", "Rb", "Rbe", "Rs", "DS", "Rpu", "Rt"])
      expect(
        parts.filter((t) => t === p),
        p,
      ).toHaveLength(1);
    for (const p of ["Re", "Rc", "Rpd"]) expect(parts, p).not.toContain(p);
    expect(texts(sheet, "terminal")).toContain("+VSUP 5 V");
    // A tied-on output is held down to ground: no logic supply on this sheet.
    expect(texts(sheet, "terminal").some((t) => t.startsWith("VLOGIC"))).toBe(false);
    const table = texts(sheet, "table");
    expect(table).toContain("Rpu");
    const all = designators(d.spec, d.matrix, d.project.electrical, budgetDesign(budget).ohms);
    for (const dr of all.drivers) {
      for (const r of [dr.current, dr.base, dr.baseEmitter, dr.pullDown, dr.tieOn])
        if (r !== null) expect(table).toContain(`${r.ref} ${ohmsText(r.ohms)}`);
    }
    const notes = texts(sheet, "note").join(" ");
    expect(notes).toContain("PNP high-side switch");
    expect(notes).toContain("Active-low lines");
    expect(notes).toContain("small-signal PNP");
    expect(textProblems(sheet)).toEqual([]);
  });

  it("points the PNP's emitter arrow at the base bar, the emitter lead going up to the supply", () => {
    const s = stageSchematic({
      kind: "high-side-switch",
      base: true,
      baseEmitter: true,
      collector: false,
      tieOn: false,
      leds: 1,
      supplyText: "+VSUP 5 V",
      logicText: "VLOGIC 5 V",
    });
    const q = s.ink.circles.find((c) => c.r > 4);
    if (!q) throw new Error("no transistor body");
    const arrow = s.ink.polygons.find((p) => p.filled && p.points.every((pt) => Math.hypot(pt.x - q.at.x, pt.y - q.at.y) < q.r));
    if (!arrow) throw new Error("no emitter arrow");
    // The tip (first point) sits on the base bar, left of the arrow's back, in the upper half (the emitter's).
    const [tip, ...back] = arrow.points;
    expect(tip && back.every((b) => b.x > tip.x)).toBe(true);
    expect(tip && tip.y < q.at.y).toBe(true);
  });
});
