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

  it("is diodeloom/budget@3 with the unit in every quantity's name, and none of budget@1's or budget@2's names", () => {
    expect(json["schema"]).toBe("diodeloom/budget@3");
    expect(json["kind"]).toBe("current-sink");
    expect(json["targetA"]).toBe(d.project.electrical.segment.targetA);
    expect(Object.keys(json["supply"] as object)).toEqual(["volts", "maxCurrentA", "maxPowerW"]);
    expect(Object.keys(json["logic"] as object)).toEqual(["volts", "maxCurrentA", "maxPowerW"]);
    const driver = Object.values(json["drivers"] as Record<string, object>)[0] ?? {};
    expect(Object.keys(driver)).toEqual([
      "transistor",
      "currentResistor",
      "resistors",
      "maxVceV",
      "maxPowerW",
      "maxCollectorA",
      "headroomV",
      "forcedBeta",
      "saturated",
      "ratedVceV",
      "ratedPowerW",
      "ratedCollectorA",
    ]);
    const state = (json["states"] as Record<string, unknown>[])[0] ?? {};
    expect(state["state"]).toBe("S0");
    expect(Object.keys(Object.values(state["outputs"] as Record<string, object>)[0] ?? {})).toEqual([
      "lit",
      "segmentA",
      "inputV",
      "driver",
    ]);
    const text = budgetJsonText(b.value);
    for (const old of [
      "targetCurrentA",
      "stringCurrentA",
      "emitterOhms",
      "emitterResistors",
      "baseV",
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
