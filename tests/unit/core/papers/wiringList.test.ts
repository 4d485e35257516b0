import { describe, expect, it } from "vitest";
import { projectDesign } from "../../../../src/core/budget/segmentDesign.ts";
import { designators } from "../../../../src/core/matrix/designators.ts";
import { spiceNetlist } from "../../../../src/core/papers/netlist.ts";
import {
  GATE_PULL_UP_HEADING,
  INSPECTION_CHECKLIST,
  NETWORK_HEADING,
  TIE_ON_HEADING,
  WIRING_HEADER,
  networkHeading,
  networkRows,
  tieOnRows,
  wiringCsv,
  wiringRows,
} from "../../../../src/core/papers/wiringList.ts";
import { codedDecoder, codedProject } from "../../../support/codedProjects.ts";
import { verifyLogic } from "../../../../src/core/logic/verifyLogic.ts";
import { tieOnsOf } from "../../../../src/render/papers.ts";
import { wiringPageHtml } from "../../../../src/render/wiringPage.ts";
import { directDesign } from "../../../support/budgetFixtures.ts";
import { showingWith } from "../../../support/projects.ts";
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

describe("wiring list of tied-on outputs", () => {
  it("names each tie-on resistor from the logic supply net VLOGIC to its output line, as the SPICE deck wires it", () => {
    // "1", "12", "7" on two positions: 2b is lit in every state, so it is tied on (no diodes).
    const project = showingWith([" 1", "12", " 7"], { preset: "bench-5v-switch" }, 2);
    const d = directDesign("tied-on", project);
    expect(d.matrix.tiedOn).toEqual(["2b"]);
    const parts = designators(d.spec, d.matrix, project.electrical);
    const tieOns = tieOnRows(parts.drivers);
    expect(tieOns).toEqual([
      { ref: expect.stringMatching(/^R\d+$/), from: "VLOGIC", to: "2b", ohms: project.electrical.counterOutput.resistance },
    ]);
    const records = parseCsv(wiringCsv(wiringRows(d.matrix), tieOns));
    const at = records.findIndex((r) => r[0] === TIE_ON_HEADING);
    expect(records[at - 1]).toEqual([""]);
    expect(records[at + 1]).toEqual(["T1", tieOns[0]!.ref, "VLOGIC", "2b", "", "", ""]);
    // The deck has that resistor between the logic supply's node and the output line, and the supply as a source.
    const deck = spiceNetlist(project, d.spec, d.matrix, 0, projectDesign(project.electrical, d.matrix));
    expect(deck).toMatch(new RegExp(`^${tieOns[0]!.ref} vlogic o2b 470\\b`, "m"));
    expect(deck).toMatch(/^VLOGIC vlogic 0 DC 5\b/m);
    // The printable page and the papers builder carry the same rows.
    const html = wiringPageHtml({
      project,
      matrix: d.matrix,
      rows: wiringRows(d.matrix),
      tieOns,
      options: drawingOptions(project),
      sheetCount: 1,
    });
    expect(html).toContain(`<td>T1</td><td><b>${tieOns[0]!.ref}</b></td><td>470 Ω</td><td>VLOGIC</td><td>2b</td>`);
    expect(tieOnsOf(d)).toEqual(tieOns);
  });
});

describe("wiring list of a coded counter's AND gates", () => {
  it("names each gate's pull-up from VLOGIC to the gate node, as the SPICE deck wires it, on the CSV and the printable page", () => {
    const { project, spec, matrix: built } = codedDecoder(codedProject("binary", "0123456789"));
    const v = verifyLogic(spec, built, { depthLimit: built.depthLimit, policy: built.policy });
    if (!v.ok) throw new Error(v.error.join("\n"));
    const matrix = v.value;
    const parts = designators(spec, matrix, project.electrical);
    const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project));
    const network = networkRows(parts, drawing.placements);
    expect(network.map((n) => [n.ref, n.part, n.from, n.to, n.ohms])).toEqual(
      parts.gates.map((g) => [g.pullUp.ref, "gate pull-up", "VLOGIC", g.gate, project.electrical.gatePullUp]),
    );
    for (const n of network) expect(n.sheet === 1 && /^[A-Z]\d+$/.test(n.zone), `${n.ref} placed`).toBe(true);
    const records = parseCsv(wiringCsv(wiringRows(matrix, drawing.placements), [], network));
    const at = records.findIndex((r) => r[0] === GATE_PULL_UP_HEADING);
    expect(records[at - 1]).toEqual([""]);
    expect(records.slice(at + 1, at + 1 + network.length)).toEqual(
      network.map((n, i) => [`N${i + 1}`, n.ref, "VLOGIC", n.to, "1", n.zone, ""]),
    );
    // The deck joins the same resistor between the logic supply's node and the gate's node.
    const deck = spiceNetlist(project, spec, matrix, 0, projectDesign(project.electrical, matrix));
    for (const n of network) expect(deck).toMatch(new RegExp(`^${n.ref} vlogic ${n.to.toLowerCase()} 4700\\b`, "m"));
    const html = wiringPageHtml({ project, matrix, rows: wiringRows(matrix), network, options: drawingOptions(project), sheetCount: 1 });
    expect(html).toContain(`<h1>${GATE_PULL_UP_HEADING.replace(/'/g, "&#39;")}</h1>`);
    expect(html).toContain(`<td>N1</td><td><b>${network[0]!.ref}</b></td><td>4.7 kΩ</td><td>VLOGIC</td><td>G1</td>`);
  });

  it("heads the rows by what they hold: the gates' pull-ups, a dark-decoded output's network, or both", () => {
    const gate = { ref: "R9", part: "gate pull-up", from: "VLOGIC", to: "G1", ohms: 4700, sheet: 1, zone: "A1" } as const;
    const dark = { ref: "R10", part: "pull-up", from: "VLOGIC", to: "1a", ohms: 4700, sheet: 1, zone: "A2" } as const;
    expect(networkHeading([gate])).toBe(GATE_PULL_UP_HEADING);
    expect(networkHeading([dark])).toBe(NETWORK_HEADING);
    expect(networkHeading([gate, dark])).toBe(`${GATE_PULL_UP_HEADING}. ${NETWORK_HEADING}`);
  });
});
