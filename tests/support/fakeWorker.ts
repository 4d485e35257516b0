import type { WorkerPort } from "../../src/ui/workers/workerPort.ts";

/** A stand-in for a Web Worker: records what the page posts, answers when the test says, and knows if it was terminated. */
export interface FakeWorker<Request, Reply> extends WorkerPort<Request, Reply> {
  readonly posted: Request[];
  terminated: boolean;
  reply(message: Reply): void;
  crash(message: string): void;
}

export function fakeWorker<Request, Reply>(): FakeWorker<Request, Reply> {
  const w: FakeWorker<Request, Reply> = {
    posted: [],
    terminated: false,
    onmessage: null,
    onerror: null,
    postMessage(m) {
      if (w.terminated) throw new Error("bug: a message to a terminated worker");
      w.posted.push(m);
    },
    terminate() {
      w.terminated = true;
    },
    reply(message) {
      if (!w.terminated) w.onmessage?.({ data: message } as MessageEvent<Reply>);
    },
    crash(message) {
      if (!w.terminated) w.onerror?.({ message, preventDefault() {} } as ErrorEvent);
    },
  };
  return w;
}
