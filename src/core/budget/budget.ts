/**
 * Stage "budget" of the pipeline: verified matrix + electrical model -> what
 * every part carries in every state (`diodeloom/budget@3`, budgetTypes.ts).
 *
 * Settles the design's current-setting resistors (the trim where the rule
 * allows it, segmentDesign.ts), then solves that design in every counter
 * state at nominal values, again at the lowest supply (for the sinks' and
 * followers' headroom) and at the two tolerance corners (the low one is
 * also where a switch's saturation is judged). Every figure but the trim's
 * is of that one design, the one the BOM, the decks and the drawing show.
 * All values are SI.
 */
import { cornerConditions, cornerModel, type CornerConditions } from "./corners.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { currentRanges, overallSpread } from "./segmentTrim.ts";
import { designModel, settleDesign, type SegmentDesign } from "./segmentDesign.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import { currentRole, designators, type CircuitModel, type DarkNetworkValues } from "../matrix/designators.ts";
import { darkFigures, type GhostCheck } from "./ghostCheck.ts";
import type { Project } from "../project/project.ts";
import { ok, type Result } from "../result/result.ts";
import type { BudgetFailure } from "../circuit/stateSweep.ts";
import { DcWorkspace } from "../circuit/dcSolver.ts";
import { readSweep } from "./sweepReading.ts";
import {
  cornerBudget,
  counterBudgets,
  diodeBudgets,
  driverBudgets,
  gateBudgets,
  logicSupply,
  outputBudgets,
  segmentSupply,
  stateBudgets,
  worstUnlit,
} from "./budgetFigures.ts";
import { budgetWarnings } from "./budgetWarnings.ts";
import { stateSpreads } from "./stateSpread.ts";
import { BUDGET_SCHEMA, type Budget, type BudgetCoverage, type BudgetOptions, type DarkBudget, type TargetLimit } from "./budgetTypes.ts";
import { buildCircuit } from "../circuit/circuit.ts";
import { checkedStates } from "./budgetWork.ts";

export type { BudgetFailure } from "../circuit/stateSweep.ts";

/**
 * Works out the current and voltage budget of a verified matrix.
 *
 * @example
 * const b = solveBudget(project, spec, matrix);
 * if (b.ok) b.value.outputs["1a"]; // { minA: 0.0098, maxA: 0.0099, spreadPct: 0.4, ... }
 */
export function solveBudget(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  options: BudgetOptions = {},
): Result<Budget, BudgetFailure> {
  const series = options.series ?? "E24";
  const mode = options.trim ?? "auto";
  const windowPct = options.windowPct ?? 20;
  if (!(windowPct > 0 && windowPct < 100)) throw new RangeError(`windowPct must be between 0 and 100, got ${windowPct}`);

  // One scratch space for every sweep: the nodal matrix of a big matrix is allocated once.
  const workspace = new DcWorkspace();
  const coverage = budgetCoverage(project, spec, matrix, options.timeLimitMs);
  const states = coverage?.checked;
  const settled = settleDesign(project, spec, matrix, { series, mode, windowPct, deadlineMs: options.deadlineMs, workspace, states });
  if (!settled.ok) return settled;
  const { design, solutions, trim } = settled.value;
  // Every solve below is of the design: its input network too, where outputs are decoded dark.
  const e: CircuitModel = designModel(project.electrical, design);
  const chosen = design.trimmed ? design.ohms : undefined;
  const lowSupply = readSweep(spec, matrix, { ...e, supply: { ...e.supply, volts: e.supply.minVolts } }, "lowest supply", {
    design: chosen,
    deadlineMs: options.deadlineMs,
    workspace,
    states,
  });
  if (!lowSupply.ok) return lowSupply;

  const driven = solutions.drivers.map((d) => d.output);
  const [lowConditions, highConditions] = cornerConditions(e);
  const corner = (c: CornerConditions) =>
    readSweep(spec, matrix, cornerModel(e, c, driven, chosen), `${c.name} corner`, { deadlineMs: options.deadlineMs, workspace, states });
  const lowSweep = corner(lowConditions);
  if (!lowSweep.ok) return lowSweep;
  const low = cornerBudget(project, spec, lowConditions, lowSweep.value);
  const highSweep = corner(highConditions);
  if (!highSweep.ok) return highSweep;
  const high = cornerBudget(project, spec, highConditions, highSweep.value);

  const targetA = e.segment.targetA;
  const w = windowPct / 100;
  const drivers = driverBudgets(project, spec, solutions, lowSupply.value, lowSweep.value);
  const shortOf: TargetLimit[] = [];
  if (driven.length > 0) {
    if (low.minCurrentA < targetA * (1 - w)) shortOf.push("below-window");
    if (high.maxCurrentA > targetA * (1 + w)) shortOf.push("above-window");
    if (high.maxCurrentA > e.segment.maxA) shortOf.push("over-rating");
    if (low.minHeadroomV !== null && !(low.minHeadroomV > 0)) shortOf.push("no-headroom");
    if (Object.values(drivers).some((d) => d.saturated === false)) shortOf.push("switch-unsaturated");
  }
  const meetsTarget = shortOf.length === 0;

  const outputs = outputBudgets(spec, matrix, solutions);
  const budget: Omit<Budget, "warnings"> = {
    schema: BUDGET_SCHEMA,
    title: project.title,
    kind: e.driver.kind,
    temperatureC: e.temperatureC,
    targetA,
    maxA: e.segment.maxA,
    design: design.trimmed ? "trimmed" : "project",
    states: stateBudgets(spec, solutions),
    outputs,
    spreadPct: overallSpread(currentRanges(spec, solutions)),
    diodes: diodeBudgets(project, matrix, solutions),
    counterLines: counterBudgets(project, matrix, solutions),
    gates: gateBudgets(matrix, solutions),
    drivers,
    supply: segmentSupply(project, solutions),
    logic: logicSupply(project, solutions),
    trim: {
      series,
      mode,
      role: currentRole(e.driver.kind),
      applied: design.trimmed,
      effect: design.effect ?? "no-change",
      outputs: trim.outputs,
      judgedOhms: Object.fromEntries(settled.value.judged),
      spreadPctBefore: settled.value.before.spreadPct,
      spreadPct: settled.value.after.spreadPct,
      offTargetPctBefore: settled.value.before.offTargetPct,
      offTargetPct: settled.value.after.offTargetPct,
      windowDistancePctBefore: settled.value.before.windowDistancePct,
      windowDistancePct: settled.value.after.windowDistancePct,
    },
    corners: { windowPct, meetsTarget, shortOf, low, high },
    unlit: {
      ghostLimitA: e.ghostFraction * targetA,
      nominal: worstUnlit(spec, solutions),
      low: worstUnlit(spec, lowSweep.value),
      high: worstUnlit(spec, highSweep.value),
    },
    dark:
      design.network === null || design.network === undefined
        ? null
        : darkBudget(
            project,
            spec,
            matrix,
            e,
            design.network,
            darkFigures(
              project,
              spec,
              matrix,
              design.network,
              [
                { name: "nominal", reading: solutions },
                { name: "low", reading: lowSweep.value },
                { name: "high", reading: highSweep.value },
              ],
              windowPct,
            ),
            settled.value.darkSizing?.binding ?? "",
          ),
    ...(coverage === null ? {} : { coverage }),
  };
  const spreads = stateSpreads({ spec, matrix, kind: e.driver.kind, solutions, outputs });
  return ok({ ...budget, warnings: budgetWarnings(project, budget, spreads) });
}

