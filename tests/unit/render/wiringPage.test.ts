import { describe, expect, it } from "vitest";
import { wiringRows } from "../../../src/core/papers/wiringList.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import { wiringPageHtml } from "../../../src/render/wiringPage.ts";
import { makeProject } from "../../support/projects.ts";
import { compileSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesizeDirect } from "../../../src/core/synth/direct.ts";

describe("printable wiring list", () => {
  const project = makeProject({ title: "R&D <rig>", counter: { states: 3 }, display: { cell: "seg7" }, show: ["1", "2", "3"] });
  const spec = compileSpec(project);
  const matrix = synthesizeDirect(spec, 1, "mixed");
  const rows = wiringRows(matrix);

  it("has one table row with an empty tick box per diode, in order, then the checklist", () => {
    const html = wiringPageHtml({ project, matrix, rows, options: drawingOptions(project, { paper: "letter" }), sheetCount: 1 });
    const refs = [...html.matchAll(/<tr><td>\d+<\/td><td><b>(D\d+)<\/b>/g)].map((m) => m[1]);
    expect(refs).toEqual(matrix.diodes.map((d) => d.ref));
    expect(html.match(/<td class="box"><\/td>/g)?.length).toBe(matrix.count + 5);
    expect(html.indexOf("Inspection checklist")).toBeGreaterThan(html.lastIndexOf(`<b>${matrix.diodes[matrix.count - 1]!.ref}</b>`));
    expect(html).toContain("size: letter portrait");
  });

  it("escapes the title", () => {
    const html = wiringPageHtml({ project, matrix, rows, options: drawingOptions(project), sheetCount: 1 });
    expect(html).toContain("R&amp;D &lt;rig&gt;");
    expect(html).not.toContain("<rig>");
  });
});
