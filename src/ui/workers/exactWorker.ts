/// <reference lib="webworker" />
/**
 * The Web Worker that runs the exact optimizer on HiGHS (WebAssembly), so
 * the page stays responsive. Cancelling terminates the worker; the app
 * starts a fresh one for the next run. Two jobs: one project's matrix, or
 * the glyph-style comparison of a project.
 */
import highsLoader from "highs";
import wasmUrl from "highs/runtime?url";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import { compareGlyphStyles } from "../../core/compare/glyphStyles.ts";
import { validateProject } from "../../core/project/projectSchema.ts";
import { formatProblems } from "../../core/result/result.ts";
import type { HighsLike, HighsLoader } from "../../core/synth/exact.ts";
import { synthesize, synthSettings, type SynthHooks } from "../../core/synth/synthesize.ts";
import type { ExactReply, ExactRequest } from "./exactProtocol.ts";

const scope = self as unknown as DedicatedWorkerGlobalScope;

/** A fresh HiGHS runtime per solve, its WebAssembly file served by Vite. */
const loadHighs: HighsLoader = async () => (await highsLoader({ locateFile: () => wasmUrl })) as unknown as HighsLike;

function post(reply: ExactReply): void {
  scope.postMessage(reply);
}

scope.onmessage = async (event: MessageEvent<ExactRequest>) => {
  const { id, project: data, job, known } = event.data;
  const started = performance.now();
  const elapsedS = () => (performance.now() - started) / 1000;
  const parsed = validateProject(data);
  if (!parsed.ok) return post({ id, type: "failed", message: formatProblems(parsed.error) });
  const hooks: SynthHooks = {
    loadHighs,
    onProgress: (p) => post({ id, type: "progress", progress: { best: p.count, bound: p.lowerBound, elapsedS: elapsedS() } }),
  };
  try {
    if (job === "compare") {
      const r = await compareGlyphStyles(parsed.value, {
        settings: { mode: "exact" },
        hooks,
        known: new Map(known ?? []),
        onRowStart: (start) => post({ id, type: "row-start", start }),
        onRow: (d) => post({ id, type: "row", done: { index: d.index, total: d.total, key: d.key, row: d.row, matrix: d.matrix } }),
      });
      if (!r.ok) return post({ id, type: "failed", message: r.error.message });
      return post({ id, type: "compared", rows: r.value });
    }
    const r = await synthesize(compileSpec(parsed.value), synthSettings(parsed.value, { mode: "exact" }), hooks);
    if (!r.ok) return post({ id, type: "failed", message: r.error.message });
    post({ id, type: "done", matrix: r.value });
  } catch (e) {
    post({ id, type: "failed", message: `the exact optimizer stopped: ${(e as Error).message}` });
  }
};
