/// <reference lib="webworker" />
/** An analysis worker: budget, heuristic comparison and layout (see analysisProtocol.ts). */
import { solveBudget } from "../../core/budget/budget.ts";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import { compareGlyphStyles } from "../../core/compare/glyphStyles.ts";
import type { DiodeMatrix } from "../../core/matrix/matrix.ts";
import { validateProject } from "../../core/project/projectSchema.ts";
import { fail, formatProblems, ok } from "../../core/result/result.ts";
import { synthesize, synthSettings } from "../../core/synth/synthesize.ts";
import { twoRankDecoder } from "../../core/logic/synthesizeCoded.ts";
import { verifyMatrix } from "../../core/matrix/verify.ts";
import { drawingOptions } from "../../render/drawingOptions.ts";
import { layoutMatrix } from "../../render/layout.ts";
import type { AnalysisReply, AnalysisRequest } from "./analysisProtocol.ts";

const scope = self as unknown as DedicatedWorkerGlobalScope;

function post(reply: AnalysisReply): void {
  scope.postMessage(reply);
}

scope.onmessage = async (event: MessageEvent<AnalysisRequest>) => {
  const req = event.data;
  const parsed = validateProject(req.project);
  if (!parsed.ok) {
    const result = fail({ kind: "rejected" as const, message: formatProblems(parsed.error) });
    return post({ id: req.id, job: req.job, result } as AnalysisReply);
  }
  const project = parsed.value;
  if (req.job === "two-rank") {
    const r = await twoRankDecoder(compileSpec(project), synthSettings(project), synthesize);
    const result = r.ok
      ? ok({
          diodes: r.value.matrix.count,
          gates: r.value.matrix.gates.length,
          gateDiodes: r.value.gateDiodes,
          matrixDiodes: r.value.matrixDiodes,
          method: r.value.lineMatrix.method,
        })
      : r;
    return post({ id: req.id, job: "two-rank", result });
  }
  if (req.job === "compare") {
    return post({ id: req.id, job: "compare", result: await compareGlyphStyles(project, { settings: { mode: "fast" } }) });
  }
  const spec = compileSpec(project);
  const checked = verifyMatrix(spec, req.matrix as DiodeMatrix, synthSettings(project));
  if (!checked.ok) {
    const result = fail({ kind: "rejected" as const, message: checked.error.join("; ") });
    return post({ id: req.id, job: req.job, result } as AnalysisReply);
  }
  if (req.job === "layout") {
    return post({
      id: req.id,
      job: "layout",
      result: ok(layoutMatrix(project, spec, checked.value, drawingOptions(project, req.drawing), req.darkValues)),
    });
  }
  post({
    id: req.id,
    job: "budget",
    result: solveBudget(project, spec, checked.value, { trim: req.trim, timeLimitMs: project.synthesis.timeLimitMs }),
  });
};
