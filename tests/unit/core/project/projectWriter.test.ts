import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";
import { serializeProject } from "../../../../src/core/project/projectWriter.ts";
import { synthesizeDirect } from "../../../../src/core/synth/direct.ts";
import { projectDoc } from "../../../support/arbitraries.ts";
import { EXAMPLES, example, makeProject } from "../../../support/projects.ts";

function roundTrip(text: string): void {
  const first = parseProject(text);
  if (!first.ok) throw new Error("fixture does not parse");
  const written = serializeProject(first.value);
  const again = parseProject(written);
  expect(again.ok).toBe(true);
  if (!again.ok) return;
  expect(again.value).toEqual(first.value);
  const s1 = compileSpec(first.value);
  const s2 = compileSpec(again.value);
  expect(synthesizeDirect(s2, 1, "mixed")).toEqual(synthesizeDirect(s1, 1, "mixed"));
  // Normalised: writing it again gives the same text.
  expect(serializeProject(again.value)).toBe(written);
}

describe("serializeProject", () => {
  it.each(EXAMPLES)("round-trips the %s example", (name) => {
    roundTrip(serializeProject(example(name)));
  });

  it("round-trips glyph overrides, a dp cell, and electrical overrides", () => {
    const p = makeProject({
      counter: { states: 3 },
      display: { positions: 2, cell: "seg7dp" },
      glyphs: { "7": "abcf", X: ["b", "c", "e", "f", "g", "dp"] },
      show: ["7.1", "X ", "3.3."],
      electrical: { pullDown: 47_000, driver: { emitterResistors: { "1a": 8200 } }, tolerance: { temperatureC: [-10, 60] } },
    });
    roundTrip(serializeProject(p));
    const doc = JSON.parse(serializeProject(p));
    expect(doc.glyphs).toEqual({ "7": ["a", "b", "c", "f"], X: ["b", "c", "e", "f", "g", "dp"] });
    expect(doc.electrical.pullDown).toBe(47_000);
  });

  it("round-trips random projects (fast-check seed 7200)", () => {
    fc.assert(
      fc.property(projectDoc, (doc) => roundTrip(JSON.stringify(doc))),
      { seed: 7200, numRuns: 60 },
    );
  });
});
