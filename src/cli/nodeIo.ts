/** The real file system and terminal, for the installed command (tests pass a recording CliIo instead). */
import { readFile, writeFile, mkdir, stat } from "node:fs/promises";
import type { CliIo } from "./io.ts";

export const nodeIo: CliIo = {
  out: (t) => void process.stdout.write(t),
  err: (t) => void process.stderr.write(t),
  async readFile(path) {
    // The size limit lives beside the project schema; importing it here, not at the top, keeps the
    // schema and its validator out of `diodeloom --version` (commands load them anyway).
    const { MAX_PROJECT_BYTES } = await import("../core/project/projectSchema.ts");
    try {
      const s = await stat(path);
      if (!s.isFile()) return { ok: false, message: "not a file" };
      if (s.size > MAX_PROJECT_BYTES) return { ok: false, message: "the file is larger than 1 MiB; a project needs far less" };
      return { ok: true, text: await readFile(path, "utf8") };
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      return { ok: false, message: code === "ENOENT" ? "no such file" : `cannot read it (${code ?? String(e)})` };
    }
  },
  writeFile: (path, data) => writeFile(path, data),
  makeDir: async (path) => void (await mkdir(path, { recursive: true })),
};
