/// <reference lib="webworker" />
/** The summary worker: one decoder's matrix, budget and parts count, or the instrument's budget (see summaryProtocol.ts). */
import highsLoader from "highs";
import wasmUrl from "highs/runtime?url";
import { solveBudget } from "../../core/budget/budget.ts";
import { instrumentBudget, type BudgetedDecoder } from "../../core/budget/instrumentBudget.ts";
import { designators } from "../../core/matrix/designators.ts";
import type { DiodeMatrix } from "../../core/matrix/matrix.ts";
import { verifyMatrix } from "../../core/matrix/verify.ts";
import { countParts } from "../../core/papers/parts.ts";
import { validateProject } from "../../core/project/projectSchema.ts";
import { formatProblems } from "../../core/result/result.ts";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import type { HighsLike, HighsLoader } from "../../core/synth/exact.ts";
import { synthesize, synthSettings } from "../../core/synth/synthesize.ts";
import { paperDesign } from "../../render/papers.ts";
import { designModel } from "../../core/budget/segmentDesign.ts";
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
  "line-pull-up",
  "tie-on-resistor",
  "gate-pull-up",
  "dark-pull-up",
  "divider-resistor",
]);

function post(reply: SummaryReply): void {
  scope.postMessage(reply);
}

async function decoderJob(id: number, data: unknown, trim: Extract<SummaryRequest, { job: "decoder" }>["trim"]): Promise<void> {
  const parsed = validateProject(data);
  if (!parsed.ok) return post({ id, type: "failed", message: formatProblems(parsed.error) });
  const project = parsed.value;
  const spec = compileSpec(project);
  const m = await synthesize(spec, synthSettings(project), { loadHighs });
  if (!m.ok) return post({ id, type: "failed", message: m.error.message });
  const matrix = m.value;
  const budget: DecoderFigures["budget"] = solveBudget(project, spec, matrix, { trim, timeLimitMs: project.synthesis.timeLimitMs });
  const design = paperDesign({ project, matrix, budget });
  const groups = countParts(designators(spec, matrix, designModel(project.electrical, design), design.ohms));
  const count = (test: (kind: string) => boolean) => groups.filter((g) => test(g.kind)).reduce((n, g) => n + g.refs.length, 0);
  post({
    id,
    type: "figures",
    figures: {
      // The matrix's diodes and the dark-decoded outputs' level-shift diodes.
      diodes: count((k) => k === "diode" || k === "level-shift-diode"),
      transistors: count((k) => k === "transistor"),
      resistors: count((k) => RESISTOR_KINDS.has(k)),
      optimal: matrix.optimal,
      matrix,
      budget,
    },
  });
}

function instrumentJob(req: Extract<SummaryRequest, { job: "instrument" }>): void {
  const decoders: BudgetedDecoder[] = [];
  for (const d of req.decoders) {
    const parsed = validateProject(d.project);
    if (!parsed.ok) return post({ id: req.id, type: "failed", message: `${d.name}: ${formatProblems(parsed.error)}` });
    const spec = compileSpec(parsed.value);
    const checked = verifyMatrix(spec, d.matrix as DiodeMatrix, synthSettings(parsed.value));
    if (!checked.ok)
      return post({ id: req.id, type: "failed", message: `${d.name}: the matrix failed verification: ${checked.error.join("; ")}` });
    decoders.push({ name: d.name, project: parsed.value, spec, matrix: checked.value, budget: d.budget });
  }
  post({ id: req.id, type: "instrument", result: instrumentBudget(req.title, decoders, Date.now() + req.timeLimitMs) });
}

scope.onmessage = async (event: MessageEvent<SummaryRequest>) => {
  const req = event.data;
  try {
    if (req.job === "decoder") await decoderJob(req.id, req.project, req.trim);
    else instrumentJob(req);
  } catch (e) {
    post({ id: req.id, type: "failed", message: `the summary stopped: ${(e as Error).message}` });
  }
};
