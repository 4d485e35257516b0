/**
 * The papers of a dark-decoded project: the parts list, the BOM, the wiring
 * list and the decks carry the pull-ups and the level-shift diodes (or the
 * dividers) under the designators' numbers, with the values the budget
 * sized, and no paper is refused.
 */
import { describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../../src/core/budget/budget.ts";
import { designModel } from "../../../src/core/budget/segmentDesign.ts";
import { designators } from "../../../src/core/matrix/designators.ts";
import { darkOutputs } from "../../../src/core/matrix/matrix.ts";
import { countParts } from "../../../src/core/papers/parts.ts";
import { compileSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../src/core/synth/synthesize.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../../src/render/layout.ts";
import { registerNodeWindow } from "../../../src/render/nodeWindow.ts";
import { allPaperFiles } from "../../../src/render/papers.ts";
import { driverNotes, driverTable } from "../../../src/render/driverSheet.ts";
import { makeProject2 } from "../../support/projects.ts";

registerNodeWindow();

async function papers(darkInput: "level-shift" | "divider") {
  const project = makeProject2({
    counter: { states: 6, drive: "complementary" },
    display: {},
    show: [..."012345"],
    synthesis: { depth: "mixed", decode: "dark", darkInput, timeLimitMs: 5000 },
  });
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  const matrix = r.value;
  const budget = solveBudget(project, spec, matrix);
  if (!budget.ok) throw new Error(budget.error.message);
  const options = drawingOptions(project);
  const drawing = layoutMatrix(project, spec, matrix, options);
  const files = allPaperFiles({ project, spec, matrix, options, drawing, budget });
  const design = budgetDesign(budget.value);
  const parts = designators(spec, matrix, designModel(project.electrical, design), design.ohms);
  return { project, spec, matrix, budget: budget.value, files, parts };
}

const text = (files: { name: string; text: string }[], name: string): string => files.find((f) => f.name === name)?.text ?? "";

describe("papers of a dark-decoded project", () => {
  it("level-shift: every paper; the shift diodes after the matrix diodes, the pull-ups after every other resistor", async () => {
    const { matrix, budget, files, parts, spec, project } = await papers("level-shift");
    expect(files.map((f) => f.name)).toContain("bom.csv");
    expect(files.filter((f) => f.name.startsWith("spice/"))).toHaveLength(spec.states.length);
    const dark = darkOutputs(matrix);
    expect(parts.darkInputs.map((p) => p.output)).toEqual(dark);
    const shift = parts.darkInputs.flatMap((p) => p.shiftDiodes);
    expect(shift[0]).toBe(`D${matrix.count + 1}`);
    expect(shift).toHaveLength(2 * dark.length);
    const lastOther = Math.max(...parts.resistors.filter((r) => r.role !== "pull-up").map((r) => Number(r.ref.slice(1))));
    expect(parts.darkInputs.map((p) => Number(p.pullUp.ref.slice(1)))).toEqual(dark.map((_, i) => lastOther + 1 + i));
    // The values are the budget's.
    expect(parts.darkInputs.every((p) => p.pullUp.ohms === budget.dark?.pullUpOhms)).toBe(true);
    const groups = countParts(parts);
    expect(groups.find((g) => g.kind === "level-shift-diode")?.refs).toEqual(shift);
    expect(groups.find((g) => g.kind === "dark-pull-up")?.refs).toEqual(parts.darkInputs.map((p) => p.pullUp.ref));
    const bom = text(files, "bom.csv");
    expect(bom).toMatch(
      new RegExp(`^${dark.length},${parts.darkInputs[0]?.pullUp.ref}-R\\d+,[\\d.]+k,"pull-up of a dark-decoded output node`, "m"),
    );
    expect(bom).toMatch(new RegExp(`^${shift.length},${shift[0]}-${shift[shift.length - 1]},small-signal silicon,"level-shift diode`, "m"));
    // The wiring list: each pull-up from VLOGIC, then the shift diodes from the node to the driver's input.
    const csv = text(files, "wiring.csv");
    const p0 = parts.darkInputs[0];
    if (p0 === undefined) throw new Error("no dark output");
    // Each with the sheet and zone where the matrix drawing has it, at its column (its pull-up above the matrix, row A or B).
    expect(csv).toMatch(new RegExp(`^N1,${p0.pullUp.ref},VLOGIC,${p0.output},1,[AB]\\d,$`, "m"));
    expect(csv).toMatch(new RegExp(`^N2,${p0.shiftDiodes[0]},${p0.output},${p0.output}/1,1,[A-F]\\d,$`, "m"));
    expect(csv).toMatch(new RegExp(`^N3,${p0.shiftDiodes[1]},${p0.output}/1,${p0.output} in,1,[A-F]\\d,$`, "m"));
    expect(text(files, "wiring.html")).toContain("Dark-decoded outputs&#39; input network");
    // The driver sheet's table gives each dark-decoded output its pull-up and shift diodes, after the output.
    const table = driverTable(parts.drivers, budget, parts.darkInputs);
    expect(table.head.slice(0, 3)).toEqual(["Output", "Ru", "Dl"]);
    const row = table.rows.find((x) => x.output === p0.output);
    expect(row?.cells.slice(1, 3)).toEqual([`${p0.pullUp.ref} ${p0.pullUp.ohms / 1000} kΩ`, p0.shiftDiodes.join(" ")]);
    expect(text(files, "driver.svg")).toContain(p0.pullUp.ref);
    expect(driverNotes(project.electrical, [], budgetDesign(budget), true, parts.darkInputs).join(" ")).toMatch(/level-shift diodes Dl/);
    // The budget's JSON has the dark section, every state at each of the three corners.
    const json = JSON.parse(text(files, "budget.json")) as { dark: { states: unknown[]; passes: boolean } };
    expect(json.dark.states).toHaveLength(3 * spec.states.length);
    expect(json.dark.passes).toBe(true);
  });

  it("divider: its upper resistors after the pull-ups, its lower resistor in the pull-down's place", async () => {
    const { matrix, budget, files, parts } = await papers("divider");
    const dark = darkOutputs(matrix);
    expect(parts.darkInputs.every((p) => p.shiftDiodes.length === 0)).toBe(true);
    const d = budget.dark;
    if (d === null) throw new Error("no dark section");
    expect(d.input).toBe("divider");
    for (const p of parts.darkInputs) {
      expect(p.divider?.ohms).toBe(d.dividerOhms);
      expect(p.dividerLower?.ohms).toBe(d.bleedOhms);
      const driver = parts.drivers.find((x) => x.output === p.output);
      expect(driver?.pullDown.ref).toBe(p.dividerLower?.ref);
    }
    expect(Number(parts.darkInputs[0]?.divider?.ref.slice(1))).toBe(Number(parts.darkInputs[dark.length - 1]?.pullUp.ref.slice(1)) + 1);
    expect(text(files, "bom.csv")).toMatch(/divider from a dark-decoded output node/);
    const deck = text(files, "spice/S0.cir");
    const p0 = parts.darkInputs[0];
    expect(deck).toContain(`${p0?.divider?.ref} o${p0?.output} i${p0?.output} ${d.dividerOhms}`);
    expect(deck).toContain(`${p0?.dividerLower?.ref} i${p0?.output} 0 ${d.bleedOhms}`);
  });
});
