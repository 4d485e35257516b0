import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { AnalysisClient } from "../../../../src/ui/workers/analysisClient.ts";
import type { AnalysisReply, AnalysisRequest } from "../../../../src/ui/workers/analysisProtocol.ts";
import { ok } from "../../../../src/core/result/result.ts";
import { fakeWorker, type FakeWorker } from "../../../support/fakeWorker.ts";

type Fake = FakeWorker<AnalysisRequest, AnalysisReply>;

function setup() {
  const workers: Fake[] = [];
  const client = new AnalysisClient(
    () => {
      const w = fakeWorker<AnalysisRequest, AnalysisReply>();
      workers.push(w);
      return w;
    },
    { budget: 1_000, compare: 5_000, layout: 2_000, "two-rank": 3_000 },
  );
  return { client, workers };
}

beforeEach(() => void vi.useFakeTimers());
afterEach(() => void vi.useRealTimers());

describe("AnalysisClient", () => {
  it("gives each job its own worker, so a long comparison never holds up a budget", async () => {
    const { client, workers } = setup();
    void client.request<"compare">({ job: "compare", project: {} });
    const layout = client.request<"layout">({ job: "layout", project: {}, matrix: {}, drawing: { paper: "a4" } });
    expect(workers).toHaveLength(2);
    const req = workers[1]?.posted[0] as AnalysisRequest;
    const drawing = { sheets: [], placements: new Map() };
    workers[1]?.reply({ id: req.id, job: "layout", result: ok(drawing) });
    expect((await layout).result).toEqual(ok(drawing));
  });

  it("answers a job that passes its deadline with a deadline failure and stops its worker", async () => {
    const { client, workers } = setup();
    const reply = client.request<"compare">({ job: "compare", project: {} });
    vi.advanceTimersByTime(5_000);
    const r = (await reply).result;
    expect(r.ok).toBe(false);
    expect(!r.ok && r.error).toEqual({ kind: "deadline", message: "the comparison did not finish within 5 s and was stopped" });
    expect(workers[0]?.terminated).toBe(true);
    // The next request gets a fresh worker.
    void client.request<"compare">({ job: "compare", project: {} });
    expect(workers).toHaveLength(2);
  });

  it("replaces a worker still busy with a superseded request, and drops the old answer", async () => {
    const { client, workers } = setup();
    let oldAnswered = false;
    void client.request<"budget">({ job: "budget", project: {}, matrix: {}, trim: "auto" }).then(() => (oldAnswered = true));
    const newer = client.request<"budget">({ job: "budget", project: { n: 2 }, matrix: {}, trim: "auto" });
    expect(workers[0]?.terminated).toBe(true);
    const id = workers[1]?.posted[0]?.id as number;
    workers[1]?.reply({ id, job: "budget", result: { ok: false, error: { kind: "rejected", message: "no" } } });
    expect((await newer).id).toBe(id);
    vi.advanceTimersByTime(10_000);
    await Promise.resolve();
    expect(oldAnswered).toBe(false);
  });

  it("keeps an idle worker for the next request of its job", async () => {
    const { client, workers } = setup();
    const first = client.request<"layout">({ job: "layout", project: {}, matrix: {}, drawing: { paper: "a4" } });
    workers[0]?.reply({ id: workers[0].posted[0]?.id as number, job: "layout", result: ok({ sheets: [], placements: new Map() }) });
    await first;
    void client.request<"layout">({ job: "layout", project: {}, matrix: {}, drawing: { paper: "letter" } });
    expect(workers).toHaveLength(1);
    expect(workers[0]?.posted).toHaveLength(2);
  });

  it("stops a job's busy worker when it is cancelled, and never answers the dropped request", async () => {
    const { client, workers } = setup();
    let answered = false;
    void client.request<"compare">({ job: "compare", project: {} }).then(() => void (answered = true));
    const layout = client.request<"layout">({ job: "layout", project: {}, matrix: {}, drawing: { paper: "a4" } });
    client.cancel("compare");
    expect(workers[0]?.terminated).toBe(true);
    expect(workers[1]?.terminated).toBe(false);
    vi.advanceTimersByTime(10_000);
    await Promise.resolve();
    expect(answered).toBe(false);
    // The next comparison gets a fresh worker.
    void client.request<"compare">({ job: "compare", project: {} });
    expect(workers).toHaveLength(3);
    void layout;
  });
});
