import { describe, expect, it } from "vitest";
import { BOM_HEADER, bomCsv, bomLines } from "../../../../src/core/papers/bom.ts";
import { formatMilliamps } from "../../../../src/core/papers/parts.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesizeDirect } from "../../../../src/core/synth/direct.ts";
import { showing } from "../../../support/projects.ts";
import { dieRollerShared, directExample } from "../../../support/sharedMatrix.ts";
import { parseCsv } from "../../../support/csvRead.ts";

/** Expands "D1-D3, D5" back into designators. */
function expand(ranges: string): string[] {
  if (ranges === "") return [];
  return ranges.split(", ").flatMap((part) => {
    const [a, b] = part.split("-");
    if (b === undefined) return [a!];
    const [, prefix, lo] = /^([A-Z]+)(\d+)$/.exec(a!)!;
    const hi = Number(/^[A-Z]+(\d+)$/.exec(b)![1]);
    return Array.from({ length: hi - Number(lo) + 1 }, (_, i) => `${prefix}${Number(lo) + i}`);
  });
}

describe("BOM", () => {
  const cases = {
    "hex monitor": () => directExample("relay-hex-monitor"),
    "die roller with buses": dieRollerShared,
    "tied-on segment": () => {
      const project = showing([" 1", "12"], 2);
      const spec = compileSpec(project);
      return { project, spec, matrix: synthesizeDirect(spec, 1, "mixed") };
    },
  };
  for (const [name, make] of Object.entries(cases)) {
    it(`gives each part of the ${name} one line whose quantity equals its number of designators`, () => {
      const { project, spec, matrix } = make();
      const records = parseCsv(bomCsv(bomLines(project, spec, matrix)));
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
      expect(values).toContain("NPN");
      expect(all.some((r) => r.startsWith("DS"))).toBe(true);
    });
  }

  it("prints ranges such as D1-D49 and the trimmed emitter values when given", () => {
    const { project, spec, matrix } = directExample("relay-hex-monitor");
    const lines = bomLines(project, spec, matrix);
    expect(lines[0]).toMatchObject({ quantity: 78, references: "D1-D78" });
    const trim = new Map(spec.outputs.map((o, i) => [o, i < 3 ? 8200 : 12_000]));
    const trimmed = bomLines(project, spec, matrix, trim).filter((l) => l.description.startsWith("emitter resistor"));
    expect(trimmed.map((l) => [l.quantity, l.value])).toEqual([
      [3, "8.2k"],
      [4, "12k"],
    ]);
    expect(trimmed.every((l) => l.description.includes("trimmed"))).toBe(true);
  });
});

describe("BOM wording", () => {
  it("prints currents without binary noise", () => {
    const { project, spec, matrix } = directExample("relay-hex-monitor");
    const strings = bomLines(project, spec, matrix).find((l) => l.refs[0] === "DS1")!;
    expect(strings.description).toContain(" 0.14 mA");
    expect(formatMilliamps(0.00014)).toBe("0.14");
    expect(formatMilliamps(0.1)).toBe("100");
  });
});
