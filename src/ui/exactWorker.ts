/// <reference lib="webworker" />
/**
 * The Web Worker that runs the exact optimizer, so the page stays
 * responsive. Cancelling terminates the worker; the app starts a fresh one
 * for the next run.
 */
import { compileSpec } from "../core/decodeSpec.ts";
import { validateProject } from "../core/projectSchema.ts";
import { formatProblems } from "../core/result.ts";
import { synthesize, synthSettings } from "../core/synthesize.ts";
import type { ExactReply, ExactRequest } from "./exactProtocol.ts";

const scope = self as unknown as DedicatedWorkerGlobalScope;

function post(reply: ExactReply): void {
  scope.postMessage(reply);
}

scope.onmessage = async (event: MessageEvent<ExactRequest>) => {
  const { id, project: data } = event.data;
  const started = performance.now();
  const parsed = validateProject(data);
  if (!parsed.ok) return post({ id, type: "failed", message: formatProblems(parsed.error) });
  const spec = compileSpec(parsed.value);
  post({ id, type: "progress", progress: { best: null, bound: null, elapsedS: 0 } });
  try {
    const r = await synthesize(spec, synthSettings(parsed.value, { mode: "exact" }));
    if (!r.ok) return post({ id, type: "failed", message: r.error.message });
    post({ id, type: "progress", progress: { best: r.value.count, bound: r.value.lowerBound, elapsedS: (performance.now() - started) / 1000 } });
    post({ id, type: "done", matrix: r.value });
  } catch (e) {
    post({ id, type: "failed", message: `the exact optimizer stopped: ${(e as Error).message}` });
  }
};
