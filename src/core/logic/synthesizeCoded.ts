/**
 * Stage 2 for a coded counter (Johnson, binary, custom): decode spec ->
 * verified decoder of diode AND gates and OR diodes.
 *
 * 1. Two-level logic: the candidate terms (implicants.ts), a heuristic cover,
 *    then (in `exact` mode) the covering MILP on HiGHS, which proves the
 *    fewest diodes, then the fewest gates, over every two-level decoder when
 *    the family is complete; otherwise an honest floor bounds it.
 * 2. The two-rank decoder (twoRank.ts): one gate per state, then the ring
 *    counter's matrix optimizer on the state lines. At depth limits of 2 and
 *    more its shared bus nodes may beat two-level logic; the variant with
 *    merged states is tried too. The result is the best verified decoder by
 *    diodes, then gates, two-level on a tie.
 *
 * `lowerBound` and `optimal` speak of two-level logic; a decoder with bus
 * nodes carries no bound. Every budget comes from the configured time limit
 * (the two-level stage, and a third of it for each two-rank run), so the same
 * settings give the same decoder on any machine.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import { LIMITS } from "../project/limits.ts";
import { fail, ok, type Result } from "../result/result.ts";
import { defaultHighsLoader, type HighsLoader } from "../synth/exact.ts";
import type { SynthFailure, SynthProgress, SynthSettings } from "../synth/synthesize.ts";
import { workBudget, type WorkBudget } from "../synth/workBudget.ts";
import { WorkMeter } from "../synth/workMeter.ts";
import { logicProblem, type LogicProblem } from "./logicProblem.ts";
import { termFamily, walkStateSets } from "./implicants.ts";
import { coverDiodes, coverGates, type Cover } from "./cover.ts";
import { heuristicCover, stateGateCover } from "./coverHeuristic.ts";
import { improveCover } from "./coverSearch.ts";
import { twoLevelExact, type TwoLevelStatus } from "./twoLevelExact.ts";
import { twoLevelFloor } from "./twoLevelBound.ts";
import { coverPlan, logicMatrix } from "./logicMatrix.ts";
import { verifyLogic } from "./verifyLogic.ts";
import { hasRepeatedRows, mergedLines, rankedDecoder, stateLines, type OneHotSynth, type RankedDecoder } from "./twoRank.ts";

/** Share of the time limit the two-level stage's HiGHS budgets plan for. */
const TWO_LEVEL_SHARE = 0.3;
/**
 * HiGHS work (LP iterations times columns) per millisecond on the covering
 * model: about 1 700 measured at the root of binary mod 60 showing 00-59
 * (2 557 columns, 12 846 iterations in 19 s with the machine's two cores
 * loaded several times over), so the slow, busy rate is what the budget plans for.
 */
const COVER_HIGHS_RATE = 1_500;
/** HiGHS branch-and-bound nodes per millisecond (the matrix optimizer's figure, synth/workBudget.ts). */
const COVER_NODE_RATE = 1 / 35;

/** Share of the time limit the local search on the greedy cover plans for. */
const COVER_SEARCH_SHARE = 0.1;
/**
 * Local-search work units (terms looked at) per millisecond: about 2 300
 * measured on binary mod 100 showing 00-99 (5.9 million units in 2.6 s, the
 * machine's two cores shared with other jobs).
 */
const COVER_SEARCH_RATE = 2_000;

/** The local search's work budget for a time limit (coverSearch.ts). */
export function coverSearchWork(timeLimitMs: number): number {
  return Math.max(1e4, Math.floor(timeLimitMs * COVER_SEARCH_SHARE * COVER_SEARCH_RATE));
}

/**
 * The two-level stage's budgets for a time limit: the family and the
 * heuristic take their shares as in synth/workBudget.ts; HiGHS may spend
 * about `TWO_LEVEL_SHARE` of the limit on its two solves.
 *
 * @example
 * twoLevelBudget(20_000).highsWork; // 9 000 000
 */
export function twoLevelBudget(timeLimitMs: number): WorkBudget {
  return {
    ...workBudget(timeLimitMs),
    highsWork: Math.max(1e5, Math.floor(timeLimitMs * TWO_LEVEL_SHARE * COVER_HIGHS_RATE)),
    highsNodes: Math.max(20, Math.floor(timeLimitMs * TWO_LEVEL_SHARE * COVER_NODE_RATE)),
  };
}

/** How the two-level stage ended. */
export type TwoLevelEnd = TwoLevelStatus | "heuristic" | "direct" | "nothing-to-drive";

/** The two-level decoder and what is known about it. */
export interface TwoLevelResult {
  readonly matrix: VerifiedMatrix;
  /** AND gates. */
  readonly gates: number;
  /** Proven lower bound on the diodes of every two-level decoder. */
  readonly lowerBound: number;
  /** True when the gate count is proven least at this diode count. */
  readonly gatesProven: boolean;
  readonly end: TwoLevelEnd;
  /** True when the candidate family held a cheapest term for every reachable state set. */
  readonly complete: boolean;
  /** Candidate terms, and the model's columns and rows (0 when no model ran). */
  readonly terms: number;
  readonly columns: number;
  readonly rows: number;
}

