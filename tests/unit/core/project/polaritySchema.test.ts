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

  it("refuses lit cells on active-low lines alone with an NPN driver, naming the high-side switch", () => {
    for (const decode of ["lit", "either"]) {
      const [p] = problems(file({ drive: "sink" }, { decode }));
      expect(p?.path).toBe("synthesis.decode");
      expect(p?.message).toContain('"high-side-switch"');
      expect(p?.message).toContain('"counter.drive": "complementary"');
    }
  });

  it("takes lit cells on active-low lines with a high-side switch (sink or complementary drive, lit or either)", () => {
    for (const [drive, decode] of [
      ["sink", "lit"],
      ["sink", "either"],
      ["complementary", "lit"],
      ["complementary", "either"],
    ] as const) {
      const r = parseProject(file({ drive }, { decode }, { preset: "bench-5v-high-side" }));
      expect(r.ok, `${drive}/${decode}: ${JSON.stringify(r.ok ? [] : r.error)}`).toBe(true);
    }
  });

  it("refuses a high-side switch on a source-drive counter, a coded counter, or dark cells, saying what to change", () => {
    const source = problems(file({ drive: "source" }, { decode: "lit" }, { preset: "bench-5v-high-side" }));
    expect(source.map((p) => p.path)).toEqual(["counter.drive"]);
    expect(source[0]?.message).toContain('set counter.drive to "sink" or "complementary"');
    const coded = problems(file({ code: "binary" }, { decode: "lit" }, { preset: "bench-5v-high-side" }));
    expect(coded.map((p) => p.path)).toEqual(["electrical.driver.kind"]);
    expect(coded[0]?.message).toContain("AND gates");
    const dark = problems(file({ drive: "complementary" }, { decode: "dark" }, { preset: "bench-5v-high-side" }));
    expect(dark.map((p) => p.path)).toEqual(["synthesis.decode"]);
    expect(dark[0]?.message).toContain('use "decode": "lit"');
  });

  it("refuses a high-side switch whose supply the idle lines cannot hold off, naming the supply and the levels", () => {
    // The 5 V preset: a 5.25 V supply over lines idling at 5 V is held off (the diode takes the difference).
    expect(problems(file({ drive: "sink" }, { decode: "lit" }, { preset: "bench-5v-high-side" }))).toEqual([]);
    // A 12 V segment supply over 5 V lines: the node sits a diode drop above an idle line, the PNP fully on.
    const twelve = {
      preset: "bench-5v-high-side",
      supply: { volts: 12, minVolts: 11.4, maxVolts: 12.6 },
      segment: { seriesResistor: 1000 },
    };
    const [p] = problems(file({ drive: "sink" }, { decode: "lit" }, twelve));
    expect(p?.path).toBe("electrical.supply.maxVolts");
    expect(p?.message).toMatch(/^got 12\.6 V with the idle nS lines at 5 V \(lowLine\.high\)/);
    expect(p?.message).toContain("lower the segment supply");
    // The same supply with the counter run from it holds.
    expect(problems(file({ drive: "sink" }, { decode: "lit" }, { ...twelve, lowLine: { high: 12.6 } }))).toEqual([]);
  });

  it("needs a high-side switch's base-emitter resistor", () => {
    const [p] = problems(
      file({ drive: "sink" }, { decode: "lit" }, { preset: "bench-5v-high-side", driver: { baseEmitterResistor: null } }),
    );
    expect(p?.path).toBe("electrical.driver.baseEmitterResistor");
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