/**
 * The states the budget checks where its time limit's work does not cover
 * every one (budgetWork.ts), or null where it checks them all.
 */
export function budgetCoverage(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  timeLimitMs: number | undefined,
): BudgetCoverage | null {
  if (timeLimitMs === undefined) return null;
  const total = matrix.states.length;
  const elements = buildCircuit(spec, matrix, project.electrical, 0).elements.length;
  const checked = checkedStates(elements, total, timeLimitMs);
  return checked < total ? { checked, states: total, timeLimitMs } : null;
}

/** The dark-decoded outputs' part of the budget: the network's parts and values, and the check of the design. */
function darkBudget(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  model: CircuitModel,
  network: DarkNetworkValues,
  check: GhostCheck,
  sizing: string,
): DarkBudget {
  const parts = designators(spec, matrix, model);
  const bleed = new Map(parts.drivers.map((d) => [d.output, d.pullDown.ref]));
  const { values: _values, windowPct: _windowPct, why: _why, binding, ...figures } = check;
  return {
    input: network.dividerOhms === null ? "level-shift" : "divider",
    pullUpOhms: network.pullUpOhms,
    shiftDiodes: network.dividerOhms === null ? network.shiftDiodes : 0,
    dividerOhms: network.dividerOhms,
    bleedOhms: network.dividerLowerOhms ?? project.electrical.pullDown,
    outputs: parts.darkInputs.map((p) => ({
      output: p.output,
      pullUp: p.pullUp.ref,
      divider: p.divider?.ref ?? null,
      shiftDiodes: p.shiftDiodes,
      bleed: bleed.get(p.output) ?? "",
    })),
    ...figures,
    verdict: binding,
    sizing,
  };
}

/**
 * The design a budget describes: the values the BOM, the decks, the drawing
 * and the parts list must show for it.
 *
 * @example
 * const d = budgetDesign(budget);
 * designators(spec, matrix, designModel(project.electrical, d), d.ohms);
 */
export function budgetDesign(b: Budget): SegmentDesign {
  return {
    mode: b.trim.mode,
    series: b.trim.series,
    role: b.trim.role,
    trimmed: b.trim.applied,
    effect: b.trim.effect,
    ohms: new Map(Object.entries(b.drivers).map(([o, d]) => [o, d.currentResistor.ohms])),
    network:
      b.dark === null
        ? null
        : {
            pullUpOhms: b.dark.pullUpOhms,
            shiftDiodes: b.dark.shiftDiodes,
            dividerOhms: b.dark.dividerOhms,
            dividerLowerOhms: b.dark.dividerOhms === null ? null : b.dark.bleedOhms,
          },
  };
}
