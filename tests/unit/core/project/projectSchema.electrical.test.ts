/**
 * Bad input in the `electrical` section (issue 4, item 9): each case gets a
 * clear error naming its path, like the rest of the project.
 */
import { describe, expect, it } from "vitest";
import { parseProject, validateProject } from "../../../../src/core/project/projectSchema.ts";

const base = { schema: "diodeloom/project@1", counter: { states: 2 }, display: {}, show: ["0", "1"] };

function problems(electrical: unknown): { path: string; message: string }[] {
  const r = validateProject({ ...base, electrical });
  expect(r.ok).toBe(false);
  return r.ok ? [] : [...r.error];
}

describe("electrical bad input", () => {
  it.each([
    [{ counterOutput: { resistance: -5 } }, "electrical.counterOutput.resistance", "got -5; must be a number from 1 to 1e7 Ω"],
    [{ pullDown: -1 }, "electrical.pullDown", "got -1; must be a number from 10 to 1e8 Ω"],
    [{ driver: { emitterResistor: 0 } }, "electrical.driver.emitterResistor", "got 0; must be a number from 1 to 1e7 Ω"],
    [
      { driver: { emitterResistors: { "1a": -8200 } } },
      "electrical.driver.emitterResistors.1a",
      "got -8200; must be a number from 1 to 1e7 Ω",
    ],
    [{ diode: { rs: -1 } }, "electrical.diode.rs", "got -1; must be a number from 0 to 10000 Ω"],
  ])("rejects a negative or zero resistance: %j", (electrical, path, message) => {
    expect(problems(electrical)).toEqual([{ path, message }]);
  });

  it("rejects zero dies", () => {
    expect(problems({ string: { dies: 0 } })).toEqual([
      { path: "electrical.string.dies", message: "got 0; must be a whole number from 1 to 200" },
    ]);
    expect(problems({ string: { dies: 2.5 } })).toEqual([
      { path: "electrical.string.dies", message: "got 2.5; must be a whole number from 1 to 200" },
    ]);
  });

  it.each([
    [{ diode: { n: 0 } }, "electrical.diode.n", "got 0; must be a number from 0.5 to 10"],
    [{ string: { n: -1 } }, "electrical.string.n", "got -1; must be a number from 0.5 to 10"],
  ])("rejects an emission coefficient n <= 0: %j", (electrical, path, message) => {
    expect(problems(electrical)).toEqual([{ path, message }]);
  });

  it("rejects a supply below the string voltage, saying what the dies drop", () => {
    const p = problems({ supply: { volts: 40, minVolts: 30, maxVolts: 50 } });
    expect(p[0]?.path).toBe("electrical.supply.minVolts");
    expect(p[0]?.message).toMatch(/below the 52\.4 V that 19 dies drop/);
  });

  it("rejects NaN, naming the field, and NaN in JSON text as invalid JSON", () => {
    expect(problems({ pullDown: Number.NaN })).toEqual([
      { path: "electrical.pullDown", message: "got NaN; must be a number from 10 to 1e8 Ω" },
    ]);
    expect(problems({ counterOutput: { high: Number.NaN } })[0]?.path).toBe("electrical.counterOutput.high");
    const r = parseProject(JSON.stringify({ ...base, electrical: { pullDown: 1 } }).replace('"pullDown":1', '"pullDown":NaN'));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error[0]?.message).toMatch(/not valid JSON/);
  });

  it("accepts the issue's defaults written out in full", () => {
    const electrical = {
      temperatureC: 27,
      counterOutput: { high: 2.4, low: 0, resistance: 1000 },
      diode: { is: 4e-9, n: 1.9, rs: 0, maxForwardA: 0.1, maxReverseV: 75 },
      pullDown: 100000,
      driver: { is: 1e-14, betaF: 150, betaR: 3, emitterResistor: 10000, maxVceV: 300, maxPowerW: 0.5 },
      string: { dies: 19, is: 1e-27, n: 2, targetA: 0.00014, maxA: 0.015 },
      supply: { volts: 100, minVolts: 90, maxVolts: 110 },
      tolerance: { resistorPct: 5, betaMin: 80, betaMax: 300, temperatureC: [0, 50] },
    };
    const r = validateProject({ ...base, electrical });
    expect(r.ok).toBe(true);
  });
});
