import type { OptionSpec, ParsedArgs } from "./args.ts";
import type { CliIo } from "./io.ts";

/** One `diodeloom` subcommand. Each lives in its own file under commands/. */
export interface Command {
  readonly name: string;
  /** Usage line after `diodeloom NAME`, e.g. `FILE [--json]`. */
  readonly usage: string;
  readonly summary: string;
  readonly options: Readonly<Record<string, OptionSpec>>;
  /** Returns the exit code (see EXIT). */
  run(args: ParsedArgs, io: CliIo): Promise<number>;
}
