/**
 * Runs the summary worker (summaryProtocol.ts) for the page: the decoders
 * the instrument has now, one at a time, each answer kept by the decoder's
 * key (its draft and the trim setting as text), so an edit of one decoder
 * works out that decoder alone again, and undoing it finds its figures
 * kept. A decoder that is no longer wanted while it is being worked out
 * stops the worker; a run past its deadline does too, and fails.
 */
import type { DecoderFigures, SummaryReply, SummaryRequest } from "./summaryProtocol.ts";
import type { WorkerPort } from "./workerPort.ts";

export type SummaryWorker = WorkerPort<SummaryRequest, SummaryReply>;

/** What is known of one decoder: still to come, its figures, or why there are none. */
export type DecoderSummary =
  | { readonly status: "computing" }
  | { readonly status: "done"; readonly figures: DecoderFigures }
  | { readonly status: "failed"; readonly message: string };

export interface SummaryJob {
  /** The decoder's draft and trim as text: equal keys, equal figures. */
  readonly key: string;
  readonly request: Omit<SummaryRequest, "id">;
  /** Longest the worker may take for it, milliseconds. */
  readonly deadlineMs: number;
}

/** Answers kept; the oldest is forgotten first. */
export const SUMMARY_CACHE = 64;

const newWorker = (): SummaryWorker =>
  new Worker(new URL("./summaryWorker.ts", import.meta.url), { type: "module" }) as unknown as SummaryWorker;

export class SummaryRunner {
  private worker: SummaryWorker | null = null;
  private readonly known = new Map<string, DecoderSummary>();
  private wanted: readonly SummaryJob[] = [];
  private running: { readonly key: string; readonly id: number; readonly timer: ReturnType<typeof setTimeout> } | null = null;
  private nextId = 0;

  /** @param changed called whenever an answer arrives */
  constructor(
    private readonly changed: () => void,
    private readonly createWorker: () => SummaryWorker = newWorker,
  ) {}

  /** What is known of a decoder by its key: computing until its answer comes. */
  get(key: string): DecoderSummary {
    return this.known.get(key) ?? { status: "computing" };
  }

  /** Sets the decoders wanted now, in order; works out those not yet known. */
  want(jobs: readonly SummaryJob[]): void {
    this.wanted = jobs;
    if (this.running && !jobs.some((j) => j.key === this.running?.key)) this.stop();
    this.next();
  }

  private next(): void {
    if (this.running) return;
    const job = this.wanted.find((j) => !this.known.has(j.key));
    if (!job) return;
    const id = ++this.nextId;
    const timer = setTimeout(() => {
      if (this.running?.id !== id) return;
      this.stop();
      this.keep(job.key, { status: "failed", message: `not worked out within ${Math.round(job.deadlineMs / 1000)} s` });
    }, job.deadlineMs);
    this.running = { key: job.key, id, timer };
    this.ensure().postMessage({ ...job.request, id });
  }

  private keep(key: string, s: DecoderSummary): void {
    this.known.delete(key);
    this.known.set(key, s);
    while (this.known.size > SUMMARY_CACHE) {
      const oldest = this.known.keys().next().value;
      if (oldest === undefined) break;
      this.known.delete(oldest);
    }
    this.changed();
    this.next();
  }

  private ensure(): SummaryWorker {
    if (this.worker) return this.worker;
    const w = this.createWorker();
    w.onmessage = (e) => {
      const r = this.running;
      if (this.worker !== w || !r || e.data.id !== r.id) return;
      clearTimeout(r.timer);
      this.running = null;
      this.keep(
        r.key,
        e.data.type === "figures" ? { status: "done", figures: e.data.figures } : { status: "failed", message: e.data.message },
      );
    };
    w.onerror = (e) => {
      e.preventDefault?.();
      const r = this.running;
      if (this.worker !== w || !r) return;
      this.stop();
      this.keep(r.key, { status: "failed", message: `the summary worker stopped: ${e.message || "unknown error"}` });
    };
    this.worker = w;
    return w;
  }

  /** Stops the decoder being worked out; its answer is dropped (it stays "computing" until wanted again). */
  private stop(): void {
    if (this.running) clearTimeout(this.running.timer);
    this.running = null;
    this.worker?.terminate();
    this.worker = null;
  }
}
