import { describe, expect, it } from "vitest";
import { forcedBetaText } from "../../../src/render/forcedBetaText.ts";

describe("forcedBetaText", () => {
  it("rounds a saturated switch's forced beta down, so a figure below the lowest beta never prints as it", () => {
    expect(forcedBetaText(99.99986, true)).toBe("99.9");
    expect(forcedBetaText(68.96, true)).toBe("68.9");
    expect(forcedBetaText(4.5, true)).toBe("4.5");
  });

  it("rounds an unsaturated switch's to the nearest tenth: it is at or above the lowest beta", () => {
    expect(forcedBetaText(99.99999986, false)).toBe("100.0");
    expect(forcedBetaText(146.35, false)).toBe("146.3");
    expect(forcedBetaText(123.46, false)).toBe("123.5");
  });
});
