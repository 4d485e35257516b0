/**
 * Runs the summary worker (summaryProtocol.ts) for the page: the decoders
 * the instrument has now, one at a time, each answer kept by the decoder's
 * key (its draft and the trim setting as text), so an edit of one decoder
 * works out that decoder alone again, and undoing it finds its figures
 * kept; then, once every decoder has its budget, the instrument's budget
 * from them, kept by the decoders' names and keys. A job that is no longer
 * wanted while it runs stops the worker; a job past its deadline does too,
 * and fails.
 */
import type { DecoderFigures, InstrumentOutcome, SummaryReply, SummaryRequest } from "./summaryProtocol.ts";
import type { WorkerPort } from "./workerPort.ts";

export type SummaryWorker = WorkerPort<SummaryRequest, SummaryReply>;

/** What is known of one decoder: still to come, its figures, or why there are none. */
export type DecoderSummary =
  | { readonly status: "computing" }
  | { readonly status: "done"; readonly figures: DecoderFigures }
  | { readonly status: "failed"; readonly message: string };

/** What is known of the instrument's budget: still to come (or waiting for a decoder), worked out, or why not. */
export type InstrumentSummary =
  | { readonly status: "computing" }
  | { readonly status: "done"; readonly result: InstrumentOutcome }
  | { readonly status: "failed"; readonly message: string };

export interface DecoderJob {
  /** The decoder's draft and trim as text: equal keys, equal figures. */
  readonly key: string;
  readonly name: string;
  /** The decoder as a single-decoder project draft. */
  readonly project: unknown;
  readonly trim: Extract<SummaryRequest, { job: "decoder" }>["trim"];
  /** Longest the worker may take for it, milliseconds. */
  readonly deadlineMs: number;
}

export interface SummaryWant {
  readonly title: string;
  readonly decoders: readonly DecoderJob[];
}

/** Answers kept of each kind; the oldest is forgotten first. */
export const SUMMARY_CACHE = 64;
/** Longest the instrument's budget (its corner solves) may take, milliseconds. */
export const INSTRUMENT_DEADLINE_MS = 60_000;

const newWorker = (): SummaryWorker =>
  new Worker(new URL("./summaryWorker.ts", import.meta.url), { type: "module" }) as unknown as SummaryWorker;

/** A map that forgets its oldest entry beyond `SUMMARY_CACHE`. */
function keep<T>(map: Map<string, T>, key: string, value: T): void {
  map.delete(key);
  map.set(key, value);
  while (map.size > SUMMARY_CACHE) {
    const oldest = map.keys().next().value;
    if (oldest === undefined) break;
    map.delete(oldest);
  }
}

/** The key of the instrument's budget for the decoders wanted. */
function instrumentKey(w: SummaryWant): string {
  return JSON.stringify(w.decoders.map((d) => [d.name, d.key]));
}

interface Running {
  readonly kind: "decoder" | "instrument";
  readonly key: string;
  readonly id: number;
  readonly timer: ReturnType<typeof setTimeout>;
}

export class SummaryRunner {
  private worker: SummaryWorker | null = null;
  private readonly decoders = new Map<string, DecoderSummary>();
  private readonly instruments = new Map<string, InstrumentSummary>();
  private wanted: SummaryWant = { title: "", decoders: [] };
  private running: Running | null = null;
  private nextId = 0;

  /** @param changed called whenever an answer arrives */
  constructor(
    private readonly changed: () => void,
    private readonly createWorker: () => SummaryWorker = newWorker,
  ) {}

  /** What is known of a decoder by its key: computing until its answer comes. */
  get(key: string): DecoderSummary {
    return this.decoders.get(key) ?? { status: "computing" };
  }

  /** What is known of the instrument's budget for these decoders (wanted now, or about to be). */
  instrument(w: SummaryWant): InstrumentSummary {
    return this.instruments.get(instrumentKey(w)) ?? { status: "computing" };
  }

  /** Sets the decoders wanted now, in order; works out what is not yet known. */
  want(w: SummaryWant): void {
    this.wanted = w;
    const r = this.running;
    const still = r && (r.kind === "decoder" ? w.decoders.some((d) => d.key === r.key) : instrumentKey(w) === r.key);
    if (r && !still) this.stop();
    this.next();
  }

  private next(): void {
    if (this.running) return;
    const job = this.wanted.decoders.find((d) => !this.decoders.has(d.key));
    if (job) return this.start("decoder", job.key, job.deadlineMs, { job: "decoder", project: job.project, trim: job.trim });
    const key = instrumentKey(this.wanted);
    if (this.wanted.decoders.length < 2 || this.instruments.has(key)) return;
    const parts = this.wanted.decoders.map((d) => ({ d, s: this.get(d.key) }));
    const missing = parts.find((p) => p.s.status !== "done" || !p.s.figures.budget.ok);
    if (missing) {
      this.instruments.set(key, { status: "failed", message: `${missing.d.name} has no budget` });
      return this.changed();
    }
    const decoders = parts.map(({ d, s }) => {
      const f = (s as Extract<DecoderSummary, { status: "done" }>).figures;
      return { name: d.name, project: d.project, matrix: f.matrix, budget: (f.budget as Extract<typeof f.budget, { ok: true }>).value };
    });
    this.start("instrument", key, INSTRUMENT_DEADLINE_MS, {
      job: "instrument",
      title: this.wanted.title,
      decoders,
      timeLimitMs: INSTRUMENT_DEADLINE_MS - 5_000,
    });
  }

  private start(kind: Running["kind"], key: string, deadlineMs: number, request: DistributiveOmit<SummaryRequest, "id">): void {
    const id = ++this.nextId;
    const timer = setTimeout(() => {
      if (this.running?.id !== id) return;
      this.stop();
      this.settle(kind, key, `not worked out within ${Math.round(deadlineMs / 1000)} s`);
    }, deadlineMs);
    this.running = { kind, key, id, timer };
    this.ensure().postMessage({ ...request, id } as SummaryRequest);
  }

  /** Keeps an answer (a reply, or why there is none) and goes on with the next job. */
  private settle(kind: Running["kind"], key: string, reply: SummaryReply | string): void {
    if (typeof reply === "string") {
      if (kind === "decoder") keep(this.decoders, key, { status: "failed", message: reply });
      else keep(this.instruments, key, { status: "failed", message: reply });
    } else if (reply.type === "failed") {
      if (kind === "decoder") keep(this.decoders, key, { status: "failed", message: reply.message });
      else keep(this.instruments, key, { status: "failed", message: reply.message });
    } else if (reply.type === "figures") keep(this.decoders, key, { status: "done", figures: reply.figures });
    else keep(this.instruments, key, { status: "done", result: reply.result });
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
      this.settle(r.kind, r.key, e.data);
    };
    w.onerror = (e) => {
      e.preventDefault?.();
      const r = this.running;
      if (this.worker !== w || !r) return;
      this.stop();
      this.settle(r.kind, r.key, `the summary worker stopped: ${e.message || "unknown error"}`);
    };
    this.worker = w;
    return w;
  }

  /** Stops the job in progress; its answer is dropped (it stays "computing" until wanted again). */
  private stop(): void {
    if (this.running) clearTimeout(this.running.timer);
    this.running = null;
    this.worker?.terminate();
    this.worker = null;
  }
}

type DistributiveOmit<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;
