import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { LiveReply, LiveRequest } from "../../../../src/ui/workers/liveProtocol.ts";
import { DIRECT_EXTRA_MS, FIRST_HOLD_MS, LiveRunner, type MatrixReply } from "../../../../src/ui/workers/liveRun.ts";
import type { MatrixDrawing } from "../../../../src/render/layout.ts";
import { fakeWorker, type FakeWorker } from "../../../support/fakeWorker.ts";

type Fake = FakeWorker<LiveRequest, LiveReply>;

const drawing = { sheets: [], placements: new Map() } as MatrixDrawing;
const answer = (id: number, phase: "direct" | "heuristic", count: number): MatrixReply => ({
  id,
  type: "matrix",
  phase,
  matrix: { count },
  drawing: phase === "direct" ? null : drawing,
});

function setup() {
  const workers: Fake[] = [];
  const runner = new LiveRunner(() => {
    const w = fakeWorker<LiveRequest, LiveReply>();
    workers.push(w);
    return w;
  });
  const events: string[] = [];
  const callbacks = {
    matrix: (r: MatrixReply, final: boolean) =>
      events.push(`${final ? "final" : "direct"} ${(r.matrix as { count: number }).count}${r.drawing ? " with drawing" : ""}`),
    drawing: (d: MatrixDrawing) => events.push(`drawing of ${d.sheets.length} sheet(s)`),
    failed: (m: string, bug: boolean) => events.push(`failed${bug ? " (bug)" : ""}: ${m}`),
    deadline: () => events.push("deadline"),
  };
  return { runner, workers, events, callbacks };
}

beforeEach(() => void vi.useFakeTimers());
afterEach(() => void vi.useRealTimers());

describe("LiveRunner", () => {
  it("shows only the heuristic's answer when it follows the direct one within the grace time", () => {
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 20_000, callbacks);
    const id = workers[0]?.posted[0]?.id as number;
    workers[0]?.reply(answer(id, "direct", 30));
    vi.advanceTimersByTime(FIRST_HOLD_MS - 1);
    workers[0]?.reply(answer(id, "heuristic", 21));
    vi.advanceTimersByTime(60_000);
    expect(events).toEqual(["final 21 with drawing"]);
    expect(runner.running).toBe(false);
    expect(workers[0]?.terminated).toBe(false);
  });

  it("shows the direct figure once the first moment is over, then its drawing when it comes, then the heuristic's", () => {
    // The first figure must not wait for a layout: before, the direct answer came with its drawing and was held 250 ms more.
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 20_000, callbacks);
    const w = workers[0]!;
    const id = w.posted[0]?.id as number;
    vi.advanceTimersByTime(5);
    w.reply(answer(id, "direct", 300));
    vi.advanceTimersByTime(FIRST_HOLD_MS - 6);
    expect(events).toEqual([]);
    vi.advanceTimersByTime(1);
    expect(events).toEqual(["direct 300"]);
    w.reply({ id, type: "drawing", drawing: { ...drawing, sheets: [] } });
    expect(events).toEqual(["direct 300", "drawing of 0 sheet(s)"]);
    w.reply(answer(id, "heuristic", 200));
    expect(events).toEqual(["direct 300", "drawing of 0 sheet(s)", "final 200 with drawing"]);
  });

  it("gives a direct answer still held the drawing that came meanwhile, and shows a late one at once", () => {
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 20_000, callbacks);
    const id = workers[0]?.posted[0]?.id as number;
    workers[0]?.reply(answer(id, "direct", 30));
    workers[0]?.reply({ id, type: "drawing", drawing });
    vi.advanceTimersByTime(FIRST_HOLD_MS);
    expect(events).toEqual(["direct 30 with drawing"]);
    runner.start({ p: 2 }, { paper: "a4" }, 20_000, callbacks);
    const w = workers.at(-1)!;
    const id2 = w.posted.at(-1)?.id as number;
    vi.advanceTimersByTime(FIRST_HOLD_MS + 500);
    w.reply(answer(id2, "direct", 31));
    expect(events).toEqual(["direct 30 with drawing", "direct 31"]);
  });

  it("shows the direct answer while a slow heuristic works, and stops the worker at the deadline", () => {
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 5_000, callbacks);
    const id = workers[0]?.posted[0]?.id as number;
    vi.advanceTimersByTime(1_000);
    workers[0]?.reply(answer(id, "direct", 9824));
    vi.advanceTimersByTime(FIRST_HOLD_MS);
    expect(events).toEqual(["direct 9824"]);
    expect(runner.running).toBe(true);
    vi.advanceTimersByTime(5_000);
    expect(events).toEqual(["direct 9824", "deadline"]);
    expect(workers[0]?.terminated).toBe(true);
    expect(runner.running).toBe(false);
    // A late answer from the stopped run is never shown.
    workers[0]?.reply(answer(id, "heuristic", 5000));
    expect(events).toHaveLength(2);
  });

  it("waits past the deadline for a direct answer that has not come, then shows it and stops", () => {
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 1_000, callbacks);
    const id = workers[0]?.posted[0]?.id as number;
    vi.advanceTimersByTime(3_000);
    expect(events).toEqual([]);
    workers[0]?.reply(answer(id, "direct", 40));
    expect(events).toEqual(["direct 40", "deadline"]);
    expect(workers[0]?.terminated).toBe(true);
  });

  it("gives up with a message when not even the direct answer comes", () => {
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 1_000, callbacks);
    vi.advanceTimersByTime(1_000 + DIRECT_EXTRA_MS);
    expect(events).toEqual(["failed: no matrix within 31 s; the worker was stopped"]);
    expect(workers[0]?.terminated).toBe(true);
  });

  it("reuses an idle worker, and replaces a busy one when a newer draft arrives", () => {
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 20_000, callbacks);
    workers[0]?.reply(answer(workers[0].posted[0]?.id as number, "heuristic", 7));
    runner.start({ p: 2 }, { paper: "a4" }, 20_000, callbacks);
    expect(workers).toHaveLength(1);
    expect(workers[0]?.posted).toHaveLength(2);
    // Busy now: the next draft cannot wait for it.
    runner.start({ p: 3 }, { paper: "letter" }, 20_000, callbacks);
    expect(workers).toHaveLength(2);
    expect(workers[0]?.terminated).toBe(true);
    expect(workers[1]?.posted[0]).toMatchObject({ project: { p: 3 }, drawing: { paper: "letter" } });
    workers[1]?.reply(answer(workers[1].posted[0]?.id as number, "heuristic", 9));
    expect(events).toEqual(["final 7 with drawing", "final 9 with drawing"]);
  });

  it("reports a worker that fails as a bug, and starts a fresh one for the next run", () => {
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 20_000, callbacks);
    workers[0]?.crash("out of memory");
    expect(events).toEqual(["failed (bug): the live worker stopped: out of memory"]);
    runner.start({ p: 2 }, { paper: "a4" }, 20_000, callbacks);
    expect(workers).toHaveLength(2);
  });

  it("passes on the worker's own failure message", () => {
    const { runner, workers, events, callbacks } = setup();
    runner.start({ p: 1 }, { paper: "a4" }, 20_000, callbacks);
    workers[0]?.reply({ id: workers[0].posted[0]?.id as number, type: "failed", bug: false, message: "the depth limit admits no matrix" });
    expect(events).toEqual(["failed: the depth limit admits no matrix"]);
    vi.advanceTimersByTime(60_000);
    expect(events).toHaveLength(1);
  });
});
