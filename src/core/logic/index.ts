/**
 * Stage 2 for coded counters (Johnson, binary, custom): minimum two-level
 * diode logic from the counter's stage lines, its independent verifier, the
 * two-rank alternative and the power-up table. `synthesize` (synth/) sends
 * coded specs here; the rest is listed for the command, the app, tests and
 * the bench.
 */
export { coverSearchWork, synthesizeCoded, twoLevelBudget, twoRankDecoder, twoRankSettings } from "./synthesizeCoded.ts";
export { improveCover } from "./coverSearch.ts";
export type { CodedHooks, CodedSynthesis, DecoderStructure, TwoLevelEnd, TwoLevelResult } from "./synthesizeCoded.ts";
export { literalAt, literalIndex, literalLine, logicProblem } from "./logicProblem.ts";
export type { LogicProblem } from "./logicProblem.ts";
export {
  FAMILY_MAX_SETS,
  feedableOutputs,
  isolatingLiterals,
  statesOfLiterals,
  termCost,
  termCovers,
  termFamily,
  walkStateSets,
} from "./implicants.ts";
export type { FamilyOptions, StateSetNode, Term, TermFamily } from "./implicants.ts";
export { compareCovers, coverDiodes, coverExact, coverGates, pruneCover } from "./cover.ts";
export type { Cover, CoverTerm } from "./cover.ts";
export { heuristicCover, stateGateCover } from "./coverHeuristic.ts";
export { coverModel } from "./coverModel.ts";
export type { CoverModel, CoverModelOptions } from "./coverModel.ts";
export { twoLevelExact } from "./twoLevelExact.ts";
export type { TwoLevelExactOptions, TwoLevelOutcome, TwoLevelStatus } from "./twoLevelExact.ts";
export { twoLevelFloor } from "./twoLevelBound.ts";
export { coverPlan, logicMatrix } from "./logicMatrix.ts";
export type { LogicNode, LogicPlan } from "./logicMatrix.ts";
export { litByCode, verifyLogic } from "./verifyLogic.ts";
export type { LogicLimits } from "./verifyLogic.ts";
export { hasRepeatedRows, mergedLines, rankedDecoder, stateLines } from "./twoRank.ts";
export type { DecodedLine, OneHotSynth, RankedDecoder } from "./twoRank.ts";
export { decoderTerms } from "./decoderTerms.ts";
export type { DecoderTerm } from "./decoderTerms.ts";
export { glyphNamer, POWER_UP_MAX_STAGES, powerUpTable, powerUpText } from "./powerUp.ts";
export type { PowerUpEntry, PowerUpTable } from "./powerUp.ts";
export {
  disjoint,
  fullSet,
  hasState,
  intersect,
  isEmpty,
  isSubset,
  sameSet,
  setKey,
  setOf,
  setSize,
  setWords,
  statesOf,
  union,
} from "./stateSet.ts";
export type { StateSet } from "./stateSet.ts";
