/** The real file system and terminal, for the installed command (tests pass a recording CliIo instead). */
import { readFile, stat } from "node:fs/promises";
// limits.ts is a few constants with no imports of its own, so `diodeloom --version` stays light.
import { fileSizeProblem } from "../core/project/limits.ts";
import type { CliIo } from "./io.ts";
import { checkOutputFolder, writeOutputFolder } from "./outputFolder.ts";

export const nodeIo: CliIo = {
  out: (t) => void process.stdout.write(t),
  err: (t) => void process.stderr.write(t),
  async readFile(path) {
    try {
      const s = await stat(path);
      if (!s.isFile()) return { ok: false, message: "not a file" };
      const tooLarge = fileSizeProblem(s.size);
      if (tooLarge) return { ok: false, message: tooLarge.message };
      return { ok: true, bytes: await readFile(path) };
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      return { ok: false, message: code === "ENOENT" ? "no such file" : `cannot read it (${code ?? String(e)})` };
    }
  },
  checkOutputFolder,
  writeOutputFolder,
};
