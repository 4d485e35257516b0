import { describe, expect, it } from "vitest";
import { decoderRefPrefix, designators, withRefPrefix } from "../../../../src/core/matrix/designators.ts";
import { countParts, refRanges } from "../../../../src/core/papers/parts.ts";
import { spiceName } from "../../../../src/core/papers/netlist.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { example } from "../../../support/projects.ts";

describe("decoder designator prefixes", () => {
  it("numbers decoders from 1, and a lone decoder not at all", () => {
    expect(decoderRefPrefix(0, 1)).toBe("");
    expect(decoderRefPrefix(0, 3)).toBe("1");
    expect(decoderRefPrefix(15, 16)).toBe("16");
    expect(() => decoderRefPrefix(3, 3)).toThrow(RangeError);
  });

  it("puts the prefix in front of every designator, the structure and numbers unchanged", async () => {
    const project = example("turntable-position");
    const spec = compileSpec(project);
    const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
    if (!r.ok) throw new Error(r.error.message);
    const plain = designators(spec, r.value, project.electrical);
    const m = withRefPrefix(r.value, "12");
    expect(withRefPrefix(r.value, "")).toBe(r.value);
    const pre = designators(spec, m, project.electrical);
    expect(pre.diodes.map((d) => d.ref)).toEqual(plain.diodes.map((d) => `12${d.ref}`));
    expect(pre.diodes.map((d) => [d.from, d.to])).toEqual(plain.diodes.map((d) => [d.from, d.to]));
    expect(pre.resistors.map((x) => x.ref)).toEqual(plain.resistors.map((x) => `12${x.ref}`));
    expect(pre.drivers.map((d) => [d.transistor, d.display])).toEqual(plain.drivers.map((d) => [`12${d.transistor}`, `12${d.display}`]));
    // The groups of the parts list are the same, their ranges written with the prefix.
    const groups = countParts(pre);
    expect(groups.map((g) => g.refs.length)).toEqual(countParts(plain).map((g) => g.refs.length));
    expect(refRanges(groups[0]?.refs ?? [])).toBe(`12D1-12D${plain.diodes.length}`);
    expect(() => withRefPrefix(m, "3")).toThrow(RangeError);
    expect(() => withRefPrefix(r.value, "A")).toThrow(RangeError);
  });

  it("writes a prefixed designator for SPICE with its element letter in front", () => {
    expect(spiceName("R", "R14")).toBe("R14");
    expect(spiceName("R", "2R14")).toBe("R2R14");
    expect(spiceName("D", "12D3")).toBe("D12D3");
    expect(spiceName("Q", "Q1")).toBe("Q1");
  });
});
