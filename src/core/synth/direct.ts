/**
 * Direct synthesis: one diode on every lit cell, from the state line straight
 * to the output line (for a high-side switch, from the output line to the
 * state's active-low line). Always valid at depth 1 under every policy.
 */
import type { DecodeSpec, OutputPolarity } from "../spec/decodeSpec.ts";
import { buildMatrix, type DiodeMatrix, type Edge } from "../matrix/matrix.ts";
import type { DepthPolicy } from "../project/project.ts";
import { directPlan } from "./plan.ts";
import { polarityMatrix } from "./polarity.ts";
import { choiceProblem } from "./polarityProblem.ts";

export function synthesizeDirect(spec: DecodeSpec, depthLimit: number, policy: DepthPolicy): DiodeMatrix {
  if (spec.polarity.inverting) {
    const choice = spec.outputs.map((): OutputPolarity => "lit");
    return polarityMatrix(spec, { choice, plan: directPlan(choiceProblem(spec, choice)) }, { depthLimit, policy }, null, "direct", false);
  }
  const edges: Edge[] = [];
  spec.lit.forEach((row, k) => {
    row.forEach((on, j) => {
      if (on) edges.push({ from: spec.states[k] as string, to: spec.outputs[j] as string });
    });
  });
  return buildMatrix(spec, edges, { lowerBound: null, optimal: false, depthLimit, policy, method: "direct" });
}
