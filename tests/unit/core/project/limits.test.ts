import { describe, expect, it } from "vitest";
import { fileSizeProblem, LIMITS } from "../../../../src/core/project/limits.ts";
import { validateProject } from "../../../../src/core/project/projectSchema.ts";
import { fillPattern } from "../../../../src/core/project/textPatterns.ts";

const base = { schema: "diodeloom/project@1", display: {} };
const texts = (n: number): string[] => Array.from({ length: n }, (_, k) => String(k % 10));

describe("LIMITS", () => {
  it("is what the schema enforces for states, positions, depth limit, time limit and seed, at both ends", () => {
    const valid = (doc: Record<string, unknown>): boolean => validateProject({ ...base, ...doc }).ok;
    const states = (n: number) => ({ counter: { states: n }, show: texts(n) });
    expect(valid(states(LIMITS.states.min))).toBe(true);
    expect(valid(states(LIMITS.states.max))).toBe(true);
    expect(valid(states(LIMITS.states.min - 1))).toBe(false);
    expect(valid(states(LIMITS.states.max + 1))).toBe(false);
    const positions = (d: number) => ({ counter: { states: 2 }, display: { positions: d }, show: ["0".repeat(d), "1".repeat(d)] });
    expect(valid(positions(LIMITS.positions.min))).toBe(true);
    expect(valid(positions(LIMITS.positions.max))).toBe(true);
    expect(valid(positions(LIMITS.positions.max + 1))).toBe(false);
    for (const [field, range] of [
      ["maxDepth", LIMITS.depthLimit],
      ["timeLimitMs", LIMITS.timeLimitMs],
      ["seed", LIMITS.seed],
    ] as const) {
      const synth = (x: number) => ({ counter: { states: 2 }, show: ["0", "1"], synthesis: { [field]: x } });
      expect(valid(synth(range.min)), `${field} ${range.min}`).toBe(true);
      expect(valid(synth(range.max)), `${field} ${range.max}`).toBe(true);
      expect(valid(synth(range.min - 1)), `${field} ${range.min - 1}`).toBe(false);
      expect(valid(synth(range.max + 1)), `${field} ${range.max + 1}`).toBe(false);
    }
  });

  it("bounds a fill pattern by the state limit", () => {
    expect(fillPattern(`0-${LIMITS.states.max - 1}`, 3).ok).toBe(true);
    const r = fillPattern(`0-${LIMITS.states.max}`, 3);
    expect(!r.ok && r.error[0]?.message).toBe(
      `gives more than ${LIMITS.states.max} texts; a counter has at most ${LIMITS.states.max} states`,
    );
  });
});

describe("fileSizeProblem", () => {
  it("allows exactly the limit and refuses one byte more, saying both sizes", () => {
    expect(fileSizeProblem(LIMITS.fileBytes)).toBeUndefined();
    expect(fileSizeProblem(LIMITS.fileBytes + 1)).toEqual({
      path: "",
      message: "the file is larger than 1 MiB (1048577 bytes; the limit is 1048576); a project needs far less",
    });
  });
});
