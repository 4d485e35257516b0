/**
 * The `diodeloom` command: dispatches to one subcommand per file in
 * commands/. Every expected failure ends in a message and an exit code,
 * never a stack trace.
 *
 * A subcommand's module is imported only when it runs (or prints its own
 * help), so `diodeloom --version` and `diodeloom --help` load this file and
 * little else; the build (scripts/buildCli.mjs) splits each command into its
 * own chunk along these imports.
 */
import { helpLines, parseArgs } from "./args.ts";
import type { Command } from "./command.ts";
import { EXIT, type CliIo } from "./io.ts";
import { nodeIo } from "./nodeIo.ts";
import { quoteText } from "../core/project/valueText.ts";

export const VERSION = "0.1.0";

/** A subcommand as the top-level help lists it, with the import that loads the rest. */
export interface CommandEntry {
  readonly name: string;
  readonly summary: string;
  load(): Promise<Command>;
}

/** Every subcommand, in the order the help lists them. */
export const COMMANDS: readonly CommandEntry[] = [
  {
    name: "synth",
    summary: "find the smallest verified diode matrix for a project",
    load: async () => (await import("./commands/synth.ts")).synthCommand,
  },
  {
    name: "compare",
    summary: "compare the built-in glyph styles (6, 7, 9) by the smallest matrix each allows",
    load: async () => (await import("./commands/compare.ts")).compareCommand,
  },
  {
    name: "export",
    summary: "write the matrix drawing, wiring list, budget, BOM, SPICE netlists and normalised project",
    load: async () => (await import("./commands/export.ts")).exportCommand,
  },
  {
    name: "budget",
    summary: "solve every state's circuit: currents, voltages, ratings, trim and tolerance corners",
    load: async () => (await import("./commands/budget.ts")).budgetCommand,
  },
  {
    name: "netlist",
    summary: "print the SPICE netlist (.model, .op) of the circuit with one state active",
    load: async () => (await import("./commands/netlist.ts")).netlistCommand,
  },
];

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
  const entry = COMMANDS.find((c) => c.name === name);
  if (!entry) {
    io.err(`unknown command ${quoteText(name)}; commands are ${COMMANDS.map((c) => c.name).join(", ")} (see diodeloom --help)\n`);
    return EXIT.input;
  }
  const command = await entry.load();
  if (rest.includes("--help") || rest.includes("-h")) {
    io.out([`usage: diodeloom ${command.usage}`, "", entry.summary, "", ...helpLines(command.options), ""].join("\n"));
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
