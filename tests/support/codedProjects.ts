/**
 * Coded-counter projects for tests: the reference cases of the
 * specification and small helpers.
 */
import type { Project } from "../../src/core/project/project.ts";
import { compileSpec, type DecodeSpec } from "../../src/core/spec/decodeSpec.ts";
import type { SynthSettings } from "../../src/core/synth/synthesize.ts";
import { makeProject } from "./projects.ts";
import type { DiodeMatrix } from "../../src/core/matrix/matrix.ts";
import { logicProblem } from "../../src/core/logic/logicProblem.ts";
import { termFamily } from "../../src/core/logic/implicants.ts";
import { heuristicCover } from "../../src/core/logic/coverHeuristic.ts";
import { coverPlan, logicMatrix } from "../../src/core/logic/logicMatrix.ts";
import { WorkMeter } from "../../src/core/synth/workMeter.ts";

/** A one-position seven-segment project on a coded counter showing one character per state. */
export function codedProject(code: "johnson" | "binary", chars: string, extra: Record<string, unknown> = {}): Project {
  return makeProject({ counter: { states: chars.length, code }, display: {}, show: [...chars], ...extra });
}

/** The same on a custom code table. */
export function customProject(codes: readonly string[], show: readonly string[], extra: Record<string, unknown> = {}): Project {
  return makeProject({ counter: { states: codes.length, code: "custom", codes }, display: {}, show, ...extra });
}

export function specOf(project: Project): DecodeSpec {
  return compileSpec(project);
}

/** Settings for tests: the project's own, exact, with a limit generous enough for every reference case. */
export function exactSettings(overrides: Partial<SynthSettings> = {}): SynthSettings {
  return { mode: "exact", depthLimit: 2, policy: "per-segment", buses: true, links: true, timeLimitMs: 20_000, seed: 1, ...overrides };
}

/**
 * The reference figures of the specification of coded counters (issue 12):
 * diodes, then AND gates, of the minimum two-level decoder with the built-in
 * glyphs, measured there with an independent exact model on HiGHS.
 */
export const REFERENCE_CASES = [
  { name: "BCD (binary mod 10) showing 0-9", code: "binary", chars: "0123456789", diodes: 40, gates: 7 },
  { name: "binary mod 16 showing 0-F", code: "binary", chars: "0123456789AbCdEF", diodes: 83, gates: 16 },
  { name: "binary mod 6 showing 0-5", code: "binary", chars: "012345", diodes: 21, gates: 3 },
  { name: "5-stage Johnson showing 0-9", code: "johnson", chars: "0123456789", diodes: 36, gates: 8 },
  { name: "3-stage Johnson showing 0-5", code: "johnson", chars: "012345", diodes: 21, gates: 4 },
] as const;

/**
 * A coded project with its heuristic two-level decoder, built without
 * HiGHS (for drawing tests, which need no proven minimum).
 */
export function codedDecoder(project: Project): { project: Project; spec: DecodeSpec; matrix: DiodeMatrix } {
  const spec = compileSpec(project);
  const p = logicProblem(spec);
  const cover = heuristicCover(p, termFamily(p).terms, new WorkMeter(1e8));
  const matrix = logicMatrix(spec, coverPlan(spec, cover), {
    lowerBound: null,
    optimal: false,
    depthLimit: 2,
    policy: "per-segment",
    method: "heuristic",
  });
  return { project, spec, matrix };
}
