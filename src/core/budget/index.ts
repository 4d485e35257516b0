/** Stage "budget": the design's emitter resistors, and what every part carries in every state. */
export { solveBudget, budgetDesign } from "./budget.ts";
export { BUDGET_SCHEMA } from "./budgetTypes.ts";
export type {
  Budget,
  BudgetOptions,
  BudgetWarning,
  BudgetWarningCode,
  CornerBudget,
  CounterLineBudget,
  DiodeBudget,
  DriverBudget,
  OutputBudget,
  OutputInState,
  StateBudget,
  TrimBudget,
  UnappliedWhy,
  WarningLevel,
} from "./budgetTypes.ts";
export { cornerBudget, counterBudgets, diodeBudgets, driverBudgets, outputBudgets, stateBudgets } from "./budgetFigures.ts";
export { budgetWarnings, SPREAD_NOTE_PCT, unappliedWhy } from "./budgetWarnings.ts";
export {
  appliesTrim,
  designFigures,
  designNote,
  designSource,
  projectDesign,
  settleDesign,
  TRIM_MODES,
  trimEffect,
} from "./emitterDesign.ts";
export type { DesignFigures, EmitterDesign, SettledDesign, TrimEffect, TrimMode } from "./emitterDesign.ts";
export { currentRanges, offTargetPct, overallSpread, spreadPct, trimEmitters } from "./emitterTrim.ts";
export type { CurrentRange, EmitterTrim, TrimInput, TrimmedOutput } from "./emitterTrim.ts";
export {
  cornerConditions,
  cornerModel,
  JUNCTION_TEMPCO_V_PER_K,
  ledSaturationCurrent,
  SILICON_EG_EV,
  SILICON_XTI,
  siliconSaturationCurrent,
} from "./corners.ts";
export type { CornerConditions, CornerName, JunctionAt } from "./corners.ts";
export { E24, E96, nearestPreferred, preferredNeighbours } from "./eSeries.ts";
export type { ESeriesName } from "./eSeries.ts";
export { hazardousVoltageText, MAINS_SUPPLY_TEXT, safetyCautions, SELV_DC_LIMIT_V } from "./safety.ts";
export type { SafetyCaution } from "./safety.ts";
export type { BudgetFailure } from "../circuit/stateSweep.ts";
