/**
 * Stage 2 of the pipeline: decode spec -> verified matrix.
 *
 * Chooses the synthesizer, then runs every result through the independent
 * verifier. A result the verifier rejects is a bug in diodeloom and comes
 * back as such, never as a matrix.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { buildMatrix, type DiodeMatrix, type VerifiedMatrix } from "../matrix/matrix.ts";
import type { Project, SynthesisOptions } from "../project/project.ts";
import { LIMITS } from "../project/limits.ts";
import { fail, ok, type Result } from "../result/result.ts";
import { synthesizeDirect } from "./direct.ts";
import { defaultHighsLoader, exactPlan, type HighsLoader } from "./exact.ts";
import { deadlineMarginMs, workBudget } from "./workBudget.ts";
import { WorkMeter } from "./workMeter.ts";
import { HEURISTIC_DEFAULT_WORK, heuristicPlan } from "./heuristic.ts";
import { litCount, planCount, planEdges, sharingProblem, type SharingPlan, type SharingRules } from "./plan.ts";
import { verifyMatrix } from "../matrix/verify.ts";
import { synthesizeCoded } from "../logic/synthesizeCoded.ts";
import { synthesizePolarity } from "./polarity.ts";

/** `direct`: one diode per lit cell; `fast`: the heuristic; `exact`: the proven optimum (branch-and-bound, then HiGHS). */
export type SynthMode = "direct" | "fast" | "exact";

/**
 * The project's synthesis options plus the mode to run. The decode polarity
 * and the dark outputs' input network are not among them: the decode spec
 * carries them (which outputs may be decoded dark, and what each costs).
 */
export interface SynthSettings extends Omit<SynthesisOptions, "decode" | "darkInput"> {
  readonly mode: SynthMode;
}

export type SynthFailure =
  /** The limits admit no matrix; the message says which setting to change. */
  | { readonly kind: "infeasible"; readonly message: string }
  /** diodeloom produced a wrong matrix; the details are the verifier's findings. */
  | { readonly kind: "bug"; readonly message: string; readonly details: readonly string[] };

/** The project's own synthesis settings, with any overrides applied. */
export function synthSettings(project: Project, overrides: Partial<SynthSettings> = {}): SynthSettings {
  return { mode: "exact", ...project.synthesis, ...overrides };
}

/** What a long synthesis reports as it goes. */
export interface SynthProgress {
  readonly stage: "heuristic" | "exact";
  /** Diodes in the best verified matrix so far. */
  readonly count: number;
  /** Proven lower bound so far, or null. */
  readonly lowerBound: number | null;
}

/** Optional plumbing: the HiGHS loader (the web worker passes its own) and a progress callback. */
export interface SynthHooks {
  readonly loadHighs?: HighsLoader;
  readonly onProgress?: (progress: SynthProgress) => void;
}

/**
 * Finds a verified matrix: `direct` places one diode per lit cell, `fast`
 * runs the heuristic, `exact` runs the heuristic and then the MILP on HiGHS
 * from its result. Every returned matrix has passed the verifier. If HiGHS
 * fails, the heuristic's matrix comes back (with the bound that is still
 * proven), not an error.
 *
 * @example
 * const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
 * if (r.ok) r.value.count;
 */
