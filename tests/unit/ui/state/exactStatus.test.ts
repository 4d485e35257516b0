import { describe, expect, it } from "vitest";
import { doneText } from "../../../../src/ui/state/exactStatus.ts";

const done = { status: "done" as const, improved: false, reused: false };

describe("the exact run's line", () => {
  it("says the time limit was reached, with its best and bound, when the clock ended the run (00-59)", () => {
    const text = doneText({ ...done, optimal: false, deadlineHit: true, count: 221, lowerBound: 142 });
    expect(text).toBe("exact: time limit reached: best 221, bound 142");
    expect(text).not.toMatch(/finished|proven|minimum/);
  });

  it("says 'proven minimum' only for a proven result", () => {
    expect(doneText({ ...done, optimal: true, deadlineHit: false, count: 52, lowerBound: 52 })).toBe("exact: proven minimum 52");
    const unproven = doneText({ ...done, optimal: false, deadlineHit: false, count: 53, lowerBound: 49 });
    expect(unproven).toBe("exact: no proof within its work budget: best 53, bound 49");
    expect(unproven).not.toMatch(/proven minimum|finished/);
  });

  it("says when the result was taken from an earlier run on the same glyphs", () => {
    expect(doneText({ ...done, reused: true, improved: true, optimal: true, deadlineHit: false, count: 51, lowerBound: 51 })).toBe(
      "exact: proven minimum 51, improved (from an earlier run on these glyphs)",
    );
  });
});
