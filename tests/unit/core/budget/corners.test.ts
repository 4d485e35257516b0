import { describe, expect, it } from "vitest";
import { cornerConditions, cornerModel, ledSaturationCurrent, siliconSaturationCurrent } from "../../../../src/core/budget/corners.ts";
import { shockleyVoltage, thermalVoltage } from "../../../../src/core/circuit/physics.ts";
import { ELECTRICAL_PRESETS, FORMAT1_ELECTRICAL } from "../../../../src/core/project/electricalPresets.ts";

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

  it("push every value the way that lowers (low) or raises (high) a segment current (format 1's sink)", () => {
    const e = FORMAT1_ELECTRICAL;
    const [low, high] = cornerConditions(e);
    expect([low.supplyV, low.temperatureC, low.betaF, low.currentFactor, low.shuntFactor, low.counterFactor]).toEqual([
      90, 0, 80, 1.05, 0.95, 1.05,
    ]);
    expect([high.supplyV, high.temperatureC, high.betaF, high.currentFactor, high.shuntFactor, high.counterFactor]).toEqual([
      110, 50, 300, 0.95, 1.05, 0.95,
    ]);
    const m = cornerModel(e, low, ["1a", "1b"], new Map([["1a", 9100]]));
    expect(m.driver.emitterResistors).toEqual({ "1a": 9100 * 1.05, "1b": 10_000 * 1.05 });
    expect(m.supply.volts).toBe(90);
    expect(m.temperatureC).toBe(0);
    expect(m.pullDown).toBeCloseTo(95_000, 6);
  });

  it("for a switch: series and base resistors up, the base-emitter resistor down at the low corner; the design's series values written out", () => {
    const e = ELECTRICAL_PRESETS["bench-5v-switch"];
    const [low, high] = cornerConditions(e);
    const m = cornerModel(e, low, ["1a", "1b"], new Map([["1a", 330]]));
    expect(m.segment.seriesResistors).toEqual({ "1a": 330 * 1.05, "1b": 300 * 1.05 });
    expect(m.driver.emitterResistors).toEqual({});
    expect(m.driver.baseResistor).toBeCloseTo(3300 * 1.05, 9);
    expect(m.driver.baseEmitterResistor).toBeCloseTo(47_000 * 0.95, 9);
    expect(m.driver.betaF).toBe(100);
    expect(m.supply.volts).toBe(4.75);
    // A red LED at 0 °C drops more at the target current than at 27 °C.
    const t = e.segment.targetA;
    expect(shockleyVoltage(t, m.segment.is, 2, thermalVoltage(0))).toBeGreaterThan(shockleyVoltage(t, e.segment.is, 2, thermalVoltage(27)));
    const h = cornerModel(e, high, ["1a"]);
    expect(h.segment.seriesResistors).toEqual({ "1a": 300 * 0.95 });
    expect(h.driver.baseEmitterResistor).toBeCloseTo(47_000 * 1.05, 9);
  });
});
