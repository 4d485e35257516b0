/**
 * An instrument's export, as the Export menu runs it: the papers worker
 * works out every decoder's budget and drawing with its decoder number in
 * front and the instrument's budget (papersProtocol.ts), from the matrices
 * the instrument summary found; the page then writes the set of papers.
 * The worker is started for the one export and stopped after it, or at its
 * deadline.
 */
import type { Instrument } from "../../core/project/instrument.ts";
import type { TrimMode } from "../../core/budget/segmentDesign.ts";
import type { DrawingOptions } from "../../render/drawingOptions.ts";
import type { DecoderSummary } from "../workers/summaryRun.ts";
import type { PapersReply, PapersRequest } from "../workers/papersProtocol.ts";
import { instrumentExportFiles, type ExportFile, type ExportKind } from "./exportFiles.ts";

/** Longest an instrument's export may take in the worker, milliseconds. */
export const PAPERS_DEADLINE_MS = 120_000;

/**
 * The files of one export kind of the instrument, or why there are none
 * (a decoder still being worked out, a worker that failed or ran out of time).
 */
export async function exportInstrument(
  instrument: Instrument,
  data: unknown,
  summary: readonly DecoderSummary[],
  trim: TrimMode,
  choice: Partial<DrawingOptions>,
  kind: ExportKind,
): Promise<{ readonly ok: true; readonly files: ExportFile[] } | { readonly ok: false; readonly message: string }> {
  const matrices = summary.map((s) => (s.status === "done" ? s.figures.matrix : null));
  if (matrices.length !== instrument.decoders.length || matrices.some((m) => m === null)) {
    return { ok: false, message: "the decoders' matrices are still being worked out (see the summary); try again in a moment" };
  }
  const worker = new Worker(new URL("../workers/papersWorker.ts", import.meta.url), { type: "module" });
  const reply = await new Promise<PapersReply>((resolve) => {
    const timer = setTimeout(() => resolve({ ok: false, message: `not done within ${PAPERS_DEADLINE_MS / 1000} s` }), PAPERS_DEADLINE_MS);
    worker.onmessage = (e: MessageEvent<PapersReply>) => {
      clearTimeout(timer);
      resolve(e.data);
    };
    worker.onerror = (e) => {
      e.preventDefault();
      clearTimeout(timer);
      resolve({ ok: false, message: `the export worker stopped: ${e.message || "unknown error"}` });
    };
    worker.postMessage({ instrument: data, matrices, trim, drawing: choice } satisfies PapersRequest);
  });
  worker.terminate();
  if (!reply.ok) return reply;
  const decoders = instrument.decoders.map((d, i) => ({ project: d.project, papers: reply.decoders[i]! }));
  return { ok: true, files: instrumentExportFiles(instrument, decoders, reply.budget, kind, choice) };
}
