/**
 * Starts, follows and cancels exact-optimizer runs in a Web Worker.
 *
 * One run at a time: starting a new run, or cancelling, terminates the
 * worker of the old one (the solver cannot be interrupted from outside any
 * other way), so a stale answer can never arrive. A run given a deadline is
 * ended the same way when it passes it, and reported as failed.
 */
import type { GlyphStyleRow, RowStart } from "../../core/compare/glyphStyles.ts";
import type { ExactProgress, ExactReply, ExactRequest, RowReply } from "./exactProtocol.ts";

export interface ExactCallbacks {
  progress(p: ExactProgress): void;
  done(matrix: unknown): void;
  /** A comparison row starts. */
  rowStart?(start: RowStart): void;
  /** A comparison row finished. */
  row?(done: RowReply): void;
  compared?(rows: readonly GlyphStyleRow[]): void;
  failed(message: string): void;
}

export interface ExactRunOptions {
  /** `matrix` (the default) or `compare`. */
  readonly job?: ExactRequest["job"];
  /** When given, the run is stopped and reported as failed after this long, milliseconds. */
  readonly deadlineMs?: number;
  /** For `compare`: rows already worked out, by row key. */
  readonly known?: ExactRequest["known"];
}

export class ExactRunner {
  private worker: Worker | null = null;
  private runId = 0;
  private deadline: ReturnType<typeof setTimeout> | undefined;

  /**
   * Starts a run for a project draft; any run in progress is cancelled.
   *
   * @example runner.start(draft, { progress, done, failed }, { job: "matrix", deadlineMs: 30_000 });
   */
  start(project: unknown, callbacks: ExactCallbacks, options: ExactRunOptions = {}): void {
    const { job = "matrix", deadlineMs, known } = options;
    this.cancel();
    const id = ++this.runId;
    const worker = new Worker(new URL("./exactWorker.ts", import.meta.url), { type: "module" });
    this.worker = worker;
    if (deadlineMs !== undefined) {
      this.deadline = setTimeout(() => {
        if (this.worker !== worker) return;
        this.finish(worker);
        callbacks.failed(`the optimizer did not finish within ${Math.round(deadlineMs / 1000)} s and was stopped`);
      }, deadlineMs);
    }
    worker.onmessage = (e: MessageEvent<ExactReply>) => {
      const reply = e.data;
      if (reply.id !== id || this.worker !== worker) return;
      if (reply.type === "progress") callbacks.progress(reply.progress);
      else if (reply.type === "row-start") callbacks.rowStart?.(reply.start);
      else if (reply.type === "row") callbacks.row?.(reply.done);
      else {
        this.finish(worker);
        if (reply.type === "done") callbacks.done(reply.matrix);
        else if (reply.type === "compared") callbacks.compared?.(reply.rows);
        else callbacks.failed(reply.message);
      }
    };
    worker.onerror = (e) => {
      e.preventDefault();
      if (this.worker !== worker) return;
      this.finish(worker);
      callbacks.failed(`the optimizer worker failed: ${e.message || "unknown error"}`);
    };
    const request: ExactRequest = known ? { id, job, project, known } : { id, job, project };
    worker.postMessage(request);
  }

  /** Stops the run in progress, if any. */
  cancel(): void {
    if (this.worker) this.finish(this.worker);
  }

  get running(): boolean {
    return this.worker !== null;
  }

  private finish(worker: Worker): void {
    clearTimeout(this.deadline);
    worker.terminate();
    if (this.worker === worker) this.worker = null;
  }
}
