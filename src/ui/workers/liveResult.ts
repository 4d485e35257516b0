/**
 * One pass of the pipeline for the screen: validated project -> decode
 * spec -> verified matrix (the budget, which settles the parts' values,
 * follows in the analysis worker). The heuristic runs here for live results; the exact optimizer
 * runs in the worker and its answer replaces the matrix when it arrives.
 */
import { compileSpec, litCellCount, type DecodeSpec } from "../../core/spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../../core/matrix/matrix.ts";
import type { Project } from "../../core/project/project.ts";
import { fail, ok, type Result } from "../../core/result/result.ts";
import { synthesize, synthSettings, type SynthFailure, type SynthSettings } from "../../core/synth/synthesize.ts";
import { verifyMatrix } from "../../core/matrix/verify.ts";

export interface LiveResult {
  readonly project: Project;
  readonly spec: DecodeSpec;
  readonly settings: SynthSettings;
  readonly matrix: VerifiedMatrix;
  /** One diode per lit cell: the count without sharing. */
  readonly directCount: number;
}

/** Runs the heuristic on a validated project. */
export async function liveResult(project: Project): Promise<Result<LiveResult, SynthFailure>> {
  const spec = compileSpec(project);
  const settings = synthSettings(project, { mode: "fast" });
  const r = await synthesize(spec, settings);
  if (!r.ok) return r;
  return ok(withMatrix(project, spec, settings, r.value));
}

/** The same result around another verified matrix (the exact optimizer's). */
export function withMatrix(project: Project, spec: DecodeSpec, settings: SynthSettings, matrix: VerifiedMatrix): LiveResult {
  return { project, spec, settings, matrix, directCount: litCellCount(spec) };
}

/**
 * Checks a matrix that came from elsewhere (the worker) against the spec
 * before the screen may show it: only verified results are shown.
 */
export function acceptMatrix(spec: DecodeSpec, settings: SynthSettings, matrix: unknown): Result<VerifiedMatrix, string[]> {
  if (typeof matrix !== "object" || matrix === null) return fail(["the optimizer sent no matrix"]);
  return verifyMatrix(spec, matrix as VerifiedMatrix, settings);
}
