/// <reference lib="webworker" />
/**
 * The live worker (see liveProtocol.ts): the direct matrix, its drawing,
 * then the heuristic's matrix with its drawing. The page ends a run that passes its
 * deadline by terminating this worker, and starts a fresh one.
 */
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import { validateProject } from "../../core/project/projectSchema.ts";
import { formatProblems } from "../../core/result/result.ts";
import { synthesize, synthSettings, type SynthFailure } from "../../core/synth/synthesize.ts";
import { drawingOptions } from "../../render/drawingOptions.ts";
import { layoutMatrix } from "../../render/layout.ts";
import type { LiveReply, LiveRequest } from "./liveProtocol.ts";

const scope = self as unknown as DedicatedWorkerGlobalScope;

function post(reply: LiveReply): void {
  scope.postMessage(reply);
}

function failed(id: number, f: SynthFailure): LiveReply {
  return { id, type: "failed", bug: f.kind === "bug", message: f.kind === "bug" ? `${f.message}\n${f.details.join("\n")}` : f.message };
}

scope.onmessage = async (event: MessageEvent<LiveRequest>) => {
  const { id, project: data, drawing } = event.data;
  const parsed = validateProject(data);
  if (!parsed.ok) return post({ id, type: "failed", bug: false, message: formatProblems(parsed.error) });
  const project = parsed.value;
  const spec = compileSpec(project);
  const options = drawingOptions(project, drawing);
  // The direct matrix at once, its drawing after it: the figure never waits for a layout.
  const direct = await synthesize(spec, synthSettings(project, { mode: "direct" }));
  if (!direct.ok) return post(failed(id, direct.error));
  post({ id, type: "matrix", phase: "direct", matrix: direct.value, drawing: null });
  post({ id, type: "drawing", drawing: layoutMatrix(project, spec, direct.value, options) });
  const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
  if (!r.ok) return post(failed(id, r.error));
  post({ id, type: "matrix", phase: "heuristic", matrix: r.value, drawing: layoutMatrix(project, spec, r.value, options) });
};
