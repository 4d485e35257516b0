import { describe, expect, it } from "vitest";
import { logicProblem } from "../../../../src/core/logic/logicProblem.ts";
import { isolatingLiterals, statesOfLiterals, termFamily, walkStateSets } from "../../../../src/core/logic/implicants.ts";
import { disjoint, sameSet, setKey, statesOf } from "../../../../src/core/logic/stateSet.ts";
import { codedProject, customProject, specOf } from "../../../support/codedProjects.ts";

/** Every product of literals over n stages, written out: per stage absent, Q or nQ. */
function allProducts(stages: number): number[][] {
  const out: number[][] = [];
  for (let p = 0; p < 3 ** stages; p++) {
    const lits: number[] = [];
    let x = p;
    for (let i = 0; i < stages; i++) {
      const d = x % 3;
      x = Math.floor(x / 3);
      if (d > 0) lits.push(2 * i + (d === 1 ? 0 : 1));
    }
    out.push(lits);
  }
  return out;
}

describe("termFamily", () => {
  it("finds every state set a product can have, each at its fewest literals (BCD, checked against all 81 products)", () => {
    const p = logicProblem(specOf(codedProject("binary", "0123456789")));
    const walk = walkStateSets(p);
    expect(walk.complete).toBe(true);
    const fewest = new Map<string, number>();
    for (const lits of allProducts(4)) {
      const s = statesOfLiterals(p, lits);
      if (statesOf(s).length === 0 || lits.length === 0) continue;
      const key = setKey(s);
      fewest.set(key, Math.min(fewest.get(key) ?? Infinity, lits.length));
    }
    const walked = new Map(walk.nodes.map((n) => [setKey(n.states), n.literals.length]));
    // The walk meets every set but the full one (every BCD state lights something), each at its fewest literals.
    fewest.delete(setKey(statesOfLiterals(p, [])));
    expect(walked.size).toBe(fewest.size);
    for (const [key, lits] of fewest) expect(walked.get(key), key).toBe(lits);
  });

  it("keeps only terms that may feed an output, each of them a multi-output prime", () => {
    const p = logicProblem(specOf(codedProject("johnson", "0123456789")));
    const family = termFamily(p);
    expect(family.complete).toBe(true);
    for (const t of family.terms) {
      expect(sameSet(t.states, statesOfLiterals(p, t.literals))).toBe(true);
      for (const j of t.outputs) {
        expect(disjoint(t.states, p.off[j]!)).toBe(true);
        expect(disjoint(t.states, p.on[j]!)).toBe(false);
      }
      if (t.literals.length >= 2) {
        for (const drop of t.literals) {
          const parent = statesOfLiterals(
            p,
            t.literals.filter((l) => l !== drop),
          );
          expect(t.outputs.every((j) => disjoint(parent, p.off[j]!))).toBe(false);
        }
      }
    }
  });

  it("needs no product of more than two literals on a Johnson counter (every term is an arc of states)", () => {
    const p = logicProblem(specOf(codedProject("johnson", "0123456789AbCdEFHJLP")));
    const walk = walkStateSets(p);
    expect(walk.complete).toBe(true);
    expect(Math.max(...walk.nodes.map((n) => n.literals.length))).toBe(2);
  });

  it("says so when cut short, and still offers a term for every lit cell", () => {
    const p = logicProblem(specOf(codedProject("binary", "0123456789AbCdEF")));
    const family = termFamily(p, { maxSets: 5 });
    expect(family.complete).toBe(false);
    p.outputs.forEach((_, j) => {
      for (const k of statesOf(p.on[j]!))
        expect(
          family.terms.some((t) => t.outputs.includes(j) && statesOf(t.states).includes(k)),
          `${j} ${k}`,
        ).toBe(true);
    });
  });
});

describe("isolatingLiterals", () => {
  it("finds the fewest literals that pick out one state among the used codes", () => {
    const p = logicProblem(specOf(codedProject("binary", "0123456789")));
    // BCD: 8 and 9 need two literals (Q3 with Q0 or nQ0), since 10-15 are never reached; 0 needs all four.
    expect(isolatingLiterals(p, 8).length).toBe(2);
    expect(isolatingLiterals(p, 9).length).toBe(2);
    expect(isolatingLiterals(p, 0).length).toBe(4);
    for (let k = 0; k < 10; k++) expect(statesOf(statesOfLiterals(p, isolatingLiterals(p, k)))).toEqual([k]);
  });

  it("uses one literal where one stage alone tells a state apart", () => {
    const p = logicProblem(specOf(customProject(["00", "01", "11"], ["0", "1", "2"])));
    expect(isolatingLiterals(p, 2)).toEqual([2]); // Q1
  });
});
