/**
 * The synthesis options that every command built on a matrix takes
 * (`synth`, `budget`, `netlist`, `export`), and how their outcome is printed.
 */
import { compileSpec, type DecodeSpec } from "../core/spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../core/matrix/matrix.ts";
import type { Project } from "../core/project/project.ts";
import { LIMITS } from "../core/project/limits.ts";
import {
  checkSynthesisOverrides,
  DARK_INPUTS,
  DECODE_POLARITIES,
  DEPTH_POLICIES,
  numberFromText,
} from "../core/project/synthesisSchema.ts";
import { checkPolarity } from "../core/project/polaritySchema.ts";
import { synthesize, synthSettings, type SynthFailure, type SynthSettings } from "../core/synth/synthesize.ts";
import { synthesizeCoded, type CodedSynthesis } from "../core/logic/synthesizeCoded.ts";
import type { OptionSpec, ParsedArgs } from "./args.ts";
import { EXIT, type CliIo } from "./io.ts";
import { loadDecoder } from "./loadProject.ts";
import { withRefPrefix } from "../core/matrix/designators.ts";

export const SYNTH_USAGE =
  "[--direct | --fast] [--depth-limit K] [--policy NAME] [--decode NAME] [--dark-input NAME] [--time-limit MS] [--seed N]";

const { depthLimit, timeLimitMs, seed } = LIMITS;

export const SYNTH_OPTIONS: Readonly<Record<string, OptionSpec>> = {
  direct: { help: "one diode per lit cell, no sharing" },
  fast: { help: "the heuristic only (no exact optimizer)" },
  "depth-limit": {
    value: true,
    meta: "K",
    help: `most diodes on any path, ${depthLimit.min}-${depthLimit.max} (overrides synthesis.maxDepth)`,
  },
  policy: { value: true, meta: "NAME", help: `depth policy: ${DEPTH_POLICIES.join(" | ")} (overrides synthesis.depth)` },
  decode: { value: true, meta: "NAME", help: `decode polarity: ${DECODE_POLARITIES.join(" | ")} (overrides synthesis.decode)` },
  "dark-input": {
    value: true,
    meta: "NAME",
    help: `input network of a dark-decoded output: ${DARK_INPUTS.join(" | ")} (overrides synthesis.darkInput)`,
  },
  "time-limit": {
    value: true,
    meta: "MS",
    help: `time limit of the exact optimizer, ${timeLimitMs.min}-${timeLimitMs.max} ms (overrides synthesis.timeLimitMs)`,
  },
  seed: { value: true, meta: "N", help: `seed of the optimizer's randomised steps, ${seed.min}-${seed.max} (overrides synthesis.seed)` },
  "max-depth": { value: true, meta: "K", olderSpellingOf: "depth-limit", help: "" },
  depth: { value: true, meta: "NAME", olderSpellingOf: "policy", help: "" },
};

/** Each override option, by its documented name, with the synthesis option it sets and whether it is a number. */
const OVERRIDES: readonly { readonly option: string; readonly field: string; readonly numeric: boolean }[] = [
  { option: "depth-limit", field: "depthLimit", numeric: true },
  { option: "policy", field: "policy", numeric: false },
  { option: "decode", field: "decode", numeric: false },
  { option: "dark-input", field: "darkInput", numeric: false },
  { option: "time-limit", field: "timeLimitMs", numeric: true },
  { option: "seed", field: "seed", numeric: true },
];

/**
 * Applies the synthesis options shared by `synth` and the commands built on
 * it. The values are checked by the same rules as the project file's
 * `synthesis` section; a problem is printed under the option's name as the
 * person typed it (`--max-depth: got 7; must be a whole number from 1 to 3`).
 */
