/**
 * The two-input decode of every Johnson-counter state, against the published
 * table. Source: docs/sources.md, "Johnson (twisted-ring) counters" (course
 * notes "The Johnson Counter"): for 5 stages A-E, state 0 = A'E', 1 = AB',
 * 2 = BC', 3 = CD', 4 = DE', 5 = AE, 6 = A'B, 7 = B'C, 8 = C'D, 9 = D'E.
 * Stage A is the one loaded from the complement of the last stage, diodeloom's
 * Q0; B-E are Q1-Q4; X' is the complement line nQ.
 */
import { describe, expect, it } from "vitest";
import { isolatingLiterals } from "../../src/core/logic/implicants.ts";
import { literalLine, logicProblem } from "../../src/core/logic/logicProblem.ts";
import { synthesizeCoded } from "../../src/core/logic/synthesizeCoded.ts";
import { synthesize } from "../../src/core/synth/synthesize.ts";
import { codedProject, exactSettings, specOf } from "../support/codedProjects.ts";

const PUBLISHED = ["A'E'", "AB'", "BC'", "CD'", "DE'", "AE", "A'B", "B'C", "C'D", "D'E"];

/** A published term such as "A'E'" as diodeloom's line names, in line order. */
function asLines(term: string): string[] {
  const lits = [...term.matchAll(/([A-E])('?)/g)].map((m) => ({ stage: "ABCDE".indexOf(m[1] as string), high: m[2] === "" }));
  return lits.sort((a, b) => a.stage - b.stage || Number(b.high) - Number(a.high)).map((l) => `${l.high ? "" : "n"}Q${l.stage}`);
}

describe("Johnson counter decode (source: docs/sources.md, Johnson (twisted-ring) counters)", () => {
  it("decodes every state of a 5-stage counter with the published two-input gate", () => {
    const p = logicProblem(specOf(codedProject("johnson", "0123456789")));
    PUBLISHED.forEach((term, k) => {
      expect(isolatingLiterals(p, k).map(literalLine), `state ${k} = ${term}`).toEqual(asLines(term));
    });
  });

  it("decodes every state of an n-stage counter from two adjacent stages, for 2 to 8 stages", () => {
    for (let n = 2; n <= 8; n++) {
      const p = logicProblem(specOf(codedProject("johnson", "0123456789AbCdEFHJ".slice(0, 2 * n))));
      for (let k = 0; k < 2 * n; k++) {
        const stages = isolatingLiterals(p, k).map((l) => l >> 1);
        expect(stages, `n=${n} state ${k}`).toHaveLength(2);
        const [a, b] = stages as [number, number];
        expect(b - a === 1 || (a === 0 && b === n - 1), `n=${n} state ${k}: stages ${a}, ${b}`).toBe(true);
      }
    }
  });

  it("builds the two-rank decoder of 0-9 from exactly the published gates", async () => {
    const spec = specOf(codedProject("johnson", "0123456789"));
    const r = await synthesizeCoded(spec, exactSettings({ mode: "fast" }), { oneHot: synthesize });
    if (!r.ok) throw new Error(r.error.message);
    const gates = r.value.twoRank.matrix.gates.map((g) => g.inputs.join("·")).sort();
    expect(gates).toEqual(PUBLISHED.map((t) => asLines(t).join("·")).sort());
  });
});
