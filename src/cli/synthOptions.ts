/**
 * The synthesis options that every command built on a matrix takes
 * (`synth`, `budget`, `netlist`, `export`), and how their outcome is printed.
 */
import { compileSpec, type DecodeSpec } from "../core/spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../core/matrix/matrix.ts";
import type { Project } from "../core/project/project.ts";
import { synthesize, synthSettings, type SynthFailure, type SynthSettings } from "../core/synth/synthesize.ts";
import { intOption, type OptionSpec, type ParsedArgs } from "./args.ts";
import { EXIT, type CliIo } from "./io.ts";
import { loadProject } from "./loadProject.ts";

export const SYNTH_USAGE = "[--direct | --fast] [--max-depth K] [--depth POLICY] [--time-limit MS]";

export const SYNTH_OPTIONS: Readonly<Record<string, OptionSpec>> = {
  direct: { help: "one diode per lit cell, no sharing" },
  fast: { help: "the heuristic only (no exact optimizer)" },
  "max-depth": { value: true, meta: "K", help: "most diodes on any path, 1-3 (overrides the project)" },
  depth: { value: true, meta: "POLICY", help: "mixed | per-segment | uniform (overrides the project)" },
  "time-limit": { value: true, meta: "MS", help: "time limit of the exact optimizer, milliseconds" },
};

/** Applies the synthesis options shared by `synth` and the commands built on it. */
export function settingsFromArgs(project: Project, args: ParsedArgs, io: CliIo): SynthSettings | undefined {
  const overrides: { -readonly [K in keyof SynthSettings]?: SynthSettings[K] } = {};
  if (args.flags.has("direct") && args.flags.has("fast")) {
    io.err("--direct and --fast exclude each other; give one\n");
    return undefined;
  }
  if (args.flags.has("direct")) overrides.mode = "direct";
  if (args.flags.has("fast")) overrides.mode = "fast";
  const depthK = intOption(args, "max-depth", 1, 3);
  if (!depthK.ok) return void io.err(depthK.message + "\n");
  if (depthK.value !== undefined) overrides.depthLimit = depthK.value;
  const limit = intOption(args, "time-limit", 1, 3_600_000);
  if (!limit.ok) return void io.err(limit.message + "\n");
  if (limit.value !== undefined) overrides.timeLimitMs = limit.value;
  const policy = args.values.get("depth");
  if (policy !== undefined) {
    if (policy !== "mixed" && policy !== "per-segment" && policy !== "uniform") {
      return void io.err(`--depth must be mixed, per-segment or uniform (got "${policy}")\n`);
    }
    overrides.policy = policy;
  }
  return synthSettings(project, overrides);
}

/** Prints a synthesis failure and returns its exit code. */
export function reportFailure(failure: SynthFailure, io: CliIo): number {
  if (failure.kind === "infeasible") {
    io.err(failure.message + "\n");
    return EXIT.input;
  }
  io.err(`${failure.message}\n${failure.details.map((d) => `  - ${d}`).join("\n")}\n`);
  return EXIT.internal;
}

/** A validated project with its spec and verified matrix. */
export interface Synthesized {
  readonly project: Project;
  readonly spec: DecodeSpec;
  readonly matrix: VerifiedMatrix;
}

/**
 * The common first half of every matrix command: read and validate the
 * project file, apply the synthesis options, synthesize and verify. On any
 * problem it prints the message and returns the exit code instead.
 *
 * @param check an optional extra check on the project (e.g. a state number in range); it returns a message, or undefined
 */
export async function loadAndSynthesize(
  args: ParsedArgs,
  io: CliIo,
  usage: string,
  check?: (project: Project) => string | undefined,
): Promise<Synthesized | number> {
  const project = await loadProject(args, io, usage);
  if (!project) return EXIT.input;
  const problem = check?.(project);
  if (problem !== undefined) {
    io.err(problem + "\n");
    return EXIT.input;
  }
  const settings = settingsFromArgs(project, args, io);
  if (!settings) return EXIT.input;
  const spec = compileSpec(project);
  const result = await synthesize(spec, settings);
  if (!result.ok) return reportFailure(result.error, io);
  return { project, spec, matrix: result.value };
}
