/**
 * The strict JSON reader agrees with the platform's `JSON.parse` (ECMA-262's
 * implementation of RFC 8259; docs/sources.md) on every text both accept,
 * and refuses what `JSON.parse` refuses.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { readJson } from "../../src/core/project/jsonText.ts";

const SEED = 8259;
const options = { maxNesting: 1000 };

/** JSON.parse, or undefined when it refuses the text. */
function platform(text: string): { value: unknown } | undefined {
  try {
    return { value: JSON.parse(text) as unknown };
  } catch {
    return undefined;
  }
}

describe(`readJson against JSON.parse (fast-check seed ${SEED})`, () => {
  it("reads every JSON text to the same value, in any layout", () => {
    fc.assert(
      fc.property(fc.jsonValue(), fc.constantFrom(undefined, 2, "\t"), (value, indent) => {
        const text = JSON.stringify(value, null, indent);
        const r = readJson(text, options);
        expect(r.ok).toBe(true);
        if (r.ok) expect(r.value.value).toStrictEqual(JSON.parse(text));
      }),
      { seed: SEED, numRuns: 1000 },
    );
  });

  it("agrees on arbitrary strings and mangled JSON: same value or both refuse", () => {
    const mangled = fc
      .tuple(fc.json(), fc.nat(), fc.constantFrom("", ",", "}", "]", '"', ":", "\\", "1", "-", "e", ".", " ", "\u0000", "tru", "[", "{"))
      .map(([t, i, s]) => t.slice(0, i % (t.length + 1)) + s + t.slice(i % (t.length + 1)));
    fc.assert(
      fc.property(fc.oneof(fc.string(), mangled, fc.json()), (text) => {
        const expected = platform(text);
        const r = readJson(text, options);
        if (expected === undefined) {
          expect(r.ok).toBe(false);
          if (!r.ok) expect(r.error.message).toMatch(/line \d+, column \d+|empty/);
        } else if (!r.ok && /appears twice/.test(r.error.message)) {
          expect(duplicateKeyAt(text, r.error.message)).toBe(true);
        } else {
          expect(r.ok).toBe(true);
          if (r.ok) expect(r.value.value).toStrictEqual(expected.value);
        }
      }),
      { seed: SEED, numRuns: 3000 },
    );
  });
});

/** Offset of a line and column (both from 1). */
function offsetOf(text: string, line: number, column: number): number {
  let offset = 0;
  for (let l = 1; l < line; l++) offset = text.indexOf("\n", offset) + 1;
  return offset + column - 1;
}

/**
 * Mangling may join two objects' members into one with a repeated key,
 * which the reader refuses on purpose. Checks the claim on its own: both
 * positions the message names hold the same key.
 */
function duplicateKeyAt(text: string, message: string): boolean {
  const m = /at line (\d+), column (\d+) and again at line (\d+), column (\d+)/.exec(message);
  if (!m) return false;
  const keyAt = (line: string, column: string): string | undefined => {
    const token = /^"(?:[^"\\]|\\.)*"/.exec(text.slice(offsetOf(text, Number(line), Number(column))));
    return token ? (JSON.parse(token[0]) as string) : undefined;
  };
  const first = keyAt(m[1] as string, m[2] as string);
  return first !== undefined && first === keyAt(m[3] as string, m[4] as string);
}
