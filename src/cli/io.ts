import type { FolderOutcome, OutputFile, OwnNames } from "./outputFolder.ts";

/**
 * What a command may touch of the outside world. `main` gets the real one;
 * tests pass a recording one.
 */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** The bytes of a file (a project file: at most `LIMITS.fileBytes`, checked before reading). */
  readFile(path: string): Promise<{ ok: true; bytes: Uint8Array } | { ok: false; message: string }>;
  /** Checks that a folder can take an export, before the work (see outputFolder.ts). */
  checkOutputFolder(dir: string, ours: OwnNames): Promise<FolderOutcome>;
  /** Writes files as the folder `dir`, all or nothing, each as it is made (see outputFolder.ts). */
  writeOutputFolder(dir: string, files: Iterable<OutputFile>, ours: OwnNames): Promise<FolderOutcome>;
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
