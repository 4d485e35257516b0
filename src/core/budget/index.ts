/** Stage "budget": the design's current-setting resistors, and what every part carries in every state. */
export { solveBudget, budgetDesign } from "./budget.ts";
export { BUDGET_SCHEMA } from "./budgetTypes.ts";
export type {
  Budget,
  BudgetOptions,
  BudgetWarning,
  BudgetWarningCode,
  CornerBudget,
  CounterLineBudget,
  GateBudget,
  DiodeBudget,
  DriverBudget,
  DriverPoint,
  OutputBudget,
  OutputInState,
  SpreadCause,
  StageResistorBudget,
  StateBudget,
  SupplyBudget,
  TrimBudget,
  UnappliedWhy,
  WarningLevel,
} from "./budgetTypes.ts";
export {
  cornerBudget,
  counterBudgets,
  depthsFrom,
  diodeBudgets,
  driverBudgets,
  logicSupply,
  outputBudgets,
  segmentSupply,
  stateBudgets,
} from "./budgetFigures.ts";
export { budgetWarnings, SPREAD_NOTE_PCT, unappliedWhy } from "./budgetWarnings.ts";
export { driverPoint, readSweep } from "./sweepReading.ts";
export type { DiodeReading, GateReading, LineReading, StateReading, SweepReading } from "./sweepReading.ts";
export { stateSpreads } from "./stateSpread.ts";
export type { StateSpreadWarning } from "./stateSpread.ts";
export {
  appliesTrim,
  designFigures,
  designNote,
  designSource,
  keepsSpreads,
  OUTPUT_SPREAD_PCT,
  projectDesign,
  settleDesign,
  TRIM_MODES,
  trimEffect,
} from "./segmentDesign.ts";
export type { DesignFigures, DesignOptions, SegmentDesign, SettledDesign, TrimEffect, TrimMode } from "./segmentDesign.ts";
export { currentRanges, offTargetPct, overallSpread, spreadPct, trimSegments, windowDistancePct } from "./segmentTrim.ts";
export type { CurrentRange, SegmentTrim, TrimInput, TrimmedOutput } from "./segmentTrim.ts";
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
export { carriedVoltages, hazardousVoltageText, MAINS_SUPPLY_TEXT, safetyCautions, SELV_DC_LIMIT_V } from "./safety.ts";
export type { SafetyCaution } from "./safety.ts";
export type { BudgetFailure } from "../circuit/stateSweep.ts";
