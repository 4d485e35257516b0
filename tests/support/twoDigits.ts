import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { sharingProblem, type SharingProblem } from "../../src/core/synth/plan.ts";
import { reduceRows } from "../../src/core/synth/reduce.ts";
import { showing } from "./projects.ts";

/** The reduced sharing problem of a two-position counter showing 00 to `last` (00-23, 00-59, 00-99 of issue 16). */
export function twoDigitProblem(last: number): SharingProblem {
  return reduceRows(
    sharingProblem(
      compileSpec(
        showing(
          Array.from({ length: last + 1 }, (_, k) => String(k).padStart(2, "0")),
          2,
        ),
      ),
    ),
  ).problem;
}