/** Which structure the chosen decoder has. */
export type DecoderStructure = "two-level" | "two-rank" | "merged";

export interface CodedSynthesis {
  /** The chosen decoder: the best verified one by diodes, then gates. */
  readonly matrix: VerifiedMatrix;
  readonly structure: DecoderStructure;
  readonly twoLevel: TwoLevelResult;
  /** One gate per state, then the ring-counter matrix on the state lines. */
  readonly twoRank: RankedDecoder;
}

export interface CodedHooks {
  readonly loadHighs?: HighsLoader;
  readonly onProgress?: (progress: SynthProgress) => void;
  /** The ring counter's synthesizer for the two-rank decoders (`synthesize` passes itself). */
  readonly oneHot: OneHotSynth;
}

/**
 * Synthesizes a coded counter's decoder.
 *
 * @example
 * const r = await synthesizeCoded(spec, synthSettings(project), { oneHot: synthesize });
 * if (r.ok) [r.value.matrix.count, r.value.matrix.gates.length]; // BCD 0-9: [40, 7]
 */
export async function synthesizeCoded(
  spec: DecodeSpec,
  settings: SynthSettings,
  hooks: CodedHooks,
): Promise<Result<CodedSynthesis, SynthFailure>> {
  const problem = checkSettings(settings);
  if (problem) return fail(problem);
  const p = logicProblem(spec);
  const started = Date.now();
  // The two-level stage is the main work: its budgets are planned to take about a third of the limit
  // (TWO_LEVEL_SHARE). Each two-rank run is a synthesis of its own with a quarter of the limit, which
  // its budgets plan to end at about a third of that.
  const twoLevel = await twoLevelDecoder(spec, p, settings, started, hooks);
  if (!twoLevel.ok) return twoLevel;
  const rankSettings = twoRankSettings(settings);
  const twoRank = await rankedDecoder(spec, p, stateLines(p), rankSettings, hooks.oneHot);
  if (!twoRank.ok) return twoRank;

  let matrix = twoLevel.value.matrix;
  let structure: DecoderStructure = "two-level";
  const consider = (m: VerifiedMatrix, s: DecoderStructure): void => {
    if (m.count < matrix.count || (m.count === matrix.count && m.gates.length < matrix.gates.length)) {
      matrix = m;
      structure = s;
    }
  };
  if (settings.mode !== "direct") consider(twoRank.value.matrix, "two-rank");
  if (settings.mode !== "direct" && settings.depthLimit >= 2 && hasRepeatedRows(spec)) {
    const walk = walkStateSets(p, { meter: new WorkMeter(workBudget(rankSettings.timeLimitMs).familyWork) });
    const merged = await rankedDecoder(spec, p, mergedLines(p, spec, walk.nodes), rankSettings, hooks.oneHot);
    if (!merged.ok) return merged;
    consider(merged.value.matrix, "merged");
  }
  return ok({ matrix, structure, twoLevel: twoLevel.value, twoRank: twoRank.value });
}

/** The settings of a two-rank run: the project's, with a quarter of its time limit. */
export function twoRankSettings(settings: SynthSettings): SynthSettings {
  return { ...settings, timeLimitMs: Math.max(LIMITS.timeLimitMs.min, Math.floor(settings.timeLimitMs / 4)) };
}

/**
 * The two-rank decoder of a coded spec on its own, exactly as
 * `synthesizeCoded` builds it for the same settings (the app asks for it
 * beside the decoder it shows).
 *
 * @example
 * const r = await twoRankDecoder(spec, synthSettings(project), synthesize);
 * if (r.ok) r.value.gateDiodes; // 20 for 0-9 on a 5-stage Johnson counter
 */
export async function twoRankDecoder(
  spec: DecodeSpec,
  settings: SynthSettings,
  oneHot: OneHotSynth,
): Promise<Result<RankedDecoder, SynthFailure>> {
  const problem = checkSettings(settings);
  if (problem) return fail(problem);
  const p = logicProblem(spec);
  return rankedDecoder(spec, p, stateLines(p), twoRankSettings(settings), oneHot);
}

