import { describe, expect, it } from "vitest";
import { budgetCoverage, solveBudget } from "../../../../src/core/budget/budget.ts";
import { checkedStates } from "../../../../src/core/budget/budgetWork.ts";
import type { Budget, BudgetOptions } from "../../../../src/core/budget/budgetTypes.ts";
import { warningText } from "../../../../src/render/budgetWarningText.ts";
import { clockProject, directDesign, type Design } from "../../../support/budgetFixtures.ts";

function budgetOf(d: Design, options: BudgetOptions = {}): Budget {
  const b = solveBudget(d.project, d.spec, d.matrix, options);
  if (!b.ok) throw new Error(b.error.message);
  return b.value;
}

describe("checkedStates", () => {
  it("checks every state of the demos' and the clocks' sizes at the default 20 s, and the first ones of the largest matrices", () => {
    // Elements of one state's circuit: 00-99 on two positions 555, 256 states on 8 positions of a 32-segment cell 11 533.
    expect(checkedStates(555, 100, 20_000)).toBe(100);
    expect(checkedStates(11_533, 256, 20_000)).toBe(1);
    expect(checkedStates(11_533, 256, 150_000)).toBe(14);
  });

  it("grows with the time limit, shrinks with the circuit, never checks fewer than one state nor more than there are", () => {
    let last = 0;
    for (const ms of [1, 100, 1_000, 20_000, 600_000, 3_600_000]) {
      const n = checkedStates(4_000, 256, ms);
      expect(n).toBeGreaterThanOrEqual(Math.max(1, last));
      expect(n).toBeLessThanOrEqual(256);
      last = n;
    }
    expect(last).toBe(256);
    expect(checkedStates(8_000, 256, 60_000)).toBeLessThan(checkedStates(4_000, 256, 60_000));
    expect(checkedStates(1e9, 256, 1)).toBe(1);
  });

  it("refuses a time limit that is not above 0", () => {
    expect(() => checkedStates(100, 10, 0)).toThrow(RangeError);
    expect(() => checkedStates(100, 10, NaN)).toThrow(/timeLimitMs/);
  });
});

describe("a budget whose time limit's work does not cover every state", () => {
  const clock = directDesign("00-59", clockProject());
  // 00-59 on two positions checks every state at 20 s; at 0.5 s only the first ones.
  const coverage = budgetCoverage(clock.project, clock.spec, clock.matrix, 500);

  it("checks the first states and says which", () => {
    expect(budgetCoverage(clock.project, clock.spec, clock.matrix, 20_000)).toBeNull();
    expect(budgetCoverage(clock.project, clock.spec, clock.matrix, undefined)).toBeNull();
    expect(coverage).not.toBeNull();
    const checked = coverage?.checked ?? 0;
    expect(checked).toBeGreaterThan(1);
    expect(checked).toBeLessThan(60);
    const b = budgetOf(clock, { timeLimitMs: 500 });
    expect(b.coverage).toEqual({ checked, states: 60, timeLimitMs: 500 });
    expect(b.states.map((s) => s.state)).toEqual(clock.spec.states.slice(0, checked));
    const w = b.warnings.find((x) => x.code === "states-unchecked");
    expect(w).toEqual({ level: "warn", code: "states-unchecked", checked, states: 60, timeLimitMs: 500 });
    if (w) expect(warningText(w)).toMatch(new RegExp(`^only S0-S${checked - 1} of the 60 states are checked.*; S${checked}-S59 are not`));
  });

  it("solves those states as the whole budget does: with the project's resistors, the same figures bit for bit", () => {
    const part = budgetOf(clock, { timeLimitMs: 500, trim: "off" });
    const whole = budgetOf(clock, { trim: "off" });
    expect(whole.coverage).toBeUndefined();
    expect(whole.warnings.some((x) => x.code === "states-unchecked")).toBe(false);
    expect(part.states).toEqual(whole.states.slice(0, part.states.length));
  });
});

describe("the states-unchecked warning's words", () => {
  it("names the checked and the unchecked states and the limit, one state or several", () => {
    expect(warningText({ level: "warn", code: "states-unchecked", checked: 1, states: 256, timeLimitMs: 20_000 })).toBe(
      "only S0 of the 256 states is checked, as many as the 20 s time limit's work covers; S1-S255 are not, and every figure here " +
        "is of the checked states alone: a longer time limit checks more of them",
    );
    expect(warningText({ level: "warn", code: "states-unchecked", checked: 9, states: 10, timeLimitMs: 1_500 })).toMatch(
      /^only S0-S8 of the 10 states are checked, as many as the 1\.5 s time limit's work covers; S9 is not,/,
    );
  });
});
