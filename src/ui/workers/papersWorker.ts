/// <reference lib="webworker" />
/** The papers worker: an instrument's budgets and drawings for its export (see papersProtocol.ts). */
import { solveBudget } from "../../core/budget/budget.ts";
import { instrumentBudget, type BudgetedDecoder } from "../../core/budget/instrumentBudget.ts";
import { decoderRefPrefix, withRefPrefix } from "../../core/matrix/designators.ts";
import type { DiodeMatrix } from "../../core/matrix/matrix.ts";
import { verifyMatrix } from "../../core/matrix/verify.ts";
import { validateInstrument } from "../../core/project/instrument.ts";
import { formatProblems } from "../../core/result/result.ts";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import { synthSettings } from "../../core/synth/synthesize.ts";
import { drawingOptions } from "../../render/drawingOptions.ts";
import { layoutMatrix } from "../../render/layout.ts";
import type { DecoderPapers, PapersReply, PapersRequest } from "./papersProtocol.ts";
import { paperDarkValues } from "../../render/papers.ts";

const scope = self as unknown as DedicatedWorkerGlobalScope;

function papers(req: PapersRequest): PapersReply {
  const inst = validateInstrument(req.instrument);
  if (!inst.ok) return { ok: false, message: formatProblems(inst.error) };
  const n = inst.value.decoders.length;
  const out: DecoderPapers[] = [];
  const budgeted: BudgetedDecoder[] = [];
  for (const [i, d] of inst.value.decoders.entries()) {
    const spec = compileSpec(d.project);
    const checked = verifyMatrix(spec, req.matrices[i] as DiodeMatrix, synthSettings(d.project));
    if (!checked.ok) return { ok: false, message: `${d.name}: the matrix failed verification: ${checked.error.join("; ")}` };
    const matrix = withRefPrefix(checked.value, decoderRefPrefix(i, n));
    const budget: DecoderPapers["budget"] = solveBudget(d.project, spec, matrix, {
      trim: req.trim,
      timeLimitMs: d.project.synthesis.timeLimitMs,
    });
    const drawing = layoutMatrix(
      d.project,
      spec,
      matrix,
      drawingOptions(d.project, req.drawing),
      paperDarkValues({ project: d.project, spec, budget }),
    );
    if (budget.ok) budgeted.push({ name: d.name, project: d.project, spec, matrix, budget: budget.value });
    out.push({ matrix, drawing, budget });
  }
  const total = budgeted.length === n ? instrumentBudget(inst.value.title, budgeted) : null;
  return { ok: true, decoders: out, budget: total?.ok ? total.value : null };
}

scope.onmessage = (event: MessageEvent<PapersRequest>) => {
  try {
    scope.postMessage(papers(event.data));
  } catch (e) {
    scope.postMessage({ ok: false, message: `the export stopped: ${(e as Error).message}` } satisfies PapersReply);
  }
};
