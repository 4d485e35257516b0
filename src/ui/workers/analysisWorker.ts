/// <reference lib="webworker" />
/** The analysis worker: budget and heuristic comparison (see analysisProtocol.ts). */
import { solveBudget } from "../../core/budget/budget.ts";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import { compareGlyphStyles } from "../../core/compare/glyphStyles.ts";
import type { DiodeMatrix } from "../../core/matrix/matrix.ts";
import { validateProject } from "../../core/project/projectSchema.ts";
import { fail, formatProblems } from "../../core/result/result.ts";
import { synthSettings } from "../../core/synth/synthesize.ts";
import { verifyMatrix } from "../../core/matrix/verify.ts";
import type { AnalysisReply, AnalysisRequest } from "./analysisProtocol.ts";

const scope = self as unknown as DedicatedWorkerGlobalScope;

function post(reply: AnalysisReply): void {
  scope.postMessage(reply);
}

scope.onmessage = async (event: MessageEvent<AnalysisRequest>) => {
  const req = event.data;
  const parsed = validateProject(req.project);
  if (!parsed.ok) {
    const rejected = fail({ kind: "rejected" as const, message: formatProblems(parsed.error) });
    return post(req.job === "budget" ? { id: req.id, job: "budget", result: rejected } : { id: req.id, job: "compare", result: rejected });
  }
  const project = parsed.value;
  if (req.job === "compare") {
    return post({ id: req.id, job: "compare", result: await compareGlyphStyles(project, { mode: "fast" }) });
  }
  const spec = compileSpec(project);
  const checked = verifyMatrix(spec, req.matrix as DiodeMatrix, synthSettings(project));
  if (!checked.ok) return post({ id: req.id, job: "budget", result: fail({ kind: "rejected", message: checked.error.join("; ") }) });
  post({ id: req.id, job: "budget", result: solveBudget(project, spec, checked.value, { trim: req.trim }) });
};
