/**
 * The part of a Web Worker the page's runners use: post, terminate and the
 * two handlers. The browser's Worker is one; unit tests pass a stand-in.
 */
export interface WorkerPort<Request, Reply> {
  postMessage(message: Request): void;
  terminate(): void;
  onmessage: ((event: MessageEvent<Reply>) => void) | null;
  onerror: ((event: ErrorEvent) => void) | null;
}
