/**
 * The synthesis options: one rule per option, used both for the project
 * file's `synthesis` section and for the overrides the command line and the
 * app apply on top of it, so the two can never disagree about what is
 * allowed or how it is said.
 *
 * The file spells the depth limit `maxDepth` and the depth policy `depth`
 * (format version 1); in code they are `depthLimit` and `policy`.
 */
import * as v from "valibot";
import { booleanField, choiceField, gotMessage, issuePath, numberField, objectField } from "./fieldRules.ts";
import { LIMITS } from "./limits.ts";
import type { DarkInput, DecodePolarity, DepthPolicy, SynthesisFields, SynthesisOptions } from "./project.ts";
import { fail, ok, type Problem, type Result } from "../result/result.ts";

export const DEPTH_POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];
export const DECODE_POLARITIES: readonly DecodePolarity[] = ["lit", "dark", "either"];
export const DARK_INPUTS: readonly DarkInput[] = ["level-shift", "divider"];

/** Defaults of the `synthesis` section (documented in docs/project-format.md). */
export const SYNTHESIS_DEFAULTS: SynthesisOptions = {
  depthLimit: 2,
  policy: "per-segment",
  buses: true,
  links: true,
  timeLimitMs: 20_000,
  seed: 1,
  decode: "lit",
  darkInput: "level-shift",
};

/** The rule of each option, by its name in code. */
const RULES = {
  depthLimit: numberField({ ...LIMITS.depthLimit, integer: true }),
  policy: choiceField(["mixed", "per-segment", "uniform"] as const),
  buses: booleanField(),
  links: booleanField(),
  timeLimitMs: numberField({ ...LIMITS.timeLimitMs, integer: true, unit: "ms" }),
  seed: numberField({ ...LIMITS.seed, integer: true }),
  decode: choiceField(["lit", "dark", "either"] as const),
  darkInput: choiceField(["level-shift", "divider"] as const),
};

const D = SYNTHESIS_DEFAULTS;

/** The file's `synthesis` section, every option optional. */
export const SynthesisSectionSchema = objectField({
  maxDepth: v.optional(RULES.depthLimit, D.depthLimit),
  depth: v.optional(RULES.policy, D.policy),
  buses: v.optional(RULES.buses, D.buses),
  links: v.optional(RULES.links, D.links),
  timeLimitMs: v.optional(RULES.timeLimitMs, D.timeLimitMs),
  seed: v.optional(RULES.seed, D.seed),
  decode: v.optional(RULES.decode, D.decode),
  darkInput: v.optional(RULES.darkInput, D.darkInput),
});

/** The section as read from the file, turned into the names used in code. */
export function synthesisOf(f: SynthesisFields): SynthesisOptions {
  return {
    depthLimit: f.maxDepth,
    policy: f.depth,
    buses: f.buses,
    links: f.links,
    timeLimitMs: f.timeLimitMs,
    seed: f.seed,
    decode: f.decode,
    darkInput: f.darkInput,
  };
}

const OverridesSchema = v.strictObject(
  {
    depthLimit: v.optional(RULES.depthLimit),
    policy: v.optional(RULES.policy),
    buses: v.optional(RULES.buses),
    links: v.optional(RULES.links),
    timeLimitMs: v.optional(RULES.timeLimitMs),
    seed: v.optional(RULES.seed),
    decode: v.optional(RULES.decode),
    darkInput: v.optional(RULES.darkInput),
  },
  gotMessage("an override is one of depthLimit, policy, buses, links, timeLimitMs, seed, decode, darkInput"),
);

/** Overrides of the project's synthesis options, by their names in code; each may be missing. */
export type SynthesisOverrides = { -readonly [K in keyof SynthesisOptions]?: SynthesisOptions[K] };

/**
 * Checks overrides of the synthesis options (from the command line or the
 * app) with the same rules as the project file. Each problem's path is the
 * option's name in code (`depthLimit`); the caller names it its own way
 * (`--depth-limit`).
 *
 * @example
 * checkSynthesisOverrides({ depthLimit: 7 });
 * // fail([{ path: "depthLimit", message: "got 7; must be a whole number from 1 to 3" }])
 */
export function checkSynthesisOverrides(input: Readonly<Record<string, unknown>>): Result<SynthesisOverrides> {
  const parsed = v.safeParse(OverridesSchema, input, { abortPipeEarly: true });
  if (parsed.success) return ok(parsed.output);
  return fail(parsed.issues.map((i): Problem => ({ path: issuePath(i), message: i.message })));
}

/**
 * A number typed on a command line or in a form, for the rules to check: a
 * decimal number becomes that number; anything else stays text, so the
 * message can quote it (`got "2x"; must be a whole number ...`).
 *
 * @example
 * numberFromText("3");   // 3
 * numberFromText("1e3"); // 1000
 * numberFromText("abc"); // "abc"
 */
export function numberFromText(text: string): number | string {
  return /^\s*[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?\s*$/i.test(text) ? Number(text) : text;
}
