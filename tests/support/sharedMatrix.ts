/**
 * Hand-built matrices with buses and links, for the drawing tests: the
 * optimizer may not produce these shapes yet, but the drawing must handle them.
 */
import { compileSpec, type DecodeSpec } from "../../src/core/spec/decodeSpec.ts";
import { buildMatrix, type DiodeMatrix, type Edge } from "../../src/core/matrix/matrix.ts";
import type { Project } from "../../src/core/project/project.ts";
import { synthesizeDirect } from "../../src/core/synth/direct.ts";
import { verifyMatrix } from "../../src/core/matrix/verify.ts";
import { example } from "./projects.ts";

/** The die roller with two buses (X: S1-S5 to tr, bl; Y: S3-S5 to tl, br) and a link 1ml -> 1mr. */
export function dieRollerShared(): { project: Project; spec: DecodeSpec; matrix: DiodeMatrix } {
  const project = example("die-roller");
  const spec = compileSpec(project);
  const edges: Edge[] = [
    { from: "S0", to: "1c" },
    { from: "S2", to: "1c" },
    { from: "S4", to: "1c" },
    ...["S1", "S2", "S3", "S4", "S5"].map((s) => ({ from: s, to: "X" })),
    { from: "X", to: "1tr" },
    { from: "X", to: "1bl" },
    ...["S3", "S4", "S5"].map((s) => ({ from: s, to: "Y" })),
    { from: "Y", to: "1tl" },
    { from: "Y", to: "1br" },
    { from: "S5", to: "1ml" },
    { from: "1ml", to: "1mr" },
  ];
  const matrix = buildMatrix(spec, edges, { lowerBound: null, optimal: false, depthLimit: 2, policy: "mixed", method: "heuristic" });
  const v = verifyMatrix(spec, matrix, { depthLimit: 2, policy: "mixed" });
  if (!v.ok) throw new Error(`fixture matrix is wrong: ${v.error.join("; ")}`);
  return { project, spec, matrix: v.value };
}

/** An example project with its direct matrix. */
export function directExample(name: string): { project: Project; spec: DecodeSpec; matrix: DiodeMatrix } {
  const project = example(name);
  const spec = compileSpec(project);
  return { project, spec, matrix: synthesizeDirect(spec, project.synthesis.depthLimit, project.synthesis.policy) };
}
