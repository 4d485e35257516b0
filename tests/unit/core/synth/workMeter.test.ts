import { describe, expect, it } from "vitest";
import { WorkMeter } from "../../../../src/core/synth/workMeter.ts";

describe("WorkMeter", () => {
  it("is spent once the charged work reaches the budget, at the same point every time", () => {
    const run = (): number => {
      const m = new WorkMeter(100);
      let steps = 0;
      while (!m.charge(7)) steps++;
      return steps;
    };
    expect(run()).toBe(14); // 15 charges of 7 reach 105 >= 100
    expect(run()).toBe(run());
  });
  it("counts as spent after its deadline, and says so", () => {
    const m = new WorkMeter(Infinity, Date.now() - 1);
    expect(m.deadlineHit).toBe(false);
    expect(m.checkClock()).toBe(true);
    expect(m.deadlineHit).toBe(true);
    const later = new WorkMeter(Infinity, Date.now() - 1);
    // Charging looks at the clock every so many units, not at every one.
    let charges = 0;
    while (!later.charge(1000)) charges++;
    expect(later.deadlineHit).toBe(true);
    expect(charges).toBeLessThan(100);
  });
  it("hands out even portions of what is left and takes their work back", () => {
    const m = new WorkMeter(1000);
    m.charge(100);
    const part = m.portion(3);
    expect(part.maxWork).toBe(300);
    part.charge(250);
    m.settle(part);
    expect(m.work).toBe(350);
    expect(m.spent()).toBe(false);
  });
});
