/**
 * The budget of a coded counter's decoder: the gates' low level keeps
 * their outputs dark, the high level drives the segments, and the stage
 * lines' sinking is checked against their rating.
 */
import { describe, expect, it } from "vitest";
import { solveBudget } from "../../../../src/core/budget/budget.ts";
import { codedDecoder } from "../../../support/codedProjects.ts";
import { makeProject2 } from "../../../support/projects.ts";
import type { Budget } from "../../../../src/core/budget/budgetTypes.ts";

function bcdBudget(electrical: Record<string, unknown> = {}): Budget {
  const { project, spec, matrix } = codedDecoder(
    makeProject2({ counter: { states: 10, code: "binary" }, display: {}, show: [..."0123456789"], electrical }),
  );
  const b = solveBudget(project, spec, { ...matrix, verified: true });
  if (!b.ok) throw new Error(b.error.message);
  return b.value;
}

describe("solveBudget on a coded decoder", () => {
  it("with the defaults: every gate low well below a diode drop above the line, no ghost, every lit segment in the window", () => {
    const b = bcdBudget();
    expect(b.warnings.filter((w) => w.level !== "info")).toEqual([]);
    for (const g of Object.values(b.gates)) {
      expect(g.lowMaxV).not.toBeNull();
      expect(g.lowMaxV as number).toBeLessThan(0.9);
    }
    for (const o of Object.values(b.outputs)) expect(o.offMaxA).toBeLessThan(0.01 * b.targetA);
    expect(b.corners.meetsTarget).toBe(true);
    // The logic supply feeds the pull-ups: at least one gate's pull-up current in every state.
    expect(b.logic.maxCurrentA).toBeGreaterThan(Math.min(...Object.values(b.gates).map((g) => g.maxPullUpA)));
  });

  it("a stage line that sinks from the gates it holds low sits higher behind a soft low level, and the budget reports the ghosts", () => {
    const b = bcdBudget({ counterOutput: { lowResistance: 470 } });
    const ghosts = b.warnings.filter((w) => w.code === "ghost-segment");
    expect(ghosts.length).toBeGreaterThan(0);
    expect(Math.max(...Object.values(b.gates).map((g) => g.lowMaxV ?? 0))).toBeGreaterThan(1.5);
  });

  it("warns when a low stage line sinks more than it may", () => {
    const b = bcdBudget({ gatePullUp: 470 });
    const sinks = b.warnings.filter((w) => w.code === "line-sink");
    expect(sinks.length).toBeGreaterThan(0);
    for (const w of sinks) {
      if (w.code !== "line-sink") continue;
      expect(w.currentA).toBeGreaterThan(w.ratedA);
      expect(b.counterLines[w.line]?.sinkCurrentA).toBe(w.currentA);
      expect(b.counterLines[w.line]?.sinkState).toBe(w.state);
      expect(w.from).toBe("gate-pull-ups");
    }
  });
});
