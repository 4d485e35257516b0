import { describe, expect, it } from "vitest";
import { lpLowerBound, trivialLowerBound } from "../../../../src/core/synth/bounds.ts";
import { defaultHighsLoader } from "../../../../src/core/synth/exact.ts";
import { problemFromLit } from "../../../../src/core/synth/plan.ts";
import { litRows } from "../../../support/litSpec.ts";

describe("synthBounds", () => {
  it("trivial bound: every driven output needs a diode in, every active state one out", () => {
    expect(trivialLowerBound(problemFromLit(litRows("110", "011", "000", "001")))).toBe(3);
    expect(trivialLowerBound(problemFromLit(litRows("1", "1", "1", "0")))).toBe(3);
  });
  it("LP bound by column generation: between the trivial bound and the known optimum", async () => {
    const highs = await defaultHighsLoader();
    const solveLp = (text: string) => highs.createModel({ format: "lp", data: text });
    // A 3x3 block under a blank state: 6 through one bus (links off); 5 with links.
    const p = problemFromLit(litRows("111", "111", "111", "000"));
    const noLinks = lpLowerBound(p, { policy: "mixed", links: false, buses: true }, { solveLp, deadlineMs: Date.now() + 5000 });
    expect(noLinks.bound).not.toBeNull();
    expect(noLinks.bound!).toBeGreaterThanOrEqual(trivialLowerBound(p));
    expect(noLinks.bound!).toBeLessThanOrEqual(6);
    const withLinks = lpLowerBound(p, { policy: "mixed", links: true, buses: true }, { solveLp, deadlineMs: Date.now() + 5000 });
    expect(withLinks.bound!).toBeLessThanOrEqual(5);
  });
  it("gives no bound when the pricing search may not visit every output set", async () => {
    const highs = await defaultHighsLoader();
    const p = problemFromLit(litRows("1111", "1111", "1110", "0000"));
    const r = lpLowerBound(
      p,
      { policy: "mixed", links: false, buses: true },
      { solveLp: (t) => highs.createModel({ format: "lp", data: t }), deadlineMs: Date.now() + 5000, maxVisits: 2 },
    );
    expect(r.bound).toBeNull();
  });
});
