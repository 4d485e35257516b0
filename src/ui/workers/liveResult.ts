/**
 * A result as the screen shows it: validated project, decode spec and a
 * matrix the page has verified itself (the budget, which settles the parts'
 * values, follows in the analysis worker). The matrices come from workers:
 * the live worker's (liveRun.ts) at once, the exact optimizer's when it
 * arrives.
 */
import { litCellCount, type DecodeSpec } from "../../core/spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../../core/matrix/matrix.ts";
import type { Project } from "../../core/project/project.ts";
import { fail, type Result } from "../../core/result/result.ts";
import type { SynthSettings } from "../../core/synth/synthesize.ts";
import { verifyMatrix } from "../../core/matrix/verify.ts";

export interface LiveResult {
  readonly project: Project;
  readonly spec: DecodeSpec;
  readonly settings: SynthSettings;
  readonly matrix: VerifiedMatrix;
  /** One diode per lit cell: the count without sharing. */
  readonly directCount: number;
}

/** The same result around another verified matrix (the exact optimizer's). */
export function withMatrix(project: Project, spec: DecodeSpec, settings: SynthSettings, matrix: VerifiedMatrix): LiveResult {
  return { project, spec, settings, matrix, directCount: litCellCount(spec) };
}

/**
 * Checks a matrix that came from elsewhere (a worker) against the spec
 * before the screen may show it: only verified results are shown.
 */
export function acceptMatrix(spec: DecodeSpec, settings: SynthSettings, matrix: unknown): Result<VerifiedMatrix, string[]> {
  if (typeof matrix !== "object" || matrix === null) return fail(["the worker sent no matrix"]);
  return verifyMatrix(spec, matrix as VerifiedMatrix, settings);
}
