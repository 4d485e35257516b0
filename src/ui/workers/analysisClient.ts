/**
 * The page's side of the analysis workers: one worker per job (budget,
 * comparison, layout), so a long comparison never holds up a budget, and one
 * outstanding request per job. A newer request supersedes the older one: its
 * answer is dropped, and a worker still busy with it is terminated and
 * replaced, since a solve cannot be interrupted from outside any other way.
 * A request that passes its job's deadline ends the same way and resolves
 * with a `deadline` failure, so every request gets an answer.
 */
import { fail } from "../../core/result/result.ts";
import type { AnalysisReply, AnalysisRequest } from "./analysisProtocol.ts";
import type { WorkerPort } from "./workerPort.ts";

type Job = AnalysisRequest["job"];
type ReplyOf<J extends Job> = Extract<AnalysisReply, { job: J }>;
export type AnalysisWorker = WorkerPort<AnalysisRequest, AnalysisReply>;

/** Longest a job may run before its worker is stopped, milliseconds. */
export const ANALYSIS_DEADLINE_MS: Readonly<Record<Job, number>> = { budget: 30_000, compare: 30_000, layout: 30_000, "two-rank": 30_000 };

const newWorker = (): AnalysisWorker =>
  new Worker(new URL("./analysisWorker.ts", import.meta.url), { type: "module" }) as unknown as AnalysisWorker;

interface Waiting {
  readonly id: number;
  resolve(reply: AnalysisReply): void;
  readonly timer: ReturnType<typeof setTimeout>;
}

export class AnalysisClient {
  private nextId = 0;
  private readonly workers = new Map<Job, AnalysisWorker>();
  private readonly latest = new Map<Job, Waiting>();

  constructor(
    private readonly createWorker: () => AnalysisWorker = newWorker,
    private readonly deadlineMs: Readonly<Record<Job, number>> = ANALYSIS_DEADLINE_MS,
  ) {}

  /**
   * Sends a request; resolves with its answer or, past the job's deadline,
   * with a `deadline` failure; never when a newer request of the same job
   * supersedes it.
   *
   * @example const reply = await analysis.request<"budget">({ job: "budget", project, matrix, trim: "auto" });
   */
  request<J extends Job>(req: Omit<Extract<AnalysisRequest, { job: J }>, "id">): Promise<ReplyOf<J>> {
    const job = req.job as J;
    const id = ++this.nextId;
    const older = this.latest.get(job);
    if (older) {
      clearTimeout(older.timer);
      this.latest.delete(job);
      this.stop(job);
    }
    const worker = this.ensure(job);
    return new Promise<ReplyOf<J>>((resolve) => {
      const timer = setTimeout(() => {
        if (this.latest.get(job)?.id !== id) return;
        this.latest.delete(job);
        this.stop(job);
        const seconds = Math.round(this.deadlineMs[job] / 1000);
        const result = fail({ kind: "deadline" as const, message: `${JOB_NAMES[job]} did not finish within ${seconds} s and was stopped` });
        resolve({ id, job, result } as ReplyOf<J>);
      }, this.deadlineMs[job]);
      this.latest.set(job, { id, resolve: resolve as (r: AnalysisReply) => void, timer });
      worker.postMessage({ ...req, id } as AnalysisRequest);
    });
  }

  /**
   * Drops the outstanding request of a job and stops its worker, as a newer
   * request would: its answer is never given. An edit calls this for the
   * budget and the comparison of the result it makes stale, so that their
   * solves stop taking the processor the next result needs.
   */
  cancel(job: Job): void {
    const waiting = this.latest.get(job);
    if (!waiting) return;
    clearTimeout(waiting.timer);
    this.latest.delete(job);
    this.stop(job);
  }

  private ensure(job: Job): AnalysisWorker {
    const existing = this.workers.get(job);
    if (existing) return existing;
    const w = this.createWorker();
    w.onmessage = (e) => {
      const wait = this.latest.get(e.data.job);
      if (this.workers.get(job) !== w || !wait || wait.id !== e.data.id) return;
      clearTimeout(wait.timer);
      this.latest.delete(e.data.job);
      wait.resolve(e.data);
    };
    w.onerror = (e) => {
      e.preventDefault?.();
      const wait = this.latest.get(job);
      if (this.workers.get(job) !== w || !wait) return;
      clearTimeout(wait.timer);
      this.latest.delete(job);
      this.stop(job);
      const result = fail({ kind: "rejected" as const, message: `the ${job} worker stopped: ${e.message || "unknown error"}` });
      wait.resolve({ id: wait.id, job, result } as AnalysisReply);
    };
    this.workers.set(job, w);
    return w;
  }

  private stop(job: Job): void {
    this.workers.get(job)?.terminate();
    this.workers.delete(job);
  }
}

const JOB_NAMES: Readonly<Record<Job, string>> = {
  budget: "the budget",
  compare: "the comparison",
  layout: "the drawing",
  "two-rank": "the two-rank decoder",
};

/** The analysis workers of the page. */
export const analysis = new AnalysisClient();
