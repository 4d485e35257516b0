import { describe, expect, it } from "vitest";
import { solveBudget } from "../../../../src/core/budget/budget.ts";
import { logicNotes } from "../../../../src/ui/state/instrumentSummary.ts";
import type { DecoderSummary } from "../../../../src/ui/workers/summaryRun.ts";
import { directDesign } from "../../../support/budgetFixtures.ts";
import { example, showingWith } from "../../../support/projects.ts";

function done(d: ReturnType<typeof directDesign>): DecoderSummary {
  const budget = solveBudget(d.project, d.spec, d.matrix);
  if (!budget.ok) throw new Error(budget.error.message);
  return {
    status: "done",
    figures: { diodes: d.matrix.diodes.length, transistors: 7, resistors: 21, optimal: false, matrix: d.matrix, budget },
  };
}

describe("logicNotes", () => {
  it("says why a decoder on high-side switches draws nothing from the logic supply, and nothing of a decoder that draws from it or has no figures", () => {
    const rows: DecoderSummary[] = [
      done(directDesign("team", showingWith(["1", "7"], { preset: "bench-5v-switch" }))),
      done(directDesign("round", example("quiz-scoreboard"))),
      { status: "computing" },
      { status: "failed", message: "no matrix" },
    ];
    expect(logicNotes(rows, ["team", "round", "third", "fourth"])).toEqual([
      "round: logic supply, nothing drawn: the high-side switches' active-low lines only sink current, the switches' base and pull-up currents from the segment supply.",
    ]);
  });
});
