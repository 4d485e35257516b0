/**
 * The design options of every command that prints parts or their values
 * (`synth`, `budget`, `netlist`, `export`): whether the resistors that set
 * the segment currents (emitter resistors of a sink, series resistors of
 * the other kinds) take the trim, and in which preferred-value series. All
 * four settle the design the same way, so they print the same value for
 * each resistor.
 */
import { budgetCoverage } from "../core/budget/budget.ts";
import { settleDesign, projectDesign, TRIM_MODES, type SegmentDesign, type TrimMode } from "../core/budget/segmentDesign.ts";
import type { ESeriesName } from "../core/budget/eSeries.ts";
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../core/matrix/matrix.ts";
import type { Project } from "../core/project/project.ts";
import { quoteText } from "../core/project/valueText.ts";
import type { OptionSpec, ParsedArgs } from "./args.ts";
import { EXIT, type CliIo } from "./io.ts";
import { loadAndSynthesize, type Synthesized } from "./synthOptions.ts";

export const DESIGN_USAGE = "[--trim auto|off|on] [--series E24|E96]";

export const DESIGN_OPTIONS: Readonly<Record<string, OptionSpec>> = {
  trim: {
    value: true,
    meta: "auto|off|on",
    help: "trim of the resistors that set the segment currents: auto (default) applies it where the design rule allows, off prints the untrimmed design, on applies it regardless (never over the segment rating)",
  },
  series: { value: true, meta: "E24|E96", help: "preferred values for the trim (default E24)" },
};

export interface DesignArgs {
  readonly mode: TrimMode;
  readonly series: ESeriesName;
}

/** Reads `--trim` and `--series`, or prints what is wrong and returns undefined. */
export function designArgs(args: ParsedArgs, io: CliIo): DesignArgs | undefined {
  const series = args.values.get("series") ?? "E24";
  if (series !== "E24" && series !== "E96") return void io.err(`--series: got ${quoteText(series)}; must be E24 or E96\n`);
  const mode = args.values.get("trim") ?? "auto";
  if (!(TRIM_MODES as readonly string[]).includes(mode)) return void io.err(`--trim: got ${quoteText(mode)}; must be auto, off or on\n`);
  return { mode: mode as TrimMode, series };
}

/**
 * The design's current-setting resistors for the parts list and the decks: settled
 * as the budget settles them. When the circuit cannot be solved they stay
 * the project's, and the design says the trim could not be worked out.
 */
export function designFor(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  given: DesignArgs,
  timeLimitMs: number,
): SegmentDesign {
  return designAndSizing(project, spec, matrix, given, timeLimitMs).design;
}

/**
 * `designFor`, with the words of the dark-decoded outputs' sizing (which
 * limit stops a smaller value), or null where nothing was sized.
 */
export function designAndSizing(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  given: DesignArgs,
  timeLimitMs: number,
): { readonly design: SegmentDesign; readonly sizing: string | null } {
  if (given.mode === "off") return { design: projectDesign(project.electrical, matrix, given), sizing: null };
  // The states the budget checks at this limit, so that every command settles the design the budget prints.
  const states = budgetCoverage(project, spec, matrix, timeLimitMs)?.checked;
  const settled = settleDesign(project, spec, matrix, { ...given, deadlineMs: budgetDeadline(timeLimitMs), states });
  return settled.ok
    ? { design: settled.value.design, sizing: settled.value.darkSizing?.binding ?? null }
    : { design: projectDesign(project.electrical, matrix, given), sizing: null };
}

/**
 * The first half of every command that prints the design: read the design
 * options, then load, check and synthesize as `loadAndSynthesize` does. On
 * any problem it prints the message and returns the exit code instead.
 */
export async function loadForDesign(
  args: ParsedArgs,
  io: CliIo,
  usage: string,
  check?: (project: Project) => string | undefined,
  what?: string,
): Promise<(Synthesized & { readonly design: DesignArgs }) | number> {
  const design = designArgs(args, io);
  if (!design) return EXIT.input;
  const done = await loadAndSynthesize(args, io, usage, check, what);
  return typeof done === "number" ? done : { ...done, design };
}

/**
 * When the budget's solves must stop: the run's time limit (the project's,
 * or `--time-limit`) again, counted from now, so a command on the largest
 * projects ends instead of solving every state's circuit for minutes.
 */
export function budgetDeadline(timeLimitMs: number): number {
  return Date.now() + timeLimitMs;
}
