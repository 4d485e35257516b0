/**
 * The `diodeloom` command: dispatches to one subcommand per file in
 * commands/. Every expected failure ends in a message and an exit code,
 * never a stack trace.
 */
import { readFile, writeFile, mkdir, stat } from "node:fs/promises";
import { helpLines, parseArgs } from "./args.ts";
import type { Command } from "./command.ts";
import { EXIT, type CliIo } from "./io.ts";
import { synthCommand } from "./commands/synth.ts";
import { compareCommand } from "./commands/compare.ts";
import { exportCommand } from "./commands/export.ts";
import { budgetCommand } from "./commands/budget.ts";
import { netlistCommand } from "./commands/netlist.ts";
import { MAX_PROJECT_BYTES } from "../core/project/projectSchema.ts";

export const VERSION = "0.1.0";

const COMMANDS: readonly Command[] = [synthCommand, compareCommand, exportCommand, budgetCommand, netlistCommand];

function usage(): string {
  const width = Math.max(...COMMANDS.map((c) => c.name.length));
  return [
    `diodeloom ${VERSION}: diode-matrix decoders for one-hot ring counters`,
    "",
    "usage: diodeloom COMMAND FILE [options]",
    "",
    "commands:",
    ...COMMANDS.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
    "",
    "Run `diodeloom COMMAND --help` for a command's options.",
    "Exit codes: 0 done, 1 findings, 2 bad input, 70 internal error.",
    "",
  ].join("\n");
}

/** The real file system, for the installed command. */
export const nodeIo: CliIo = {
  out: (t) => void process.stdout.write(t),
  err: (t) => void process.stderr.write(t),
  async readFile(path) {
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

/** Runs the command line and returns the exit code. */
export async function main(argv: readonly string[], io: CliIo = nodeIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === "--help" || name === "-h" || name === "help") {
    io.out(usage());
    return name === undefined ? EXIT.input : EXIT.ok;
  }
  if (name === "--version" || name === "-V") {
    io.out(`${VERSION}\n`);
    return EXIT.ok;
  }
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) {
    io.err(`unknown command "${name}"; commands are ${COMMANDS.map((c) => c.name).join(", ")} (see diodeloom --help)\n`);
    return EXIT.input;
  }
  if (rest.includes("--help") || rest.includes("-h")) {
    io.out([`usage: diodeloom ${command.usage}`, "", command.summary, "", ...helpLines(command.options), ""].join("\n"));
    return EXIT.ok;
  }
  const parsed = parseArgs(rest, command.options);
  if (!parsed.ok) {
    io.err(`${parsed.message}\nusage: diodeloom ${command.usage}\n`);
    return EXIT.input;
  }
  try {
    return await command.run(parsed.args, io);
  } catch (e) {
    io.err(`internal error in diodeloom ${name}: ${(e as Error).message}\nThis is a bug; please report it with the project file.\n`);
    return EXIT.internal;
  }
}
