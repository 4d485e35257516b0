/**
 * Stage 2 of the pipeline: decode spec -> verified matrix.
 *
 * Chooses the synthesizer, then runs every result through the independent
 * verifier. A result the verifier rejects is a bug in diodeloom and comes
 * back as such, never as a matrix.
 */
import type { DecodeSpec } from "./decodeSpec.ts";
import type { DiodeMatrix, VerifiedMatrix } from "./matrix.ts";
import type { DepthPolicy, Project } from "./project.ts";
import { fail, ok, type Result } from "./result.ts";
import { synthesizeDirect } from "./synthDirect.ts";
import { verifyMatrix } from "./verify.ts";

/** `direct`: one diode per lit cell; `fast`: the heuristic; `exact`: the MILP optimum. */
export type SynthMode = "direct" | "fast" | "exact";

export interface SynthSettings {
  readonly mode: SynthMode;
  readonly maxDepth: number;
  readonly depth: DepthPolicy;
  readonly buses: boolean;
  readonly links: boolean;
  readonly timeLimitMs: number;
  readonly seed: number;
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

export async function synthesize(spec: DecodeSpec, settings: SynthSettings): Promise<Result<VerifiedMatrix, SynthFailure>> {
  const matrix: DiodeMatrix = synthesizeDirect(spec, settings.maxDepth, settings.depth);
  return verified(spec, matrix, settings);
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
