/**
 * Decode specs with both polarities straight from a lit matrix, for the
 * polarity tests: a complementary-drive one-hot counter (lines S<k> and
 * nS<k>), every output allowed the polarities `decode` gives, and a fixed
 * number of input-network diodes per dark-decoded output.
 */
import type { DecodePolarity } from "../../src/core/project/project.ts";
import type { DecodeSpec, OutputPolarity } from "../../src/core/spec/decodeSpec.ts";
import { specFromLit } from "./litSpec.ts";

export function polaritySpec(lit: readonly (readonly boolean[])[], decode: DecodePolarity, inputDiodes: number): DecodeSpec {
  const base = specFromLit(lit);
  const n = base.states.length;
  const activeLow = base.states.map((_, k) => `nS${k}`);
  const allowed: readonly OutputPolarity[] = decode === "either" ? ["lit", "dark"] : [decode];
  return {
    ...base,
    lines: [...base.states, ...activeLow],
    polarity: {
      ...base.polarity,
      drive: "complementary",
      decode,
      activeHigh: base.states,
      activeLow,
      allowed: base.outputs.map(() => allowed),
      dark: base.lit.map((r) => r.map((x) => !x)),
      inputDiodes,
      inputResistors: 0,
      levelShift: { diodes: inputDiodes, pullUpA: 0, lineLowV: 0, nodeLowV: 0, steps: [], ghostA: 0 },
    },
    texts: Array.from({ length: n }, (_, k) => `t${k}`),
  };
}
