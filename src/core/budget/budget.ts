/**
 * Stage "budget" of the pipeline: verified matrix + electrical model -> what
 * every part carries in every state (`diodeloom/budget@2`, budgetTypes.ts).
 *
 * Settles the design's emitter resistors (the trim where it improves the
 * design, emitterDesign.ts), then solves that design in every counter state
 * at nominal values, again at the lowest supply (for the drivers' headroom)
 * and at the two tolerance corners. Every figure but the trim's is of that
 * one design, the one the BOM and the decks show. All values are SI.
 */
import { cornerConditions, cornerModel } from "./corners.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { currentRanges, overallSpread } from "./emitterTrim.ts";
import { settleDesign, type EmitterDesign } from "./emitterDesign.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import type { Project } from "../project/project.ts";
import { ok, type Result } from "../result/result.ts";
import { solveAllStates, type BudgetFailure } from "../circuit/stateSweep.ts";
import { cornerBudget, counterBudgets, diodeBudgets, driverBudgets, outputBudgets, stateBudgets } from "./budgetFigures.ts";
import { budgetWarnings } from "./budgetWarnings.ts";
import { BUDGET_SCHEMA, type Budget, type BudgetOptions, type CornerBudget } from "./budgetTypes.ts";

export type { BudgetFailure } from "../circuit/stateSweep.ts";

/**
 * Works out the current and voltage budget of a verified matrix.
 *
 * @example
 * const b = solveBudget(project, spec, matrix);
 * if (b.ok) b.value.outputs["1a"]; // { minA: 1.24e-4, maxA: 1.31e-4, spreadPct: 5.4, ... }
 */
export function solveBudget(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  options: BudgetOptions = {},
): Result<Budget, BudgetFailure> {
  const e = project.electrical;
  const series = options.series ?? "E24";
  const mode = options.trim ?? "auto";
  const windowPct = options.windowPct ?? 20;
  if (!(windowPct > 0 && windowPct < 100)) throw new RangeError(`windowPct must be between 0 and 100, got ${windowPct}`);

  const settled = settleDesign(project, spec, matrix, { series, mode });
  if (!settled.ok) return settled;
  const { design, solutions, trim } = settled.value;
  const chosen = design.trimmed ? design.emitterOhms : undefined;
  const lowSupply = solveAllStates(spec, matrix, { ...e, supply: { ...e.supply, volts: e.supply.minVolts } }, "lowest supply", chosen);
  if (!lowSupply.ok) return lowSupply;

  const driven = solutions[0]?.circuit.drivers.map((d) => d.output) ?? [];
  const corners: CornerBudget[] = [];
  for (const c of cornerConditions(e)) {
    const sol = solveAllStates(spec, matrix, cornerModel(e, c, driven, chosen), `${c.name} corner`);
    if (!sol.ok) return sol;
    corners.push(cornerBudget(spec, c, sol.value));
  }
  const [low, high] = corners as [CornerBudget, CornerBudget];

  const states = stateBudgets(spec, solutions);
  const maxSupplyA = Math.max(0, ...states.map((s) => s.supplyCurrentA));
  const targetA = e.string.targetA;
  const w = windowPct / 100;
  const meetsTarget =
    driven.length === 0 ||
    (low.minCurrentA >= targetA * (1 - w) &&
      high.maxCurrentA <= targetA * (1 + w) &&
      high.maxCurrentA <= e.string.maxA &&
      low.minHeadroomV > 0);

  const budget: Omit<Budget, "warnings"> = {
    schema: BUDGET_SCHEMA,
    title: project.title,
    temperatureC: e.temperatureC,
    targetCurrentA: targetA,
    emitterResistors: design.trimmed ? "trimmed" : "project",
    states,
    outputs: outputBudgets(spec, matrix, solutions),
    spreadPct: overallSpread(currentRanges(spec, solutions)),
    diodes: diodeBudgets(project, matrix, solutions),
    counterLines: counterBudgets(project, solutions),
    drivers: driverBudgets(project, spec, solutions, lowSupply.value),
    supply: { volts: e.supply.volts, maxCurrentA: maxSupplyA, maxPowerW: maxSupplyA * e.supply.volts },
    trim: {
      series,
      mode,
      applied: design.trimmed,
      effect: design.effect ?? "no-change",
      outputs: trim.outputs,
      spreadPctBefore: settled.value.before.spreadPct,
      spreadPct: settled.value.after.spreadPct,
      offTargetPctBefore: settled.value.before.offTargetPct,
      offTargetPct: settled.value.after.offTargetPct,
    },
    corners: { windowPct, meetsTarget, low, high },
  };
  return ok({ ...budget, warnings: budgetWarnings(project, budget) });
}

/**
 * The emitter design a budget describes: the values the BOM, the decks and
 * the parts list must show for it.
 *
 * @example
 * designators(spec, matrix, project.electrical, budgetDesign(budget).emitterOhms);
 */
export function budgetDesign(b: Budget): EmitterDesign {
  return {
    mode: b.trim.mode,
    series: b.trim.series,
    trimmed: b.trim.applied,
    effect: b.trim.effect,
    emitterOhms: new Map(Object.entries(b.drivers).map(([o, d]) => [o, d.emitterOhms])),
  };
}
