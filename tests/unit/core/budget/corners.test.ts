import { describe, expect, it } from "vitest";
import { cornerConditions, cornerModel, ledSaturationCurrent, siliconSaturationCurrent } from "../../../../src/core/budget/corners.ts";
import { shockleyVoltage, thermalVoltage } from "../../../../src/core/circuit/physics.ts";
import { ELECTRICAL_DEFAULTS } from "../../../../src/core/project/projectSchema.ts";

describe("tolerance corners", () => {
  it("leave saturation currents alone at the model's own temperature", () => {
    expect(siliconSaturationCurrent({ isA: 1e-14, n: 1, fromC: 27 }, 27)).toBe(1e-14);
    expect(ledSaturationCurrent({ isA: 1e-27, n: 2, fromC: 27, atA: 1.4e-4 }, 27) / 1e-27).toBeCloseTo(1, 9);
  });

  it("scale silicon Is up with temperature", () => {
    expect(siliconSaturationCurrent({ isA: 1e-14, n: 1, fromC: 27 }, 50)).toBeGreaterThan(1e-13);
    expect(siliconSaturationCurrent({ isA: 1e-14, n: 1, fromC: 27 }, 0)).toBeLessThan(1e-15);
  });

  it("move an LED die's drop at the target current by exactly -2 mV per degree", () => {
    const v0 = shockleyVoltage(1.4e-4, 1e-27, 2, thermalVoltage(27));
    const v1 = shockleyVoltage(1.4e-4, ledSaturationCurrent({ isA: 1e-27, n: 2, fromC: 27, atA: 1.4e-4 }, 50), 2, thermalVoltage(50));
    expect(v1 - v0).toBeCloseTo(-0.046, 9);
  });

  it("push every value the way that lowers (low) or raises (high) a string current", () => {
    const e = ELECTRICAL_DEFAULTS;
    const [low, high] = cornerConditions(e);
    expect([low.supplyV, low.temperatureC, low.betaF, low.emitterFactor, low.pullDownFactor, low.counterFactor]).toEqual([
      90, 0, 80, 1.05, 0.95, 1.05,
    ]);
    expect([high.supplyV, high.temperatureC, high.betaF, high.emitterFactor, high.pullDownFactor, high.counterFactor]).toEqual([
      110, 50, 300, 0.95, 1.05, 0.95,
    ]);
    const m = cornerModel(e, low, ["1a", "1b"], new Map([["1a", 9100]]));
    expect(m.driver.emitterResistors).toEqual({ "1a": 9100 * 1.05, "1b": 10_000 * 1.05 });
    expect(m.supply.volts).toBe(90);
    expect(m.temperatureC).toBe(0);
    expect(m.pullDown).toBeCloseTo(95_000, 6);
  });
});