export async function synthesize(
  spec: DecodeSpec,
  settings: SynthSettings,
  hooks: SynthHooks = {},
): Promise<Result<VerifiedMatrix, SynthFailure>> {
  // A coded counter (Johnson, binary, custom) is decoded by AND gates and OR diodes (src/core/logic).
  if (spec.counter.kind !== "one-hot") {
    const coded = await synthesizeCoded(spec, settings, { ...hooks, oneHot: (s, st) => synthesize(s, st, hooks) });
    return coded.ok ? ok(coded.value.matrix) : coded;
  }
  const limits = checkLimits(settings);
  if (limits) return fail(limits);
  // Dark-decoded outputs: the same engines on the dark cells, with the input network counted (polarity.ts).
  // A high-side switch's lit cells sit on the active-low lines: the same path.
  if (spec.polarity.decode !== "lit" || spec.polarity.inverting) return synthesizePolarity(spec, settings, hooks);
  const p = sharingProblem(spec);
  const lit = litCount(p);
  const rules: SharingRules = { depthLimit: settings.depthLimit, policy: settings.policy, buses: settings.buses, links: settings.links };
  // Depth 1, no sharing allowed or nothing to drive: only the direct matrix exists, so it is the optimum.
  const sharing = lit > 0 && settings.depthLimit >= 2 && (settings.buses || (settings.links && settings.policy !== "uniform"));
  if (settings.mode === "direct" || !sharing) {
    const direct: DiodeMatrix = synthesizeDirect(spec, settings.depthLimit, settings.policy);
    const proven = !sharing ? { lowerBound: lit, optimal: true } : {};
    return verified(spec, { ...direct, ...proven }, settings);
  }

  // Every work budget comes from the configured limit alone, never from the
  // time left after an earlier phase: so the same settings give the same
  // matrix and bound on a busy machine as on an idle one. The clock only
  // enforces the deadline, which the budgets are set to leave well alone.
  const started = Date.now();
  const deadlineMs = started + settings.timeLimitMs - deadlineMarginMs(settings.timeLimitMs);
  const budget = workBudget(settings.timeLimitMs);
  const meter = new WorkMeter(Math.min(budget.heuristicWork, HEURISTIC_DEFAULT_WORK), deadlineMs);
  // The quick answer (fast mode, the app's first figure) keeps the whole problem's greedy short after the positions; the exact mode gives it what the budget allows.
  const heuristic = heuristicPlan(p, rules, { meter, wholeAfterPositions: settings.mode === "fast" ? undefined : Infinity });
  const fast = verified(spec, matrixOf(spec, heuristic, settings, null, "heuristic", meter.deadlineHit), settings);
  if (!fast.ok || settings.mode === "fast") return fast;
  hooks.onProgress?.({ stage: "heuristic", count: fast.value.count, lowerBound: null });

  const exact = await exactPlan(p, rules, heuristic, {
    timeLimitMs: settings.timeLimitMs,
    deadlineMs,
    budget,
    seed: settings.seed,
    loadHighs: hooks.loadHighs ?? defaultHighsLoader,
  });
  const count = planCount(exact.plan);
  const result = verified(
    spec,
    matrixOf(
      spec,
      exact.plan,
      settings,
      exact.lowerBound,
      exact.status === "solver-failed" ? "heuristic" : "exact",
      exact.deadlineHit || meter.deadlineHit,
    ),
    settings,
  );
  if (result.ok) hooks.onProgress?.({ stage: "exact", count, lowerBound: exact.lowerBound });
  return result;
}

function matrixOf(
  spec: DecodeSpec,
  plan: SharingPlan,
  s: SynthSettings,
  lowerBound: number | null,
  method: "heuristic" | "exact",
  deadlineHit: boolean,
): DiodeMatrix {
  const count = planCount(plan);
  return buildMatrix(spec, planEdges(spec, plan), {
    lowerBound,
    optimal: lowerBound !== null && lowerBound === count,
    depthLimit: s.depthLimit,
    policy: s.policy,
    method,
    deadlineHit,
  });
}

/** Settings outside the project limits (only reachable from code; the schema checks files and overrides). */
function checkLimits(s: SynthSettings): SynthFailure | null {
  const { depthLimit, timeLimitMs } = LIMITS;
  if (!Number.isInteger(s.depthLimit) || s.depthLimit < depthLimit.min || s.depthLimit > depthLimit.max) {
    return {
      kind: "infeasible",
      message: `the depth limit must be ${depthLimit.min} to ${depthLimit.max} diodes (got ${s.depthLimit}); every path needs at least one diode`,
    };
  }
  if (!(s.timeLimitMs >= timeLimitMs.min && s.timeLimitMs <= timeLimitMs.max)) {
    return {
      kind: "infeasible",
      message: `the time limit must be ${timeLimitMs.min} to ${timeLimitMs.max} milliseconds (got ${s.timeLimitMs})`,
    };
  }
  return null;
}

/** Runs the verifier; a rejection becomes a `bug` failure. */
export function verified(spec: DecodeSpec, matrix: DiodeMatrix, settings: SynthSettings): Result<VerifiedMatrix, SynthFailure> {
  const v = verifyMatrix(spec, matrix, settings);
  if (v.ok) return ok(v.value);
  return fail({
    kind: "bug",
    message: `internal error: the ${matrix.method} synthesizer produced a matrix the verifier rejects; please report it with the project file`,
    details: v.error,
  });
}
