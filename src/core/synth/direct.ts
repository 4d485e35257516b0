/**
 * Direct synthesis: one diode on every lit cell, from the state line straight
 * to the output line. Always valid at depth 1 under every policy.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { buildMatrix, type DiodeMatrix, type Edge } from "../matrix/matrix.ts";
import type { DepthPolicy } from "../project/project.ts";

export function synthesizeDirect(spec: DecodeSpec, depthLimit: number, policy: DepthPolicy): DiodeMatrix {
  const edges: Edge[] = [];
  spec.lit.forEach((row, k) => {
    row.forEach((on, j) => {
      if (on) edges.push({ from: spec.states[k] as string, to: spec.outputs[j] as string });
    });
  });
  return buildMatrix(spec, edges, { lowerBound: null, optimal: false, depthLimit, policy, method: "direct" });
}
