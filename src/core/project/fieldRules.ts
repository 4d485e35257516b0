/**
 * The building blocks of the project schema, each with the message it gives.
 *
 * Every message says what was received and what would fix it, in the form
 * `got 7; must be a whole number from 1 to 3`; the path in front of it
 * (`synthesis.maxDepth: ...`) comes from `issuePath`. Values are echoed
 * through `describeValue`, so they are short and safe to print.
 */
import * as v from "valibot";
import { describeValue, fieldPath } from "./valueText.ts";

/** A message function that names the received value, then the rule. */
export function gotMessage(rule: string): (issue: v.BaseIssue<unknown>) => string {
  return (issue) => `got ${describeValue(issue.input)}; ${rule}`;
}

/** The path of an issue, in the one style of `fieldPath` (`show[1]`, `electrical.driver.is`). */
export function issuePath(issue: v.BaseIssue<unknown>): string {
  return fieldPath((issue.path ?? []).map((p) => (typeof p.key === "number" ? p.key : String(p.key))));
}

/** A range rule for a number. */
export interface NumberRule {
  /** Smallest allowed value (inclusive). */
  readonly min?: number;
  /** The value must be strictly greater than this. */
  readonly above?: number;
  /** Largest allowed value (inclusive). */
  readonly max?: number;
  readonly integer?: boolean;
  /** Unit shown after the range, e.g. `V`, `Ω`. */
  readonly unit?: string;
}

/** A bound as the rule states it: very large and very small bounds of real-valued fields in exponent form (`1e7`, `1e-18`). */
function boundText(x: number, integer: boolean | undefined): string {
  const abs = Math.abs(x);
  if (integer || x === 0 || (abs >= 1e-3 && abs < 1e6)) return String(x);
  return x.toExponential().replace("e+", "e");
}

/** The rule in words: `must be a whole number from 1 to 3`, `must be a number from 1e-6 to 10 A`. */
export function numberRuleText(rule: NumberRule): string {
  const b = (x: number): string => boundText(x, rule.integer);
  const unit = rule.unit ? ` ${rule.unit}` : "";
  const what = rule.integer ? "a whole number" : "a number";
  const low = rule.min !== undefined ? `at least ${b(rule.min)}` : rule.above !== undefined ? `greater than ${b(rule.above)}` : undefined;
  const high = rule.max !== undefined ? `at most ${b(rule.max)}` : undefined;
  const range =
    rule.min !== undefined && rule.max !== undefined
      ? ` from ${b(rule.min)} to ${b(rule.max)}${unit}`
      : low && high
        ? ` ${low} and ${high}${unit}`
        : low || high
          ? ` ${low ?? high}${unit}`
          : unit;
  return `must be ${what}${range}`;
}

/** True when `x` meets the rule (finite, whole if asked, in range). */
export function meetsNumberRule(x: number, rule: NumberRule): boolean {
  return (
    Number.isFinite(x) &&
    (!rule.integer || Number.isInteger(x)) &&
    (rule.min === undefined || x >= rule.min) &&
    (rule.above === undefined || x > rule.above) &&
    (rule.max === undefined || x <= rule.max)
  );
}

/** A finite number in a range. */
export function numberField(rule: NumberRule) {
  const message = gotMessage(numberRuleText(rule));
  return v.pipe(
    v.number(message),
    v.check((x) => meetsNumberRule(x, rule), message),
  );
}

/** One of a fixed list of strings. */
export function choiceField<const T extends readonly string[]>(options: T) {
  return v.picklist(options, gotMessage(`must be one of ${options.map((o) => `"${o}"`).join(", ")}`));
}

export function booleanField() {
  return v.boolean(gotMessage("must be true or false"));
}

/** A control character, DEL or C1 control: never part of a printable text. */
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;

/** Text of at most `maxChars` UTF-16 code units, without control characters. */
export function textField(maxChars: number) {
  return v.pipe(
    v.string(gotMessage("must be a string")),
    v.maxLength(maxChars, (issue) => `got ${(issue.input as string).length} characters; must be at most ${maxChars}`),
    v.check((s) => !CONTROL.test(s), gotMessage("must be printable text; remove the control characters (shown as \\u escapes)")),
  );
}

/** True for `{...}` written in JSON: not an array, not null. */
function isPlainObject(x: unknown): x is object {
  return typeof x === "object" && x !== null && !Array.isArray(x);
}

/** What to write for a required key that is missing, e.g. `add "states": N, a whole number from 2 to 256`. */
export type MissingHints = Readonly<Record<string, string>>;

/**
 * An object with exactly the given keys. A missing required key says what
 * to add (from `hints`); an unknown key is named by its path and the message
 * lists the allowed ones; an array, text or number in its place is refused.
 */
export function objectField<const E extends v.ObjectEntries>(entries: E, hints: MissingHints = {}) {
  const keys = Object.keys(entries).join(", ");
  const shape = `must be an object with the keys ${keys}`;
  return v.pipe(
    v.custom<object>(isPlainObject, gotMessage(shape)),
    v.strictObject(entries, (issue) => {
      if (issue.expected === "never") return `unknown key; remove it or check its spelling (allowed here: ${keys})`;
      if (issue.input === undefined && issue.expected?.startsWith('"')) {
        const key = issue.expected.slice(1, -1);
        return `missing; ${hints[key] ?? `add "${key}"`}`;
      }
      return gotMessage(shape)(issue);
    }),
  );
}

/** An object mapping free keys to values of one schema (an array in its place is refused). */
export function mapField<const S extends v.GenericSchema>(value: S, shape: string) {
  return v.pipe(v.custom<object>(isPlainObject, gotMessage(shape)), v.record(v.string(), value, gotMessage(shape)));
}