export function settingsFromArgs(project: Project, args: ParsedArgs, io: CliIo): SynthSettings | undefined {
  if (args.flags.has("direct") && args.flags.has("fast")) {
    io.err("--direct and --fast exclude each other; give one\n");
    return undefined;
  }
  const raw: Record<string, unknown> = {};
  const optionOf = new Map<string, string>();
  for (const o of OVERRIDES) {
    const text = args.values.get(o.option);
    if (text === undefined) continue;
    raw[o.field] = o.numeric ? numberFromText(text) : text;
    optionOf.set(o.field, args.spelling.get(o.option) ?? `--${o.option}`);
  }
  const checked = checkSynthesisOverrides(raw);
  if (!checked.ok) {
    io.err(checked.error.map((p) => `${optionOf.get(p.path) ?? p.path}: ${p.message}\n`).join(""));
    return undefined;
  }
  const mode = args.flags.has("direct") ? "direct" : args.flags.has("fast") ? "fast" : undefined;
  return synthSettings(project, { ...checked.value, ...(mode ? { mode } : {}) });
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
  /** The time limit the run had, milliseconds (the project's, or `--time-limit`): the budget gets it too. */
  readonly timeLimitMs: number;
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
  what?: string,
): Promise<Synthesized | number> {
  const loaded = await loadDecoder(args, io, usage, what);
  if (!loaded) return EXIT.input;
  const { project, refPrefix } = loaded;
  const problem = check?.(project);
  if (problem !== undefined) {
    io.err(problem + "\n");
    return EXIT.input;
  }
  return synthesizeForCircuit(project, args, io, refPrefix);
}

/**
 * `synthesizeProject`, refusing a matrix the circuit model does not take
 * yet (dark-decoded outputs): the first half of every command that solves
 * or prints the circuit.
 */
export async function synthesizeForCircuit(project: Project, args: ParsedArgs, io: CliIo, refPrefix = ""): Promise<Synthesized | number> {
  const done = await synthesizeProject(project, args, io, refPrefix);
  if (typeof done === "number") return done;
  return done;
}

/**
 * The second half of `loadAndSynthesize`, for a project already read and
 * checked: apply the synthesis options, synthesize and verify.
 *
 * @param refPrefix the decoder's designator prefix in an instrument of several ("" for none; designators.ts)
 */
export async function synthesizeProject(project: Project, args: ParsedArgs, io: CliIo, refPrefix = ""): Promise<Synthesized | number> {
  const settings = settingsFromArgs(project, args, io);
  if (!settings) return EXIT.input;
  const effective = withPolarity(project, settings, io);
  if (!effective) return EXIT.input;
  const spec = compileSpec(effective);
  const result = await synthesize(spec, settings);
  if (!result.ok) return reportFailure(result.error, io);
  return { project: effective, spec, matrix: withRefPrefix(result.value, refPrefix), timeLimitMs: settings.timeLimitMs };
}

/**
 * The project with `--decode` and `--dark-input` applied (they change the
 * decode spec, not only the optimizer's settings), checked against the
 * counter's lines and the driver as the project file is.
 */
export function withPolarity(project: Project, settings: Partial<Project["synthesis"]>, io: CliIo): Project | undefined {
  const decode = settings.decode ?? project.synthesis.decode;
  const darkInput = settings.darkInput ?? project.synthesis.darkInput;
  if (decode === project.synthesis.decode && darkInput === project.synthesis.darkInput) return project;
  const synthesis = { ...project.synthesis, decode, darkInput };
  const problems: { path: string; message: string }[] = [];
  checkPolarity(project.counter, synthesis, project.electrical, problems);
  if (problems.length > 0) {
    io.err(problems.map((p) => `--decode: ${p.message}\n`).join(""));
    return undefined;
  }
  return { ...project, synthesis };
}

/** A validated coded-counter project with its spec and decoders. */
export interface CodedSynthesized {
  readonly project: Project;
  readonly spec: DecodeSpec;
  readonly coded: CodedSynthesis;
}

/**
 * Synthesizes a coded counter's project (already read and validated) with
 * the synthesis options: its two-level decoder, the two-rank one, and the
 * chosen one (its designators with `refPrefix` in front). On any problem it
 * prints the message and returns the exit code.
 */
export async function synthesizeCodedProject(
  project: Project,
  args: ParsedArgs,
  io: CliIo,
  refPrefix = "",
): Promise<CodedSynthesized | number> {
  const settings = settingsFromArgs(project, args, io);
  if (!settings) return EXIT.input;
  const spec = compileSpec(project);
  const result = await synthesizeCoded(spec, settings, { oneHot: synthesize });
  if (!result.ok) return reportFailure(result.error, io);
  return { project, spec, coded: { ...result.value, matrix: withRefPrefix(result.value.matrix, refPrefix) } };
}
