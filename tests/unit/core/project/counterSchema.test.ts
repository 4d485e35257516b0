import { describe, expect, it } from "vitest";
import { validateProject } from "../../../../src/core/project/projectSchema.ts";
import { serializeProject } from "../../../../src/core/project/projectWriter.ts";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";
import { LIMITS } from "../../../../src/core/project/limits.ts";

const base = { schema: "diodeloom/project@1", display: {} };
const digits = (n: number): string[] => Array.from({ length: n }, (_, k) => String(k % 10));
const problems = (counter: Record<string, unknown>, show = digits(Number(counter["states"]))) => {
  const r = validateProject({ ...base, counter, show });
  return r.ok ? [] : r.error.map((p) => `${p.path}: ${p.message}`);
};

describe("counter.code", () => {
  it("defaults to one-hot, today's ring counter", () => {
    const r = validateProject({ ...base, counter: { states: 3 }, show: digits(3) });
    expect(r.ok && r.value.counter).toEqual({ states: 3, drive: "source", code: "one-hot", codes: [] });
  });

  it("takes johnson, binary and custom", () => {
    expect(problems({ states: 10, code: "johnson" })).toEqual([]);
    expect(problems({ states: 10, code: "binary" })).toEqual([]);
    expect(problems({ states: 4, code: "custom", codes: ["00", "01", "11", "10"] }, digits(4))).toEqual([]);
  });

  it("names an unknown code and lists the known ones", () => {
    expect(problems({ states: 3, code: "gray" })).toEqual([
      'counter.code: got "gray"; must be one of "one-hot", "johnson", "binary", "custom"',
    ]);
  });

  it("wants an even number of states for a Johnson counter", () => {
    expect(problems({ states: 7, code: "johnson" })).toEqual([
      'counter.states: got 7 with "code": "johnson"; a Johnson counter of n stages has 2n states, so the number must be even (6 or 8), or choose another code',
    ]);
  });

  it("checks a custom table: present, one code per state, bits only, one length, distinct", () => {
    expect(problems({ states: 2, code: "custom" })).toEqual([
      'counter.codes: missing; a "custom" code lists one bit string per state, the highest stage leftmost, e.g. ["00", "01", "11", "10"]',
    ]);
    expect(problems({ states: 3, code: "custom", codes: ["0", "1"] })).toEqual([
      "counter.codes: got 2 codes but counter.states is 3; give exactly one code per state",
    ]);
    expect(problems({ states: 3, code: "custom", codes: ["00", "0x", "011"] })).toEqual([
      'counter.codes[1]: got "0x"; a code is a string of 0s and 1s, the highest stage leftmost',
      'counter.codes[2]: got "011", 3 stages, but counter.codes[0] has 2; every code has the same number of stages',
    ]);
    expect(problems({ states: 3, code: "custom", codes: ["01", "10", "01"] })).toEqual([
      'counter.codes[2]: got "01", the same code as counter.codes[0]; every state needs a code of its own',
    ]);
    const long = "0".repeat(LIMITS.codeStages.max + 1);
    expect(problems({ states: 2, code: "custom", codes: [long, "1" + long.slice(1)] })[0]).toBe(
      `counter.codes[0]: got ${LIMITS.codeStages.max + 1} stages; a custom code has ${LIMITS.codeStages.min} to ${LIMITS.codeStages.max} stages`,
    );
    expect(problems({ states: 2, code: "custom", codes: ["0".repeat(16), "1".repeat(16)] })).toEqual([]);
  });

  it("refuses codes for a code that computes its own", () => {
    expect(problems({ states: 2, code: "binary", codes: ["0", "1"] })).toEqual([
      'counter.codes: got 2 codes but counter.code is "binary"; only a "custom" code lists its codes; remove them or set counter.code to "custom"',
    ]);
  });

  it("round-trips through the writer", () => {
    for (const counter of [
      { states: 4, code: "custom", codes: ["00", "01", "11", "10"] },
      { states: 10, code: "johnson" },
      { states: 3 },
    ]) {
      const first = parseProject(JSON.stringify({ ...base, counter, show: digits(counter.states) }));
      if (!first.ok) throw new Error(JSON.stringify(first.error));
      const again = parseProject(serializeProject(first.value));
      expect(again.ok && again.value).toEqual(first.value);
    }
  });
});
