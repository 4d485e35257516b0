/**
 * The UTF-8 check agrees with the WHATWG Encoding Standard's decoder in its
 * fatal mode (`TextDecoder("utf-8", { fatal: true })`), which follows The
 * Unicode Standard's Table 3-7 (docs/sources.md, "Text formats of the
 * project file"): a byte array is reported well formed exactly when the
 * decoder accepts it, and when it is not, everything before the reported
 * offset is well formed while the sequence at the offset is not.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { firstInvalidUtf8 } from "../../src/core/project/projectBytes.ts";

const SEED = 3629;
const fatal = new TextDecoder("utf-8", { fatal: true, ignoreBOM: true });

function decodes(bytes: Uint8Array): boolean {
  try {
    fatal.decode(bytes);
    return true;
  } catch {
    return false;
  }
}

/** Bytes that are mostly text, with lead and continuation bytes mixed in to reach every branch. */
const mostlyText = fc
  .array(
    fc.oneof(
      fc.string({ unit: "binary", maxLength: 6 }).map((s) => [...new TextEncoder().encode(s)]),
      fc.array(fc.integer({ min: 0x80, max: 0xff }), { maxLength: 4 }),
      fc.array(fc.constantFrom(0xc0, 0xc1, 0xc2, 0xdf, 0xe0, 0xed, 0xef, 0xf0, 0xf4, 0xf5, 0x80, 0x8f, 0x90, 0x9f, 0xa0, 0xbf), {
        maxLength: 4,
      }),
    ),
    { maxLength: 12 },
  )
  .map((parts) => new Uint8Array(parts.flat()));

describe(`firstInvalidUtf8 against TextDecoder (fast-check seed ${SEED})`, () => {
  it("finds the first ill-formed sequence exactly where the decoder stops", () => {
    fc.assert(
      fc.property(fc.oneof(mostlyText, fc.uint8Array({ maxLength: 16 })), (bytes) => {
        const k = firstInvalidUtf8(bytes);
        expect(k === -1).toBe(decodes(bytes));
        if (k >= 0) {
          expect(decodes(bytes.subarray(0, k))).toBe(true);
          // No well-formed sequence (1 to 4 bytes) starts at k.
          for (let len = 1; len <= 4 && k + len <= bytes.length; len++) expect(decodes(bytes.subarray(k, k + len))).toBe(false);
        }
      }),
      { seed: SEED, numRuns: 5000 },
    );
  });
});
