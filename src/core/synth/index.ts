/**
 * Stage 2 of the pipeline, decode spec -> verified matrix: `synthesize` and
 * the engines under it. Outside this folder, `synthesize` and its types are
 * what the app and the command use; the rest is listed for tests and the
 * bench.
 */
export { synthesize, synthSettings, verified } from "./synthesize.ts";
export type { SynthFailure, SynthHooks, SynthMode, SynthProgress, SynthSettings } from "./synthesize.ts";
export { synthesizeDirect } from "./direct.ts";
export { HEURISTIC_DEFAULT_WORK, heuristicPlan } from "./heuristic.ts";
export { REFINE_MAX_ROW_OUTPUTS, refineApplies, refinePlan } from "./refine.ts";
export type { HeuristicOptions } from "./heuristic.ts";
export { busShapes, greedyCover, GREEDY_ORDERS } from "./greedyCover.ts";
export type { GreedyOrder, ShapePool } from "./greedyCover.ts";
export { defaultHighsLoader, exactPlan } from "./exact.ts";
export type { ExactOptions, ExactOutcome, ExactStatus, HighsInterruptEvent, HighsLike, HighsLoader, HighsModelLike } from "./exact.ts";
export { runHighs } from "./highsRun.ts";
export type { HighsRunOptions, HighsRunOutcome, MilpModel } from "./highsRun.ts";
export { deadlineMarginMs, workBudget } from "./workBudget.ts";
export type { WorkBudget } from "./workBudget.ts";
export { WorkMeter } from "./workMeter.ts";
export { SEARCH_MAX_OUTPUTS, searchApplies, searchPlan } from "./search.ts";
export type { SearchOptions, SearchOutcome } from "./search.ts";
export { lpLowerBound, trivialLowerBound } from "./bounds.ts";
export { LAGRANGE_MAX_ROW_OUTPUTS, lagrangeBound } from "./lagrangeBound.ts";
export type { LagrangeBound, LagrangeOptions } from "./lagrangeBound.ts";
export type { LpBound, LpBoundOptions, LpModelLike } from "./bounds.ts";
export { candidateFamily, DEFAULT_FAMILY_LIMITS } from "./candidates.ts";
export type { BusCandidate, CandidateFamily, FamilyLimits } from "./candidates.ts";
export { buildSharingModel } from "./model.ts";
export type { SharingModel } from "./model.ts";
export { contractPlan, expandPlan, reduceRows, unionPlans } from "./reduce.ts";
export type { Reduction } from "./reduce.ts";
export { directPlan, litCount, planCost, planCount, planEdges, problemFromLit, sharingProblem } from "./plan.ts";
export type { PlanBus, PlanLink, SharingPlan, SharingProblem, SharingRules } from "./plan.ts";
export { busFits, busPays, busStates, levelRules, linkFits, linkPairs, statesLighting, statesToPay } from "./rules.ts";
export { betterPlan, breakTies, comparePlans } from "./tieBreak.ts";
