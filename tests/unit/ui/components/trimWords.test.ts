import { describe, expect, it } from "vitest";
import { spreadWords } from "../../../../src/ui/components/trimWords.ts";

describe("the Budget panel's spread and trim words", () => {
  it("never sets a wider trim spread beside the project's as an improvement (11.9 % and 12.2 %)", () => {
    const text = spreadWords({ spreadPct: 11.9, applied: false, spreadPctBefore: 11.9, trimSpreadPct: 12.2, series: "E24" });
    expect(text).toBe("spread 11.9 % with the project's resistors; the E24 trim would give 12.2 %, wider, so it is not used");
    expect(text).not.toMatch(/→|after|improv|narrower/);
  });

  it("calls a trim that is applied what it is beside the project's figure", () => {
    expect(spreadWords({ spreadPct: 3.1, applied: true, spreadPctBefore: 11.9, trimSpreadPct: 3.1, series: "E24" })).toBe(
      "spread 3.1 % with the E24 trim (narrower than the project's 11.9 %)",
    );
    // Applied on request although wider: said so.
    expect(spreadWords({ spreadPct: 12.2, applied: true, spreadPctBefore: 11.9, trimSpreadPct: 12.2, series: "E24" })).toMatch(
      /wider than the project's 11\.9 %/,
    );
  });

  it("compares the figures as shown, so equal-looking numbers are 'the same', not better", () => {
    const text = spreadWords({ spreadPct: 5.04, applied: false, spreadPctBefore: 5.04, trimSpreadPct: 5.01, series: "E96" });
    expect(text).toMatch(/would give 5\.0 %, no narrower$/);
  });
});
