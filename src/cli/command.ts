import type { OptionSpec, ParsedArgs } from "./args.ts";
import type { CliIo } from "./io.ts";

/** One `diodeloom` subcommand. Each lives in its own file under commands/; its summary is in main.ts's list. */
export interface Command {
  readonly name: string;
  /** Usage line after `diodeloom NAME`, e.g. `FILE [--json]`. */
  readonly usage: string;
  readonly options: Readonly<Record<string, OptionSpec>>;
  /** Returns the exit code (see EXIT). */
  run(args: ParsedArgs, io: CliIo): Promise<number>;
}
