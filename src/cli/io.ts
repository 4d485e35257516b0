/**
 * What a command may touch of the outside world. `main` gets the real one;
 * tests pass a recording one.
 */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** The bytes of a file (a project file: at most `LIMITS.fileBytes`, checked before reading). */
  readFile(path: string): Promise<{ ok: true; bytes: Uint8Array } | { ok: false; message: string }>;
  writeFile(path: string, data: string | Uint8Array): Promise<void>;
  makeDir(path: string): Promise<void>;
}

/** Exit codes of the `diodeloom` command. */
export const EXIT = {
  ok: 0,
  /** The design has a problem the report names (e.g. a failed budget check with --strict). */
  findings: 1,
  /** Bad input: usage, an unreadable or invalid project, an infeasible limit. */
  input: 2,
  /** A bug in diodeloom: the verifier rejected a result, or a stage threw. */
  internal: 70,
} as const;
