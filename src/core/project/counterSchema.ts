/**
 * The `counter` section: how many states, and how the counter holds them
 * (`code`). Its field rules, and the checks across its fields that the field
 * rules cannot make (a Johnson counter's even length, a custom code table's
 * shape). Messages follow fieldRules.ts: what was received, then the fix.
 */
import * as v from "valibot";
import type { Problem } from "../result/result.ts";
import type { CounterCodeKind, CounterDrive, CounterSection } from "./project.ts";
import { choiceField, gotMessage, numberField, objectField } from "./fieldRules.ts";
import { LIMITS } from "./limits.ts";
import { describeValue, fieldPath, quoteText } from "./valueText.ts";

export const COUNTER_CODES: readonly CounterCodeKind[] = ["one-hot", "johnson", "binary", "custom"];

const { states: STATES, codeStages: STAGES } = LIMITS;
const BITS = /^[01]+$/;

/** The file's `counter` section. */
export const CounterSectionSchema = objectField(
  {
    states: numberField({ ...STATES, integer: true }),
    drive: v.optional(choiceField(["source", "sink", "complementary"] as const), "source"),
    code: v.optional(choiceField(["one-hot", "johnson", "binary", "custom"] as const), "one-hot"),
    codes: v.optional(
      v.array(
        v.string(gotMessage('must be a bit string such as "0110"')),
        gotMessage('must be an array of bit strings, e.g. ["00", "01", "11", "10"]'),
      ),
    ),
  },
  { states: `add "states": N, the number of counter states, a whole number from ${STATES.min} to ${STATES.max}` },
);

/** The section as the schema reads it. */
export interface LooseCounter {
  readonly states: number;
  readonly drive: CounterDrive;
  readonly code: CounterCodeKind;
  readonly codes?: readonly string[] | undefined;
}

/**
 * Checks the counter's code against its state count and returns the strict
 * section, or undefined after adding the problems found.
 *
 * @example
 * checkCounter({ states: 7, drive: "source", code: "johnson" }, problems);
 * // undefined; problems: [{ path: "counter.states", message: "got 7 with \"code\": \"johnson\"; ..." }]
 */
export function checkCounter(c: LooseCounter, problems: Problem[]): CounterSection | undefined {
  const before = problems.length;
  const n = c.states;
  if (c.code !== "custom" && c.codes !== undefined) {
    problems.push({
      path: "counter.codes",
      message: `got ${c.codes.length} codes but counter.code is "${c.code}"; only a "custom" code lists its codes; remove them or set counter.code to "custom"`,
    });
  }
  if (c.code === "johnson" && n % 2 !== 0) {
    problems.push({
      path: "counter.states",
      message: `got ${n} with "code": "johnson"; a Johnson counter of n stages has 2n states, so the number must be even (${n - 1} or ${n + 1}), or choose another code`,
    });
  }
  if (c.code === "custom") checkCodes(c.codes, n, problems);
  if (c.code !== "one-hot" && c.drive !== "source") {
    problems.push({
      path: "counter.drive",
      message: `got "${c.drive}" with "code": "${c.code}"; a coded counter already offers every stage line and its complement (Q and nQ), so its drive stays "source"; remove counter.drive or use a one-hot code`,
    });
  }
  if (problems.length > before) return undefined;
  return { states: n, drive: c.drive, code: c.code, codes: c.code === "custom" ? [...(c.codes ?? [])] : [] };
}

function checkCodes(codes: readonly string[] | undefined, n: number, problems: Problem[]): void {
  if (codes === undefined) {
    problems.push({
      path: "counter.codes",
      message: `missing; a "custom" code lists one bit string per state, the highest stage leftmost, e.g. ["00", "01", "11", "10"]`,
    });
    return;
  }
  if (codes.length !== n) {
    problems.push({
      path: "counter.codes",
      message: `got ${codes.length} codes but counter.states is ${n}; give exactly one code per state`,
    });
    return;
  }
  const first = codes[0] ?? "";
  const seen = new Map<string, number>();
  codes.forEach((code, k) => {
    const path = fieldPath(["counter", "codes", k]);
    if (!BITS.test(code)) {
      problems.push({ path, message: `got ${quoteText(code, 20)}; a code is a string of 0s and 1s, the highest stage leftmost` });
      return;
    }
    if (code.length < STAGES.min || code.length > STAGES.max) {
      problems.push({ path, message: `got ${code.length} stages; a custom code has ${STAGES.min} to ${STAGES.max} stages` });
      return;
    }
    if (code.length !== first.length) {
      problems.push({
        path,
        message: `got ${quoteText(code, 20)}, ${code.length} stages, but counter.codes[0] has ${first.length}; every code has the same number of stages`,
      });
      return;
    }
    const twin = seen.get(code);
    if (twin !== undefined) {
      problems.push({
        path,
        message: `got ${describeValue(code)}, the same code as counter.codes[${twin}]; every state needs a code of its own`,
      });
      return;
    }
    seen.set(code, k);
  });
}
