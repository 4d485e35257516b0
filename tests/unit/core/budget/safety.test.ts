import { describe, expect, it } from "vitest";
import { MAINS_SUPPLY_TEXT, SELV_DC_LIMIT_V, safetyCautions } from "../../../../src/core/budget/safety.ts";

describe("safety cautions", () => {
  it("stay silent up to 60 V DC", () => {
    expect(SELV_DC_LIMIT_V).toBe(60);
    expect(safetyCautions([48, 45, 60])).toEqual([]);
  });

  it("give the hazardous-voltage and mains cautions above 60 V, deferring to codes and licensed practice", () => {
    const c = safetyCautions([58, 55, 61]);
    expect(c.map((x) => [x.level, x.code])).toEqual([
      ["danger", "hazardous-voltage"],
      ["danger", "mains-supply"],
    ]);
    expect(c[0]?.message).toMatch(/61 V DC/);
    expect(c[0]?.message).toMatch(/SELV/);
    expect(c[0]?.message).toMatch(/local electrical codes and licensed practice/);
    expect(MAINS_SUPPLY_TEXT).toMatch(/fuse the live lead/);
    expect(MAINS_SUPPLY_TEXT).toMatch(/earth/);
    expect(MAINS_SUPPLY_TEXT).toMatch(/discharge the filter capacitors/);
    expect(MAINS_SUPPLY_TEXT).toMatch(/licensed electrician/);
  });
});
