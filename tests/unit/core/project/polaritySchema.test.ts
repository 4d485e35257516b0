import { describe, expect, it } from "vitest";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";
import { serializeProject } from "../../../../src/core/project/projectWriter.ts";
import { checkSynthesisOverrides } from "../../../../src/core/project/synthesisSchema.ts";

const file = (counter: Record<string, unknown>, synthesis: Record<string, unknown>, electrical: Record<string, unknown> = {}) =>
  JSON.stringify({
    schema: "diodeloom/project@2",
    counter: { states: 4, ...counter },
    display: {},
    show: ["0", "1", "2", "3"],
    synthesis,
    electrical,
  });

const problems = (text: string) => {
  const r = parseProject(text);
  return r.ok ? [] : r.error;
};

describe("counter.drive and synthesis.decode", () => {
  it("reads every drive and decode that has a circuit, and writes them back", () => {
    for (const [drive, decode] of [
      ["source", "lit"],
      ["sink", "dark"],
      ["complementary", "lit"],
      ["complementary", "dark"],
      ["complementary", "either"],
    ] as const) {
      const r = parseProject(file({ drive }, { decode, darkInput: "divider" }));
      expect(r.ok, `${drive}/${decode}`).toBe(true);
      if (!r.ok) continue;
      expect(r.value.counter.drive).toBe(drive);
      expect(r.value.synthesis.decode).toBe(decode);
      expect(r.value.synthesis.darkInput).toBe("divider");
      const again = parseProject(serializeProject(r.value));
      expect(again.ok && again.value).toEqual(r.value);
    }
  });

  it("defaults to source drive, lit decode and level-shift diodes", () => {
    const r = parseProject(file({}, {}));
    expect(r.ok && [r.value.counter.drive, r.value.synthesis.decode, r.value.synthesis.darkInput]).toEqual([
      "source",
      "lit",
      "level-shift",
    ]);
  });

  it("refuses dark cells without active-low lines, saying which drive has them", () => {
    const [p] = problems(file({ drive: "source" }, { decode: "dark" }));
    expect(p?.path).toBe("synthesis.decode");
    expect(p?.message).toContain('set counter.drive to "complementary"');
    expect(problems(file({}, { decode: "either" }))[0]?.path).toBe("synthesis.decode");
  });

  it("refuses lit cells on active-low lines alone: that needs a PNP high-side switch", () => {
    for (const decode of ["lit", "either"]) {
      const [p] = problems(file({ drive: "sink" }, { decode }));
      expect(p?.path).toBe("synthesis.decode");
      expect(p?.message).toContain("PNP high-side switch");
      expect(p?.message).toContain('"counter.drive": "complementary"');
    }
  });

  it("refuses dark decode of a coded counter and a sink drive on one", () => {
    const johnson = problems(file({ drive: "complementary", code: "johnson" }, { decode: "dark" }));
    expect(johnson.map((p) => p.path)).toEqual(["counter.drive"]);
    const lit = problems(file({ code: "binary" }, { decode: "dark" }));
    expect(lit.map((p) => p.path)).toEqual(["synthesis.decode"]);
    expect(lit[0]?.message).toContain("AND gates");
  });

  it("refuses dark decode with direct drive, whose segment current comes from the line", () => {
    const [p] = problems(file({ drive: "complementary" }, { decode: "either" }, { preset: "line-direct" }));
    expect(p?.path).toBe("electrical.driver.kind");
  });

  it("refuses an unknown drive or decode with the choices", () => {
    expect(problems(file({ drive: "low" }, {}))[0]).toEqual({
      path: "counter.drive",
      message: 'got "low"; must be one of "source", "sink", "complementary"',
    });
    expect(problems(file({}, { decode: "both" }))[0]?.message).toBe('got "both"; must be one of "lit", "dark", "either"');
  });

  it("keeps format 1 to source drive", () => {
    const text = JSON.stringify({ schema: "diodeloom/project@1", counter: { states: 2, drive: "sink" }, display: {}, show: ["0", "1"] });
    expect(problems(text)[0]?.path).toBe("counter.drive");
  });

  it("checks the low line's levels", () => {
    const [p] = problems(file({ drive: "sink" }, { decode: "dark" }, { lowLine: { low: 5, high: 0.1 } }));
    expect(p?.path).toBe("electrical.lowLine.high");
  });

  it("takes decode and darkInput as overrides with the file's rules", () => {
    expect(checkSynthesisOverrides({ decode: "either", darkInput: "divider" })).toEqual({
      ok: true,
      value: { decode: "either", darkInput: "divider" },
    });
    expect(checkSynthesisOverrides({ decode: "x" }).ok).toBe(false);
  });
});
