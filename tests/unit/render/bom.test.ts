import { describe, expect, it } from "vitest";
import { BOM_HEADER, bomCsv, bomLines } from "../../../src/render/bom.ts";
import { projectDesign, type SegmentDesign } from "../../../src/core/budget/segmentDesign.ts";
import { designators } from "../../../src/core/matrix/designators.ts";
import type { DiodeMatrix } from "../../../src/core/matrix/matrix.ts";
import type { Project } from "../../../src/core/project/project.ts";
import type { DecodeSpec } from "../../../src/core/spec/decodeSpec.ts";
import { compileSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesizeDirect } from "../../../src/core/synth/direct.ts";
import { exampleFormat1, showing, showingWith } from "../../support/projects.ts";
import { dieRollerShared, directExample } from "../../support/sharedMatrix.ts";
import { parseCsv } from "../../support/csvRead.ts";
import { expandRefs as expand } from "../../support/partValues.ts";

/** The BOM of a design with the project's own resistors. */
function projectBom(project: Project, spec: DecodeSpec, matrix: DiodeMatrix) {
  const design = projectDesign(project.electrical, matrix, { mode: "off", series: "E24" });
  return bomLines(project.electrical, designators(spec, matrix, project.electrical, design.ohms), design);
}

/** A project with its direct matrix. */
function direct(project: Project) {
  const spec = compileSpec(project);
  return { project, spec, matrix: synthesizeDirect(spec, 1, "mixed") };
}

describe("BOM", () => {
  const cases = {
    "hex monitor": () => directExample("relay-hex-monitor"),
    "die roller with buses": dieRollerShared,
    "tied-on segment": () => direct(showing([" 1", "12"], 2)),
    switch: () => direct(showingWith([" 1", "12"], { preset: "bench-5v-switch" }, 2)),
    follower: () => direct(showingWith([" 1", "12"], { preset: "cathode-5v-follower" }, 2)),
    "direct drive": () => direct(showingWith([" 1", "12"], { preset: "line-direct" }, 2)),
  };
  for (const [name, make] of Object.entries(cases)) {
    it(`gives each part of the ${name} one line whose quantity equals its number of designators`, () => {
      const { project, spec, matrix } = make();
      const records = parseCsv(bomCsv(projectBom(project, spec, matrix)));
      expect(records[0]).toEqual([...BOM_HEADER]);
      const all: string[] = [];
      for (const [qty, refs] of records.slice(1)) {
        const list = expand(refs!);
        expect(Number(qty)).toBe(list.length);
        all.push(...list);
      }
      expect(new Set(all).size).toBe(all.length);
      // Every diode of the matrix is on the BOM, and nothing else starting with D but DS.
      expect(all.filter((r) => /^D\d/.test(r)).sort()).toEqual(matrix.diodes.map((d) => d.ref).sort());
      const values = records.slice(1).map((r) => r[2]);
      expect(values.includes("NPN")).toBe(project.electrical.driver.kind !== "direct");
      expect(all.some((r) => r.startsWith("Q"))).toBe(project.electrical.driver.kind !== "direct");
      expect(all.some((r) => r.startsWith("DS"))).toBe(true);
    });
  }

  it("prints ranges such as D1-D49 and the trimmed emitter values when the design takes them, saying so (format 1's sink)", () => {
    const project = exampleFormat1("relay-hex-monitor");
    const spec = compileSpec(project);
    const matrix = synthesizeDirect(spec, project.synthesis.depthLimit, project.synthesis.policy);
    const lines = projectBom(project, spec, matrix);
    expect(lines[0]).toMatchObject({ quantity: 78, references: "D1-D78" });
    const untrimmed = lines.filter((l) => l.description.startsWith("emitter resistor"));
    expect(untrimmed.map((l) => [l.quantity, l.value])).toEqual([[7, "10k"]]);
    expect(untrimmed.every((l) => l.description.includes("as in the project (the trim is turned off)"))).toBe(true);
    const trim = new Map(spec.outputs.map((o, i) => [o, i < 3 ? 8200 : 12_000]));
    const design: SegmentDesign = { mode: "auto", series: "E24", role: "emitter", trimmed: true, effect: "improves", ohms: trim };
    const trimmed = bomLines(project.electrical, designators(spec, matrix, project.electrical, trim), design).filter((l) =>
      l.description.startsWith("emitter resistor"),
    );
    expect(trimmed.map((l) => [l.quantity, l.value, l.references])).toEqual([
      [3, "8.2k", "R1-R3"],
      [4, "12k", "R4-R7"],
    ]);
    expect(trimmed.every((l) => l.description.includes("trimmed by the budget (E24)"))).toBe(true);
  });
});

describe("BOM wording", () => {
  it("prints currents without binary noise (format 1's 0.14 mA strings)", () => {
    const { project, spec, matrix } = direct(exampleFormat1("relay-hex-monitor"));
    const lines = projectBom(project, spec, matrix);
    const strings = lines.find((l) => l.refs[0] === "DS1")!;
    expect(strings.description).toContain(" 0.14 mA");
    expect(lines[0]?.description).toContain("≥100 mA forward");
  });
});

describe("BOM of each driver kind", () => {
  it("describes a switch's parts with the series resistor setting the current, and the segment's LEDs", () => {
    const { project, spec, matrix } = direct(showingWith(["1", "7"], { preset: "bench-5v-switch" }));
    const lines = projectBom(project, spec, matrix);
    const by = (start: string) => lines.find((l) => l.description.startsWith(start));
    expect(by("segment series resistor")).toMatchObject({ value: "300" });
    expect(by("segment series resistor")?.description).toContain("sets the segment current");
    expect(by("base resistor")).toMatchObject({ value: "3.3k" });
    expect(by("base-emitter resistor")).toMatchObject({ value: "47k" });
    expect(by("segment driver (low-side switch)")?.description).toContain("Vce(max) ≥ 40 V");
    expect(by("segment, one LED")).toMatchObject({ value: "1 LED" });
    expect(by("holds an always-lit segment on, from the logic supply (5 V)")).toBeDefined();
  });
});