/** The two-level stage: direct, heuristic or exact by the mode. */
async function twoLevelDecoder(
  spec: DecodeSpec,
  p: LogicProblem,
  settings: SynthSettings,
  started: number,
  hooks: CodedHooks,
): Promise<Result<TwoLevelResult, SynthFailure>> {
  const meta = { depthLimit: settings.depthLimit, policy: settings.policy };
  if (spec.outputs.length === 0) {
    const matrix = logicMatrix(spec, { gates: [], edges: [] }, { ...meta, lowerBound: 0, optimal: true, method: "exact" });
    return finish(spec, settings, matrix, {
      gates: 0,
      lowerBound: 0,
      gatesProven: true,
      end: "nothing-to-drive",
      complete: true,
      terms: 0,
      columns: 0,
      rows: 0,
    });
  }
  if (settings.mode === "direct") {
    // One gate per state, one OR diode per lit cell: the decode builders start from.
    const cover = stateGateCover(p);
    const matrix = logicMatrix(spec, coverPlan(spec, cover), { ...meta, lowerBound: null, optimal: false, method: "direct" });
    return finish(spec, settings, matrix, {
      gates: coverGates(cover),
      lowerBound: 0,
      gatesProven: false,
      end: "direct",
      complete: false,
      terms: 0,
      columns: 0,
      rows: 0,
    });
  }
  const budget = twoLevelBudget(settings.timeLimitMs);
  // The clock stops the two-level stage in time for the two-rank runs.
  const deadlineMs = started + settings.timeLimitMs / 2;
  const familyMeter = new WorkMeter(budget.familyWork, deadlineMs);
  const family = termFamily(p, { meter: familyMeter });
  const heuristicMeter = new WorkMeter(budget.heuristicWork, deadlineMs);
  const searchMeter = new WorkMeter(coverSearchWork(settings.timeLimitMs), deadlineMs);
  const warm = improveCover(p, family.terms, heuristicCover(p, family.terms, heuristicMeter), searchMeter);
  const floor = Math.min(coverDiodes(warm), twoLevelFloor(p, new WorkMeter(budget.familyWork, deadlineMs)));
  const clockCut = familyMeter.deadlineHit || heuristicMeter.deadlineHit || searchMeter.deadlineHit;
  const base = { complete: family.complete, terms: family.terms.length };
  if (settings.mode === "fast") {
    const matrix = logicMatrix(spec, coverPlan(spec, warm), {
      ...meta,
      lowerBound: floor,
      optimal: floor === coverDiodes(warm),
      method: "heuristic",
      deadlineHit: clockCut,
    });
    return finish(spec, settings, matrix, {
      ...base,
      gates: coverGates(warm),
      lowerBound: floor,
      gatesProven: false,
      end: "heuristic",
      columns: 0,
      rows: 0,
    });
  }
  hooks.onProgress?.({ stage: "heuristic", count: coverDiodes(warm), lowerBound: null });
  const exact = await twoLevelExact(p, family, warm, {
    budget,
    deadlineMs,
    seed: settings.seed,
    loadHighs: hooks.loadHighs ?? defaultHighsLoader,
    floor,
  });
  const cover: Cover = exact.cover;
  const count = coverDiodes(cover);
  const matrix = logicMatrix(spec, coverPlan(spec, cover), {
    ...meta,
    lowerBound: exact.lowerBound,
    optimal: exact.lowerBound === count,
    method: exact.status === "solver-failed" ? "heuristic" : "exact",
    deadlineHit: clockCut || exact.deadlineHit,
  });
  const result = finish(spec, settings, matrix, {
    ...base,
    gates: coverGates(cover),
    lowerBound: exact.lowerBound,
    gatesProven: exact.gatesProven,
    end: exact.status,
    columns: exact.columns,
    rows: exact.rows,
  });
  if (result.ok) hooks.onProgress?.({ stage: "exact", count, lowerBound: exact.lowerBound });
  return result;
}

function finish(
  spec: DecodeSpec,
  settings: SynthSettings,
  matrix: ReturnType<typeof logicMatrix>,
  rest: Omit<TwoLevelResult, "matrix">,
): Result<TwoLevelResult, SynthFailure> {
  const v = verifyLogic(spec, matrix, settings);
  if (!v.ok) {
    return fail({
      kind: "bug",
      message: `internal error: the ${matrix.method} two-level minimiser produced a decoder the verifier rejects; please report it with the project file`,
      details: v.error,
    });
  }
  return ok({ matrix: v.value, ...rest });
}

/** Settings outside the project limits (only reachable from code; the schema checks files and overrides). */
function checkSettings(s: SynthSettings): SynthFailure | null {
  const { depthLimit, timeLimitMs } = LIMITS;
  if (!Number.isInteger(s.depthLimit) || s.depthLimit < depthLimit.min || s.depthLimit > depthLimit.max) {
    return { kind: "infeasible", message: `the depth limit must be ${depthLimit.min} to ${depthLimit.max} diodes (got ${s.depthLimit})` };
  }
  if (!(s.timeLimitMs >= timeLimitMs.min && s.timeLimitMs <= timeLimitMs.max)) {
    return {
      kind: "infeasible",
      message: `the time limit must be ${timeLimitMs.min} to ${timeLimitMs.max} milliseconds (got ${s.timeLimitMs})`,
    };
  }
  return null;
}
