import { readFile } from "node:fs/promises";
import { join } from "node:path";
import type { CliIo } from "../../src/cli/io.ts";
import { checkOutputFolder, writeOutputFolder, type OutputFile } from "../../src/cli/outputFolder.ts";

/** A CliIo that records what a command prints; files come from a map first, then the disk. */
export interface RecordingIo extends CliIo {
  readonly stdout: string[];
  readonly stderr: string[];
  readonly written: Map<string, string | Uint8Array>;
}

export function recordingIo(files: Record<string, string> = {}, opts: { writeToDisk?: boolean } = {}): RecordingIo {
  const stdout: string[] = [];
  const stderr: string[] = [];
  const written = new Map<string, string | Uint8Array>();
  return {
    stdout,
    stderr,
    written,
    out: (t) => void stdout.push(t),
    err: (t) => void stderr.push(t),
    async readFile(path) {
      if (path in files) return { ok: true, bytes: new TextEncoder().encode(files[path] as string) };
      try {
        return { ok: true, bytes: new Uint8Array(await readFile(path)) };
      } catch {
        return { ok: false, message: "no such file" };
      }
    },
    async checkOutputFolder(dir, ours) {
      return opts.writeToDisk ? checkOutputFolder(dir, ours) : { ok: true };
    },
    async writeOutputFolder(dir, files, ours) {
      // The files may come one at a time from a generator: record each as it passes.
      const passed: OutputFile[] = [];
      const recorded = (function* () {
        for (const f of files) {
          passed.push(f);
          yield f;
        }
      })();
      if (!opts.writeToDisk) Array.from(recorded);
      const r = opts.writeToDisk ? await writeOutputFolder(dir, recorded, ours) : { ok: true as const };
      if (r.ok) for (const f of passed) written.set(join(dir, f.name), f.data);
      return r;
    },
  };
}
