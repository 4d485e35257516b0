import { describe, expect, it } from "vitest";
import type { BudgetWarning } from "../../../src/core/budget/budgetTypes.ts";
import { warningText } from "../../../src/render/budgetWarningText.ts";

describe("budget findings in words", () => {
  it("puts SI figures in µA, mA, mW and volts", () => {
    expect(warningText({ level: "info", code: "counter-sag", line: "S8", sagV: 0.1123, sourceCurrentA: 1.0567e-4 })).toBe(
      "the counter sags most in S8: 0.11 V below its high level while sourcing 105.7 µA",
    );
    expect(warningText({ level: "info", code: "counter-sag", line: "S8", sagV: 1.62, sourceCurrentA: 3.45e-3 })).toBe(
      "the counter sags most in S8: 1.62 V below its high level while sourcing 3.45 mA",
    );
    expect(warningText({ level: "warn", code: "driver-power", transistor: "Q2", output: "1b", powerW: 0.01065, ratedW: 0.01 })).toBe(
      "driver Q2 (1b) dissipates up to 10.7 mW, over its 10 mW rating",
    );
    expect(warningText({ level: "warn", code: "segment-current", currentA: 0.0012, ratedA: 0.001 })).toBe(
      "a segment carries up to 1.20 mA, over its 1.00 mA rating",
    );
    expect(warningText({ level: "warn", code: "line-current", line: "S8", state: "S8", currentA: 0.00612, ratedA: 0.005 })).toBe(
      "counter line S8 sources 6.12 mA in S8, more than the 5.00 mA it may",
    );
    expect(warningText({ level: "warn", code: "ghost-segment", output: "1e", state: "S3", currentA: 1.52e-4, limitA: 1e-4 })).toBe(
      "1e is unlit in S3 but carries 152.0 µA, above 100.0 µA (the ghost limit); LEDs glow visibly at microamperes",
    );
    expect(
      warningText({ level: "warn", code: "switch-unsaturated", transistor: "Q3", output: "1c", forcedBeta: 123.4, betaMin: 100 }),
    ).toBe(
      "switch Q3 (1c) is not saturated at the low corner: its forced beta Ic/Ib reaches 123, not below the lowest beta 100; " +
        "give it more base current (a smaller base resistor; common practice is a forced beta of 10-20)",
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
      "1a runs as low as 83.7 µA, more than 20 % under the 140.0 µA target; the E24 trim (6.2 kΩ) would bring it to " +
        "132.5 µA-145.7 µA, but the trim is not applied because it would widen the brightness spread",
    );
    expect(warningText({ ...w, unappliedTrim: null })).toBe("1a runs as low as 83.7 µA, more than 20 % under the 140.0 µA target");
  });

  it("never calls a trim that widens the spread an improvement", () => {
    const base = { level: "info", code: "brightness-spread", spreadPct: 11.86, series: "E24", otherSpreadPct: 12.2 } as const;
    const widened = warningText({ ...base, trim: "widens-spread" });
    expect(widened).toBe(
      "segment currents spread by 11.9 % over the states and segments; the E24 trim would widen that to 12.2 %, so it is not applied",
    );
    expect(widened).not.toMatch(/brings/);
    expect(warningText({ ...base, spreadPct: 8.4, otherSpreadPct: 36.7, trim: "applied" })).toBe(
      "segment currents spread by 8.4 % over the states and segments with the E24 trim (36.7 % with the project's resistors)",
    );
    expect(warningText({ ...base, spreadPct: 36.7, otherSpreadPct: 8.4, trim: "turned-off" })).toBe(
      "segment currents spread by 36.7 % over the states and segments; the E24 trim, turned off, would give 8.4 %",
    );
  });

  it("names the cause of a state-dependent spread and says the trim cannot remove it", () => {
    const w: BudgetWarning = {
      level: "warn",
      code: "state-spread",
      output: "1b",
      spreadPct: 21.3,
      minState: "S8",
      maxState: "S1",
      causes: ["line-sag", "diode-depth"],
      sagDeltaV: 0.4123,
      gate: null,
      litMin: 7,
      litMax: 2,
      depthMin: 2,
      depthMax: 1,
    };
    expect(warningText(w)).toBe(
      "1b is 21.3 % dimmer in S8 than in S1; the cause: the active line's source resistance, shared by the segments lit together " +
        "(7 lit in S8 against 2 in S1: the line sits 0.41 V lower); and the diode depth (2 diodes from the line in S8, 1 in S1). " +
        "The trim cannot remove it; a stiffer counter line, fewer diodes on the path or a switch would",
    );
    const gated: BudgetWarning = { ...w, output: "1a", minState: "S5", maxState: "S3", causes: ["gate-sag"], gate: "G7", sagDeltaV: 1.76 };
    expect(warningText(gated)).toBe(
      "1a is 21.3 % dimmer in S5 than in S3; the cause: the AND gate's pull-up, shared by the drivers of the outputs it feeds " +
        "(G7 in S5 sits 1.76 V lower than the node that drives it in S3). " +
        "The trim cannot remove it; a smaller gatePullUp or drivers that take less base current would",
    );
  });
});
