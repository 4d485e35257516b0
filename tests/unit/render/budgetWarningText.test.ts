import { describe, expect, it } from "vitest";
import type { BudgetWarning } from "../../../src/core/budget/budgetTypes.ts";
import { warningText } from "../../../src/render/budgetWarningText.ts";

describe("budget findings in words", () => {
  it("puts SI figures in µA, mA, mW and volts", () => {
    expect(warningText({ level: "info", code: "counter-sag", line: "S8", sagV: 0.1123, sourceCurrentA: 1.0567e-4 })).toBe(
      "the counter sags most in S8: 0.11 V below its high level while sourcing 105.7 µA",
    );
    expect(warningText({ level: "warn", code: "driver-power", transistor: "Q2", output: "1b", powerW: 0.01065, ratedW: 0.01 })).toBe(
      "driver Q2 (1b) dissipates up to 10.7 mW, over its 10 mW rating",
    );
    expect(warningText({ level: "warn", code: "string-current", currentA: 0.0012, ratedA: 0.001 })).toBe(
      "a string carries up to 1.20 mA, over its 1.00 mA rating",
    );
    expect(warningText({ level: "danger", code: "hazardous-voltage", supplyV: 110 })).toMatch(/reaches 110 V DC/);
  });

  it("offers an unapplied trim for a dim segment as what it would do, with the reason it is not applied", () => {
    const w: BudgetWarning = {
      level: "warn",
      code: "dim-segment",
      output: "1a",
      minA: 8.37e-5,
      targetA: 1.4e-4,
      windowPct: 20,
      unappliedTrim: { series: "E24", ohms: 6200, why: "widens-spread", minA: 1.325e-4, maxA: 1.457e-4, spreadPct: 9 },
    };
    expect(warningText(w)).toBe(
      "1a runs as low as 83.7 µA, more than 20 % under the 140.0 µA target; the E24 trim (a 6.2 kΩ emitter resistor) would bring it to " +
        "132.5 µA-145.7 µA, but the trim is not applied because it would widen the brightness spread",
    );
    expect(warningText({ ...w, unappliedTrim: null })).toBe("1a runs as low as 83.7 µA, more than 20 % under the 140.0 µA target");
  });

  it("never calls a trim that widens the spread an improvement", () => {
    const base = { level: "info", code: "brightness-spread", spreadPct: 11.86, series: "E24", otherSpreadPct: 12.2 } as const;
    const widened = warningText({ ...base, trim: "widens-spread" });
    expect(widened).toBe(
      "string currents spread by 11.9 % over the states; the E24 emitter trim would widen that to 12.2 %, so it is not applied",
    );
    expect(widened).not.toMatch(/brings/);
    expect(warningText({ ...base, spreadPct: 8.4, otherSpreadPct: 36.7, trim: "applied" })).toBe(
      "string currents spread by 8.4 % over the states with the E24 emitter trim (36.7 % with the project's emitter resistors)",
    );
    expect(warningText({ ...base, spreadPct: 36.7, otherSpreadPct: 8.4, trim: "turned-off" })).toBe(
      "string currents spread by 36.7 % over the states; the E24 emitter trim, turned off, would give 8.4 %",
    );
  });
});
