import { describe, expect, it } from "vitest";
import { fail } from "../../../src/core/result/result.ts";
import { solveBudget } from "../../../src/core/budget/budget.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../../src/render/layout.ts";
import { registerNodeWindow } from "../../../src/render/nodeWindow.ts";
import { allPaperFiles, paperFiles, PAPER_KINDS, type PaperInput } from "../../../src/render/papers.ts";
import { xmlProblem } from "../../support/xmlCheck.ts";
import { sharedDieRoller } from "../../support/budgetFixtures.ts";

registerNodeWindow();

describe("the papers builder", () => {
  const d = sharedDieRoller();
  const options = drawingOptions(d.project);
  const drawing = layoutMatrix(d.project, d.spec, d.matrix, options);
  const base: Omit<PaperInput, "budget"> = { project: d.project, spec: d.spec, matrix: d.matrix, options, drawing };
  const budget = solveBudget(d.project, d.spec, d.matrix);

  it("writes every paper in export's order, with media types, and SVG that parses as XML", () => {
    const files = allPaperFiles({ ...base, budget });
    expect(files.map((f) => f.name)).toEqual([
      "matrix.svg",
      "driver.svg",
      "wiring.csv",
      "wiring.html",
      "budget.json",
      "bom.csv",
      ...d.spec.states.map((s) => `spice/${s}.cir`),
      "project.json",
    ]);
    expect(Object.fromEntries(files.map((f) => [f.name.split("/")[0], f.mediaType]))).toMatchObject({
      "matrix.svg": "image/svg+xml",
      "driver.svg": "image/svg+xml",
      "wiring.csv": "text/csv",
      "wiring.html": "text/html",
      "budget.json": "application/json",
      "bom.csv": "text/csv",
      spice: "text/plain",
      "project.json": "application/json",
    });
    expect(xmlProblem(files[0]!.text)).toBeNull();
    expect(xmlProblem(files[1]!.text)).toBeNull();
    expect(PAPER_KINDS.flatMap((k) => paperFiles({ ...base, budget }, k))).toEqual(files);
  });

  it("holds back the driver sheet, the BOM, the decks and the budget until the budget is there, so they never show a design it then changes", () => {
    for (const kind of ["driver", "bom", "netlists", "budget"] as const)
      expect(paperFiles({ ...base, budget: undefined }, kind)).toEqual([]);
    expect(paperFiles({ ...base, budget: undefined }, "wiring")).toHaveLength(1);
  });

  it("gives a failed budget as its error, and the BOM and decks with the project's values, saying why", () => {
    const failed = fail({ kind: "no-convergence", message: "nominal: no convergence in S3" });
    const [json] = paperFiles({ ...base, budget: failed }, "budget");
    expect(JSON.parse(json!.text)).toEqual({ error: { kind: "no-convergence", message: "nominal: no convergence in S3" } });
    expect(allPaperFiles({ ...base, budget: failed }).map((f) => f.name)).not.toContain("budget.json");
    const [bom] = paperFiles({ ...base, budget: failed }, "bom");
    expect(bom!.text).toMatch(
      /,10k,"emitter resistor, sets the segment current, 5 %, as in the project \(the trim could not be worked out\)"/,
    );
    const [deck] = paperFiles({ ...base, budget: failed }, "netlists");
    expect(deck!.text).toContain("* Emitter resistors as in the project (the trim could not be worked out).");
  });
});
