/**
 * Runs the live worker (liveProtocol.ts) for the page: one run at a time,
 * each with a deadline, so the page always answers and always ends up with a
 * result or a message.
 *
 * - The worker is kept between runs while it is idle (typing on a small
 *   project reuses it); a new run while one is still working terminates the
 *   old worker and starts a fresh one, since a solve cannot be interrupted
 *   from outside any other way.
 * - The direct answer comes without its drawing, so its figure shows at
 *   once; it is held until `FIRST_HOLD_MS` after the start of the run, and
 *   when the heuristic's arrives by then only that one is shown, so small
 *   projects do not flicker through two counts. Its drawing follows in a
 *   message of its own.
 * - At the deadline the worker is terminated; the direct answer, if any, is
 *   what the page keeps. A worker that has not even sent the direct answer
 *   gets `DIRECT_EXTRA_MS` more for it.
 */
import type { DrawingOptions } from "../../render/drawingOptions.ts";
import type { MatrixDrawing } from "../../render/layout.ts";
import type { LiveReply, LiveRequest } from "./liveProtocol.ts";
import type { WorkerPort } from "./workerPort.ts";

/**
 * Until when a direct answer waits for the heuristic's before it is shown,
 * milliseconds from the start of the run: short enough that the first figure
 * shows well inside 200 ms of an edit, long enough that a small project's
 * heuristic, which takes a few milliseconds, is shown alone.
 */
export const FIRST_HOLD_MS = 80;
/** Extra time for the direct answer when the deadline finds none, milliseconds. */
export const DIRECT_EXTRA_MS = 30_000;

export type MatrixReply = Extract<LiveReply, { type: "matrix" }>;

/** The live worker as the runner sees it. */
export type LiveWorker = WorkerPort<LiveRequest, LiveReply>;

export interface LiveCallbacks {
  /** A matrix (not yet verified by the page) and its drawing, null for a direct one whose drawing follows; `final` for the heuristic's. */
  matrix(reply: MatrixReply, final: boolean): void;
  /** The drawing of the direct matrix shown before. */
  drawing(drawing: MatrixDrawing): void;
  failed(message: string, bug: boolean): void;
  /** The deadline passed before the heuristic's answer; the worker was stopped. */
  deadline(): void;
}

const newWorker = (): LiveWorker => new Worker(new URL("./liveWorker.ts", import.meta.url), { type: "module" }) as unknown as LiveWorker;

export class LiveRunner {
  private worker: LiveWorker | null = null;
  private busy = false;
  private runId = 0;
  private timers: ReturnType<typeof setTimeout>[] = [];
  private onReply: ((reply: LiveReply) => void) | null = null;
  private onCrash: ((message: string) => void) | null = null;

  constructor(private readonly createWorker: () => LiveWorker = newWorker) {}

  /** True while a run has not given its final answer. */
  get running(): boolean {
    return this.busy;
  }

  /**
   * Starts a run for a project draft, replacing any run in progress.
   *
   * @param drawing the paper and title-block fields the drawings are laid out with
   * @param deadlineMs time the heuristic may take, from now
   * @example runner.start(draftFromProject(p), { paper: "a4" }, p.synthesis.timeLimitMs, { matrix, drawing, failed, deadline });
   */
  start(project: unknown, drawing: Partial<DrawingOptions>, deadlineMs: number, callbacks: LiveCallbacks): void {
    this.cancel();
    const id = this.runId;
    const worker = this.ensureWorker();
    this.busy = true;
    let held: MatrixReply | null = null;
    let gotDirect = false;
    let shownDirect = false;
    let pastDeadline = false;
    const holdUntil = Date.now() + FIRST_HOLD_MS;
    const release = () => {
      if (!held) return;
      const h = held;
      held = null;
      shownDirect = true;
      callbacks.matrix(h, false);
    };
    const end = () => {
      this.busy = false;
      this.clearTimers();
    };
    const stopAtDeadline = () => {
      release();
      this.stopWorker();
      end();
      callbacks.deadline();
    };
    this.onReply = (reply) => {
      if (reply.id !== id || this.runId !== id) return;
      if (reply.type === "failed") {
        held = null;
        end();
        callbacks.failed(reply.message, reply.bug);
      } else if (reply.type === "drawing") {
        if (held) held = { ...held, drawing: reply.drawing };
        else if (shownDirect && this.busy) callbacks.drawing(reply.drawing);
      } else if (reply.phase === "direct") {
        gotDirect = true;
        held = reply;
        if (pastDeadline) stopAtDeadline();
        else if (Date.now() >= holdUntil) release();
        else this.timers.push(setTimeout(release, holdUntil - Date.now()));
      } else {
        held = null;
        end();
        callbacks.matrix(reply, true);
      }
    };
    this.onCrash = (message) => {
      if (this.runId !== id) return;
      this.stopWorker();
      end();
      callbacks.failed(`the live worker stopped: ${message || "unknown error"}`, true);
    };
    this.timers.push(
      setTimeout(() => {
        if (this.runId !== id) return;
        if (gotDirect) return stopAtDeadline();
        pastDeadline = true;
        this.timers.push(
          setTimeout(() => {
            if (this.runId !== id) return;
            this.stopWorker();
            end();
            callbacks.failed(`no matrix within ${Math.round((deadlineMs + DIRECT_EXTRA_MS) / 1000)} s; the worker was stopped`, false);
          }, DIRECT_EXTRA_MS),
        );
      }, deadlineMs),
    );
    worker.postMessage({ id, project, drawing });
  }

  /** Stops the run in progress, if any; its answers are dropped. */
  cancel(): void {
    this.clearTimers();
    this.runId++;
    if (this.busy) this.stopWorker();
    this.busy = false;
  }

  private ensureWorker(): LiveWorker {
    if (this.worker) return this.worker;
    const w = this.createWorker();
    w.onmessage = (e) => {
      if (this.worker === w) this.onReply?.(e.data);
    };
    w.onerror = (e) => {
      e.preventDefault?.();
      if (this.worker === w) this.onCrash?.(e.message);
    };
    this.worker = w;
    return w;
  }

  private stopWorker(): void {
    this.worker?.terminate();
    this.worker = null;
  }

  private clearTimers(): void {
    for (const t of this.timers) clearTimeout(t);
    this.timers = [];
  }
}
