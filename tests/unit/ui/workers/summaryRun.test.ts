import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { Budget } from "../../../../src/core/budget/budgetTypes.ts";
import type { InstrumentBudget } from "../../../../src/core/budget/instrumentBudget.ts";
import { fail, ok } from "../../../../src/core/result/result.ts";
import { instrumentTotals, totalsCaveat } from "../../../../src/ui/state/instrumentSummary.ts";
import type { DecoderFigures, SummaryReply, SummaryRequest } from "../../../../src/ui/workers/summaryProtocol.ts";
import { SummaryRunner, type DecoderJob, type SummaryWant } from "../../../../src/ui/workers/summaryRun.ts";
import { fakeWorker, type FakeWorker } from "../../../support/fakeWorker.ts";

type Fake = FakeWorker<SummaryRequest, SummaryReply>;

function setup() {
  const workers: Fake[] = [];
  let changes = 0;
  const runner = new SummaryRunner(
    () => changes++,
    () => {
      const w = fakeWorker<SummaryRequest, SummaryReply>();
      workers.push(w);
      return w;
    },
  );
  return { runner, workers, changes: () => changes };
}

const job = (name: string, key = name): DecoderJob => ({ key, name, project: { name }, trim: "auto", deadlineMs: 1_000 });
const want = (...decoders: DecoderJob[]): SummaryWant => ({ title: "Clock", decoders });
const budget = { supply: { maxCurrentA: 0.01 } } as unknown as Budget;
const figures = (diodes: number, withBudget = true): DecoderFigures => ({
  diodes,
  transistors: 7,
  resistors: 21,
  optimal: true,
  matrix: { count: diodes },
  budget: withBudget ? ok(budget) : fail({ kind: "rejected" as const, message: "no budget here" }),
});
/** The last request posted to the newest worker. */
const lastPosted = (workers: Fake[]) => {
  const w = workers[workers.length - 1]!;
  return { w, req: w.posted[w.posted.length - 1]! };
};

beforeEach(() => void vi.useFakeTimers());
afterEach(() => void vi.useRealTimers());

describe("the instrument summary's runner", () => {
  it("works out one decoder at a time, then the instrument's budget from theirs", () => {
    const { runner, workers, changes } = setup();
    const w2 = want(job("minutes"), job("hours"));
    runner.want(w2);
    let { w, req } = lastPosted(workers);
    expect(req).toMatchObject({ job: "decoder", project: { name: "minutes" } });
    expect(w.posted).toHaveLength(1);
    w.reply({ id: req.id, type: "figures", figures: figures(21) });
    ({ w, req } = lastPosted(workers));
    expect(req).toMatchObject({ job: "decoder", project: { name: "hours" } });
    w.reply({ id: req.id, type: "figures", figures: figures(40) });
    ({ w, req } = lastPosted(workers));
    expect(req).toMatchObject({ job: "instrument", title: "Clock" });
    const sent = req as Extract<SummaryRequest, { job: "instrument" }>;
    expect(sent.decoders.map((d) => [d.name, d.matrix])).toEqual([
      ["minutes", { count: 21 }],
      ["hours", { count: 40 }],
    ]);
    expect(runner.instrument(w2).status).toBe("computing");
    const ib = { decoders: ["minutes", "hours"] } as unknown as InstrumentBudget;
    w.reply({ id: req.id, type: "instrument", result: ok(ib) });
    expect(runner.instrument(w2)).toEqual({ status: "done", result: ok(ib) });
    expect(changes()).toBe(3);
    expect(workers).toHaveLength(1);
  });

  it("keeps each decoder's answer: an edit of one works out that one again, an undo finds its figures kept", () => {
    const { runner, workers } = setup();
    runner.want(want(job("minutes", "m1"), job("hours", "h1")));
    for (const n of [21, 40]) {
      const { w, req } = lastPosted(workers);
      w.reply({ id: req.id, type: "figures", figures: figures(n) });
    }
    expect(lastPosted(workers).req.job).toBe("instrument");
    runner.want(want(job("minutes", "m2"), job("hours", "h1")));
    // The instrument job for m1/h1 was superseded: its worker stopped, a fresh one works out m2 alone.
    expect(workers[0]?.terminated).toBe(true);
    expect(workers[1]?.posted).toHaveLength(1);
    expect(workers[1]?.posted[0]).toMatchObject({ job: "decoder", project: { name: "minutes" } });
    expect(runner.get("h1").status).toBe("done");
    expect(runner.get("m2").status).toBe("computing");
    runner.want(want(job("minutes", "m1"), job("hours", "h1")));
    expect(runner.get("m1")).toMatchObject({ status: "done", figures: { diodes: 21 } });
  });

  it("stops a decoder that is no longer wanted, and fails one past its deadline", () => {
    const { runner, workers } = setup();
    runner.want(want(job("minutes"), job("hours")));
    const first = workers[0]!;
    runner.want(want(job("hours")));
    expect(first.terminated).toBe(true);
    expect(lastPosted(workers).req).toMatchObject({ job: "decoder", project: { name: "hours" } });
    vi.advanceTimersByTime(1_000);
    expect(runner.get("hours")).toEqual({ status: "failed", message: "not worked out within 1 s" });
    expect(workers[1]?.terminated).toBe(true);
  });

  it("gives no instrument budget when a decoder has none, and says why", () => {
    const { runner, workers } = setup();
    const w2 = want(job("minutes"), job("hours"));
    runner.want(w2);
    let { w, req } = lastPosted(workers);
    w.reply({ id: req.id, type: "figures", figures: figures(21) });
    ({ w, req } = lastPosted(workers));
    w.reply({ id: req.id, type: "figures", figures: figures(40, false) });
    expect(runner.instrument(w2)).toEqual({ status: "failed", message: "hours has no budget" });
    const totals = instrumentTotals([runner.get("minutes"), runner.get("hours")], runner.instrument(w2));
    expect([totals.diodes, totals.transistors, totals.resistors]).toEqual([61, 14, 42]);
    expect(totals.supply).toBeNull();
    expect(totalsCaveat(totals)).toBe("Partial totals: no supply totals: hours has no budget.");
  });

  it("says which decoders the totals still leave out", () => {
    const done = { status: "done" as const, figures: figures(10) };
    const t = instrumentTotals([done, { status: "computing" }, { status: "failed", message: "x" }], { status: "computing" });
    expect(t.diodes).toBe(10);
    expect(totalsCaveat(t)).toBe("Partial totals: 1 of 3 decoders still being worked out; 1 with no figures (left out).");
  });
});
