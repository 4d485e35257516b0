/// <reference lib="webworker" />
/** The summary worker: one decoder's matrix, budget and parts count (see summaryProtocol.ts). */
import highsLoader from "highs";
import wasmUrl from "highs/runtime?url";
import { solveBudget } from "../../core/budget/budget.ts";
import { designators } from "../../core/matrix/designators.ts";
import { electricalRefusal } from "../../core/matrix/matrix.ts";
import { countParts } from "../../core/papers/parts.ts";
import { validateProject } from "../../core/project/projectSchema.ts";
import { fail, formatProblems } from "../../core/result/result.ts";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import type { HighsLike, HighsLoader } from "../../core/synth/exact.ts";
import { synthesize, synthSettings } from "../../core/synth/synthesize.ts";
import { paperDesign } from "../../render/papers.ts";
import type { DecoderFigures, SummaryReply, SummaryRequest } from "./summaryProtocol.ts";

const scope = self as unknown as DedicatedWorkerGlobalScope;

/** A fresh HiGHS runtime per solve, its WebAssembly file served by Vite. */
const loadHighs: HighsLoader = async () => (await highsLoader({ locateFile: () => wasmUrl })) as unknown as HighsLike;

const RESISTOR_KINDS = new Set([
  "emitter-resistor",
  "series-resistor",
  "base-resistor",
  "base-emitter-resistor",
  "pull-down",
  "tie-on-resistor",
  "gate-pull-up",
]);

function post(reply: SummaryReply): void {
  scope.postMessage(reply);
}

scope.onmessage = async (event: MessageEvent<SummaryRequest>) => {
  const { id, project: data, trim } = event.data;
  const parsed = validateProject(data);
  if (!parsed.ok) return post({ id, type: "failed", message: formatProblems(parsed.error) });
  const project = parsed.value;
  const spec = compileSpec(project);
  try {
    const m = await synthesize(spec, synthSettings(project), { loadHighs });
    if (!m.ok) return post({ id, type: "failed", message: m.error.message });
    const matrix = m.value;
    const refusal = electricalRefusal(matrix);
    const budget: DecoderFigures["budget"] =
      refusal !== null ? fail({ kind: "rejected" as const, message: refusal }) : solveBudget(project, spec, matrix, { trim });
    const design = paperDesign({ project, matrix, budget });
    const groups = countParts(designators(spec, matrix, project.electrical, design.ohms));
    const count = (test: (kind: string) => boolean) => groups.filter((g) => test(g.kind)).reduce((n, g) => n + g.refs.length, 0);
    const figures: DecoderFigures = {
      diodes: count((k) => k === "diode") + (matrix.inputNetwork?.diodes ?? 0),
      transistors: count((k) => k === "transistor"),
      resistors: count((k) => RESISTOR_KINDS.has(k)),
      optimal: matrix.optimal,
      budget,
    };
    post({ id, type: "figures", figures });
  } catch (e) {
    post({ id, type: "failed", message: `the summary stopped: ${(e as Error).message}` });
  }
};
