/**
 * The page's side of the analysis worker: one long-lived worker, one
 * outstanding request per job; a newer request makes the older one's answer
 * be dropped when it arrives.
 */
import type { AnalysisReply, AnalysisRequest } from "./analysisProtocol.ts";

type Job = AnalysisRequest["job"];
type ReplyOf<J extends Job> = Extract<AnalysisReply, { job: J }>;

export class AnalysisClient {
  private worker: Worker | null = null;
  private nextId = 0;
  private readonly latest = new Map<Job, { id: number; resolve: (r: AnalysisReply) => void }>();

  private ensure(): Worker {
    if (this.worker) return this.worker;
    const w = new Worker(new URL("./analysisWorker.ts", import.meta.url), { type: "module" });
    w.onmessage = (e: MessageEvent<AnalysisReply>) => {
      const wait = this.latest.get(e.data.job);
      if (wait && wait.id === e.data.id) {
        this.latest.delete(e.data.job);
        wait.resolve(e.data);
      }
    };
    this.worker = w;
    return w;
  }

  /** Sends a request; resolves with its answer, or never when a newer request of the same job supersedes it. */
  request<J extends Job>(req: Omit<Extract<AnalysisRequest, { job: J }>, "id">): Promise<ReplyOf<J>> {
    const id = ++this.nextId;
    return new Promise<ReplyOf<J>>((resolve) => {
      this.latest.set(req.job, { id, resolve: resolve as (r: AnalysisReply) => void });
      this.ensure().postMessage({ ...req, id });
    });
  }
}

/** The one analysis worker of the page. */
export const analysis = new AnalysisClient();
