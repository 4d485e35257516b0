import { describe, expect, it } from "vitest";
import { checkSynthesisOverrides, numberFromText } from "../../../../src/core/project/synthesisSchema.ts";
import { validateProject } from "../../../../src/core/project/projectSchema.ts";

const base = { schema: "diodeloom/project@1", counter: { states: 2 }, display: {}, show: ["0", "1"] };

/** The file's message for one synthesis field. */
function fileMessage(field: string, value: unknown): string | undefined {
  const r = validateProject({ ...base, synthesis: { [field]: value } });
  return r.ok ? undefined : r.error[0]?.message;
}

describe("checkSynthesisOverrides", () => {
  it("accepts every option in range, by its name in code", () => {
    expect(checkSynthesisOverrides({ depthLimit: 3, policy: "uniform", timeLimitMs: 500, seed: 0 })).toEqual({
      ok: true,
      value: { depthLimit: 3, policy: "uniform", timeLimitMs: 500, seed: 0 },
    });
    expect(checkSynthesisOverrides({})).toEqual({ ok: true, value: {} });
  });

  it.each([
    ["depthLimit", "maxDepth", 7, "got 7; must be a whole number from 1 to 3"],
    ["depthLimit", "maxDepth", 1.5, "got 1.5; must be a whole number from 1 to 3"],
    ["policy", "depth", "deep", 'got "deep"; must be one of "mixed", "per-segment", "uniform"'],
    ["timeLimitMs", "timeLimitMs", 0, "got 0; must be a whole number from 1 to 3600000 ms"],
    ["seed", "seed", -1, "got -1; must be a whole number from 0 to 2147483647"],
    ["seed", "seed", "x", 'got "x"; must be a whole number from 0 to 2147483647'],
  ])("refuses %s = %j with the message the file's %s gets", (code, file, value, message) => {
    expect(checkSynthesisOverrides({ [code]: value })).toEqual({ ok: false, error: [{ path: code, message }] });
    expect(fileMessage(file, value)).toBe(message);
  });
});

describe("numberFromText", () => {
  it("reads decimal numbers and keeps anything else as text", () => {
    expect(numberFromText("3")).toBe(3);
    expect(numberFromText("-2.5")).toBe(-2.5);
    expect(numberFromText("1e3")).toBe(1000);
    expect(numberFromText("0x10")).toBe("0x10");
    expect(numberFromText("2x")).toBe("2x");
    expect(numberFromText("")).toBe("");
    expect(numberFromText("Infinity")).toBe("Infinity");
  });
});
