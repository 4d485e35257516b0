import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../src/core/spec/decodeSpec.ts";
import { synthesizeDirect } from "../../../src/core/synth/direct.ts";
import { drawingOptions } from "../../../src/render/drawingOptions.ts";
import { layoutMatrix } from "../../../src/render/layout.ts";
import { SVG } from "@svgdotjs/svg.js";
import { drawSheet } from "../../../src/render/drawSheet.ts";
import { registerNodeWindow } from "../../../src/render/nodeWindow.ts";
import { sheetSvgText, xmlText } from "../../../src/render/sheetSvg.ts";
import { makeProject } from "../../support/projects.ts";
import { dieRollerShared, directExample } from "../../support/sharedMatrix.ts";
import { xmlProblem } from "../../support/xmlCheck.ts";

describe("the strict XML check itself", () => {
  it("accepts well-formed documents", () => {
    expect(xmlProblem('<?xml version="1.0"?>\n<a x="1"><b/>t &amp; &#65; &#x42;<!-- c --></a>\n')).toBeNull();
  });
  it.each([
    ["<a><b></a></b>", "misnested"],
    ["<a>1 < 2</a>", "raw <"],
    ["<a>R&D</a>", "bare &"],
    ['<a x="1" x="2"/>', "duplicate attribute"],
    ["<a x=1/>", "unquoted attribute"],
    ['<a x="<"/>', "< in attribute"],
    ["<a/><b/>", "two roots"],
    ["<a>", "unclosed"],
    ["text<a/>", "text outside root"],
    ["<!DOCTYPE a><a/>", "doctype"],
    ["<a>&nbsp;</a>", "undeclared entity"],
  ])("rejects %s (%s)", (doc) => {
    expect(xmlProblem(doc)).not.toBeNull();
  });
});

registerNodeWindow();

describe("rendered sheets", () => {
  const cases = {
    "hex monitor (direct)": directExample("relay-hex-monitor"),
    "turntable (direct)": directExample("turntable-position"),
    "die roller with buses and a link": dieRollerShared(),
  };
  for (const [name, { project, spec, matrix }] of Object.entries(cases)) {
    it(`every SVG sheet of the ${name} parses as XML and draws every diode`, () => {
      const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project));
      for (const sheet of drawing.sheets) {
        const svg = sheetSvgText(sheet);
        expect(xmlProblem(svg)).toBeNull();
        expect(svg).toContain('viewBox="0 0 297 210"');
        expect(svg.match(/data-ref="D\d+"/g)?.length).toBe(sheet.diodes.length);
      }
    });
  }

  it("writes the element tree as svgdom's own XML markup would, so the command line's files did not change", () => {
    for (const { project, spec, matrix } of Object.values(cases)) {
      for (const sheet of layoutMatrix(project, spec, matrix, drawingOptions(project)).sheets) {
        const root = SVG();
        drawSheet(root, sheet);
        expect(xmlText(root.node)).toBe(root.svg());
        root.remove();
      }
    }
  });

  it("writes a no-break space as the character itself, never as an HTML entity", () => {
    const root = SVG();
    root.plain("a\u00a0b & <c>");
    expect(xmlText(root.node)).toContain("<text>a\u00a0b &amp; &lt;c&gt;</text>");
    expect(xmlProblem(xmlText(root.node))).toBeNull();
    root.remove();
  });

  it("escapes markup characters in the title and texts", () => {
    const project = makeProject({
      title: `R&D <"bench"> 'rig'`,
      counter: { states: 2 },
      display: { cell: "seg7" },
      show: ["1", "7"],
    });
    const spec = compileSpec(project);
    const drawing = layoutMatrix(project, spec, synthesizeDirect(spec, 1, "mixed"), drawingOptions(project));
    const svg = sheetSvgText(drawing.sheets[0]!);
    expect(xmlProblem(svg)).toBeNull();
    // Spaces are written as no-break spaces so that SVG keeps them.
    expect(svg).toContain("R&amp;D\u00a0&lt;&quot;bench&quot;&gt;");
  });

  it("renders Letter sheets at Letter size", () => {
    const { project, spec, matrix } = directExample("relay-hex-monitor");
    const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project, { paper: "letter" }));
    const svg = sheetSvgText(drawing.sheets[0]!);
    expect(svg).toContain('width="279.4mm" height="215.9mm"');
    expect(xmlProblem(svg)).toBeNull();
  });
});
