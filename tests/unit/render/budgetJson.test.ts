import { describe, expect, it } from "vitest";
import { solveBudget } from "../../../src/core/budget/budget.ts";
import { budgetJsonText } from "../../../src/render/budgetJson.ts";
import { warningText } from "../../../src/render/budgetWarningText.ts";
import { sharedDieRoller } from "../../support/budgetFixtures.ts";

describe("budget JSON", () => {
  const d = sharedDieRoller();
  const b = solveBudget(d.project, d.spec, d.matrix, { trim: "off" });
  if (!b.ok) throw new Error(b.error.message);
  const json = JSON.parse(budgetJsonText(b.value)) as Record<string, unknown>;

  it("is diodeloom/budget@2 with the unit in every quantity's name, and none of budget@1's names", () => {
    expect(json["schema"]).toBe("diodeloom/budget@2");
    expect(json["targetCurrentA"]).toBe(d.project.electrical.string.targetA);
    expect(Object.keys(json["supply"] as object)).toEqual(["volts", "maxCurrentA", "maxPowerW"]);
    const driver = Object.values(json["drivers"] as Record<string, object>)[0] ?? {};
    expect(Object.keys(driver)).toEqual([
      "transistor",
      "emitterResistor",
      "emitterOhms",
      "maxVceV",
      "maxPowerW",
      "headroomV",
      "ratedVceV",
      "ratedPowerW",
    ]);
    const text = budgetJsonText(b.value);
    for (const old of [
      "targetCurrent",
      "sourceCurrent",
      "supplyCurrent",
      "stringCurrent",
      "baseVoltage",
      "maxPower",
      "maxCurrent",
      "maxReverse",
      "lineVoltage",
      "headroom",
      "offMax",
      "depths",
      "min",
      "max",
      "sag",
    ]) {
      expect(text, old).not.toMatch(new RegExp(`"${old}":`));
    }
  });

  it("gives every warning its level, code, message in words and its SI figures", () => {
    const warnings = json["warnings"] as Record<string, unknown>[];
    expect(warnings.length).toBe(b.value.warnings.length);
    warnings.forEach((w, i) => {
      const core = b.value.warnings[i]!;
      expect(Object.keys(w).slice(0, 3)).toEqual(["level", "code", "message"]);
      expect(w["message"]).toBe(warningText(core));
      expect({ ...w, message: undefined }).toEqual({ ...JSON.parse(JSON.stringify(core)), message: undefined });
    });
  });
});
