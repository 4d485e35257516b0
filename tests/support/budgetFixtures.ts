/**
 * Projects and matrices for the budget tests: the examples' direct matrices,
 * a hand-built shared matrix at depth 2 (a bus and two output links), and a
 * 00-59 two-position clock.
 */
import { compileSpec, type DecodeSpec } from "../../src/core/spec/decodeSpec.ts";
import { buildMatrix, type Edge, type VerifiedMatrix } from "../../src/core/matrix/matrix.ts";
import type { Project } from "../../src/core/project/project.ts";
import { synthesizeDirect } from "../../src/core/synth/direct.ts";
import { verifyMatrix } from "../../src/core/matrix/verify.ts";
import { exampleFormat1, makeProject, makeProject2 } from "./projects.ts";

export interface Design {
  readonly name: string;
  readonly project: Project;
  readonly spec: DecodeSpec;
  readonly matrix: VerifiedMatrix;
}

/** A hand-built matrix of a project, verified (throws on a bad fixture). */
export function handBuilt(
  name: string,
  project: Project,
  edges: readonly Edge[],
  maxDepth: number,
  depth: "mixed" | "per-segment",
): Design {
  const spec = compileSpec(project);
  return { name, project, spec, matrix: verified(spec, edges, maxDepth, depth) };
}

function verified(spec: DecodeSpec, edges: readonly Edge[], maxDepth: number, depth: "mixed" | "per-segment"): VerifiedMatrix {
  const m = buildMatrix(spec, edges, { lowerBound: null, optimal: false, depthLimit: maxDepth, policy: depth, method: "heuristic" });
  const v = verifyMatrix(spec, m, { depthLimit: maxDepth, policy: depth });
  if (!v.ok) throw new Error(`bad fixture matrix: ${v.error.join("; ")}`);
  return v.value;
}

/** One diode per lit cell. */
export function directDesign(name: string, project: Project): Design {
  const spec = compileSpec(project);
  const m = synthesizeDirect(spec, project.synthesis.depthLimit, project.synthesis.policy);
  const v = verifyMatrix(spec, m, project.synthesis);
  if (!v.ok) throw new Error(`direct matrix rejected: ${v.error.join("; ")}`);
  return { name, project, spec, matrix: v.value };
}

/**
 * The die roller with sharing at depth 2: states 2-6 feed bus X, which drives
 * tr and bl (7 diodes for 10 crossings); tl -> br and ml -> mr are output
 * links (br and mr are lit exactly when tl and ml are). Without an
 * `electrical` section it is format 1's current sink at 100 V; with one, a
 * format-2 project with that section.
 */
export function sharedDieRoller(electrical?: Record<string, unknown>): Design {
  const base = exampleFormat1("die-roller");
  const project =
    electrical === undefined
      ? base
      : makeProject2({
          title: base.title,
          counter: { states: base.counter.states },
          display: { positions: 1, cell: "custom", segments: [...base.display.cell.segments] },
          glyphs: Object.fromEntries(Object.entries(base.glyphOverrides).map(([k, v]) => [k, [...v]])),
          show: [...base.show],
          electrical,
        });
  const spec = compileSpec(project);
  const edges: Edge[] = [
    { from: "S0", to: "1c" },
    { from: "S2", to: "1c" },
    { from: "S4", to: "1c" },
    ...["S1", "S2", "S3", "S4", "S5"].map((s) => ({ from: s, to: "X" })),
    { from: "X", to: "1tr" },
    { from: "X", to: "1bl" },
    ...["S3", "S4", "S5"].map((s) => ({ from: s, to: "1tl" })),
    { from: "1tl", to: "1br" },
    { from: "S5", to: "1ml" },
    { from: "1ml", to: "1mr" },
  ];
  const name = electrical === undefined ? "die-roller shared" : `die-roller shared, ${String(electrical["preset"] ?? "format 2")}`;
  return { name, project, spec, matrix: verified(spec, edges, 2, "per-segment") };
}

/** A 00-59 counter on two positions (the bench's project). */
export function clockProject(): Project {
  const show = Array.from({ length: 60 }, (_, k) => String(k).padStart(2, "0"));
  return makeProject({ title: "Seconds 00-59", counter: { states: 60 }, display: { positions: 2, cell: "seg7" }, show });
}
