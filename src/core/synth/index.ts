/**
 * Stage 2 of the pipeline, decode spec -> verified matrix: `synthesize` and
 * the engines under it. Outside this folder, `synthesize` and its types are
 * what the app and the command use; the rest is listed for tests and the
 * bench.
 */
export { synthesize, synthSettings, verified } from "./synthesize.ts";
export type { SynthFailure, SynthHooks, SynthMode, SynthProgress, SynthSettings } from "./synthesize.ts";
export { synthesizeDirect } from "./direct.ts";
export { heuristicPlan } from "./heuristic.ts";
export { deadlineMarginMs, defaultHighsLoader, exactPlan, workBudget } from "./exact.ts";
export type {
  ExactOptions,
  ExactOutcome,
  ExactStatus,
  HighsInterruptEvent,
  HighsLike,
  HighsLoader,
  HighsModelLike,
  WorkBudget,
} from "./exact.ts";
export { SEARCH_MAX_OUTPUTS, searchApplies, searchPlan } from "./search.ts";
export type { SearchOptions, SearchOutcome } from "./search.ts";
export { lpLowerBound, trivialLowerBound } from "./bounds.ts";
export type { LpBound, LpBoundOptions, LpModelLike } from "./bounds.ts";
export { candidateFamily, DEFAULT_FAMILY_LIMITS } from "./candidates.ts";
export type { BusCandidate, CandidateFamily, FamilyLimits } from "./candidates.ts";
export { buildSharingModel } from "./model.ts";
export type { SharingModel } from "./model.ts";
export { directPlan, litCount, planCount, planEdges, problemFromLit, sharingProblem } from "./plan.ts";
export type { PlanBus, PlanLink, SharingPlan, SharingProblem, SharingRules } from "./plan.ts";
export { busFits, busPays, busStates, levelRules, linkFits, linkPairs, statesLighting, statesToPay } from "./rules.ts";
export { betterPlan, breakTies, comparePlans } from "./tieBreak.ts";
