import { describe, expect, it } from "vitest";
import {
  currentText,
  formatOhms,
  microamps,
  microampsShort,
  microampsText,
  milliamps,
  milliampsExact,
  milliwatts,
  nanoamps,
  ohmsText,
  percent,
  volts,
} from "../../../src/render/units.ts";

describe("pretty units", () => {
  it("formats ohms as a BOM prints them", () => {
    expect(formatOhms(470)).toBe("470");
    expect(formatOhms(4700)).toBe("4.7k");
    expect(formatOhms(10_000)).toBe("10k");
    expect(formatOhms(100_000)).toBe("100k");
    expect(formatOhms(2_200_000)).toBe("2.2M");
  });

  it("writes a resistance with its unit", () => {
    expect(ohmsText(6200)).toBe("6.2 kΩ");
    expect(ohmsText(470)).toBe("470 Ω");
    expect(ohmsText(2_200_000)).toBe("2.2 MΩ");
  });

  it("writes a current from leakage up with the prefix that puts it between 1 and 1000", () => {
    expect(currentText(4.1537e-12)).toBe("4.15 pA");
    expect(currentText(7.18e-5)).toBe("71.8 µA");
    expect(currentText(1e-4)).toBe("100 µA");
    // Three figures that round up to 1000 take the next prefix.
    expect(currentText(9.9996e-4)).toBe("1 mA");
    expect(currentText(0.0098)).toBe("9.8 mA");
    expect(currentText(3.2e-9)).toBe("3.2 nA");
    expect(currentText(0)).toBe("0 A");
    expect(currentText(-5e-9)).toBe("-5 nA");
  });

  it("prints currents without binary noise", () => {
    expect(milliampsExact(0.00014)).toBe("0.14");
    expect(milliampsExact(0.1)).toBe("100");
    expect(microampsShort(0.00014)).toBe("140");
    expect(microampsShort(8.57e-5)).toBe("85.7");
  });

  it("gives fixed decimals for table columns", () => {
    expect(microamps(8.3749e-5)).toBe("83.7");
    expect(microampsText(8.3749e-5)).toBe("83.7 µA");
    expect(milliamps(5.1e-4)).toBe("0.51");
    expect(nanoamps(1.2e-10)).toBe("0.12");
    expect(milliwatts(0.00433)).toBe("4.3");
    expect(milliwatts(0.5, 0)).toBe("500");
    expect(volts(2.3123)).toBe("2.31");
    expect(percent(11.853)).toBe("11.9");
  });
});
