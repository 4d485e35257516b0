import { formatProblems } from "../core/result/result.ts";
import { parseProjectBytes } from "../core/project/projectBytes.ts";
import type { Project } from "../core/project/project.ts";
import { shownArg, type ParsedArgs } from "./args.ts";
import type { CliIo } from "./io.ts";

/**
 * Reads and validates the one project file a command names. On any problem
 * it prints the messages (prefixed with the file name) and returns undefined;
 * the caller exits with code 2.
 */
export async function loadProject(args: ParsedArgs, io: CliIo, usage: string): Promise<Project | undefined> {
  const file = args.positional[0];
  if (file === undefined || args.positional.length > 1) {
    io.err(`usage: diodeloom ${usage}\n`);
    return undefined;
  }
  const name = shownArg(file, 400);
  const read = await io.readFile(file);
  if (!read.ok) {
    io.err(`${name}: ${read.message}\n`);
    return undefined;
  }
  const parsed = parseProjectBytes(read.bytes);
  if (!parsed.ok) {
    io.err(
      formatProblems(parsed.error)
        .split("\n")
        .map((l) => `${name}: ${l}`)
        .join("\n") + "\n",
    );
    return undefined;
  }
  return parsed.value;
}
