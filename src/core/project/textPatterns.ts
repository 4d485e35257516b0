/**
 * Per-state texts from a short counting pattern, such as `0-9`, `0-F`,
 * `1-12 with leading blank` or `00-59`.
 *
 * A pattern is one or more ranges separated by commas. A range counts in
 * decimal, or in hexadecimal when either end holds a letter A-F; hex digits
 * above 9 use the forms a seven-segment cell can show (A b C d E F). Each
 * number is right-aligned in the display's positions: a start written with a
 * leading zero (`00-59`), or the words `with leading zero(s)`, pad with
 * zeros; otherwise, or with `with leading blank(s)`, the unused positions on
 * the left stay blank. Any other words are refused, and named.
 */
import { fail, ok, type Result } from "../result/result.ts";
import { LIMITS } from "./limits.ts";
import { quoteText } from "./valueText.ts";

/** Most texts one pattern may produce (the schema's state limit). */
const MAX_TEXTS = LIMITS.states.max;
const HEX_FORMS = "0123456789AbCdEF";
const RANGE = /^([0-9a-f]+)\s*(?:-|\.\.|to)\s*([0-9a-f]+)$/i;
/** A range followed by more words, to name the words that are not understood. */
const RANGE_AND_MORE = /^([0-9a-f]+\s*(?:-|\.\.|to)\s*[0-9a-f]+)\s+(.+)$/i;
/** The words a pattern may end with. */
const SUFFIX_WORDS = '"with leading zeros" or "with leading blanks"';

type Padding = "blank" | "zero" | "auto";

/**
 * Expands a pattern into one text per state, each `positions` characters.
 *
 * @example
 * fillPattern("1-12 with leading blank", 2); // ok([" 1", " 2", ..., "12"])
 * fillPattern("00-59", 2);                   // ok(["00", "01", ..., "59"])
 */
export function fillPattern(pattern: string, positions: number): Result<string[]> {
  const path = "pattern";
  let body = pattern.trim();
  let padding: Padding = "auto";
  const suffix = /\s+with\s+(?:an?\s+)?leading\s+(blanks?|spaces?|zeros?|zeroes)$/i.exec(body);
  if (suffix) {
    padding = /^(blank|space)/i.test(suffix[1] ?? "") ? "blank" : "zero";
    body = body.slice(0, suffix.index).trim();
  }
  if (body === "") return fail([{ path, message: 'write a range such as "0-9", "1-12 with leading blank" or "00-59"' }]);

  const texts: string[] = [];
  for (const part of body.split(",")) {
    const range = RANGE.exec(part.trim());
    if (!range) {
      const more = RANGE_AND_MORE.exec(part.trim());
      if (more) {
        return fail([
          {
            path,
            message: `${quoteText(more[2] ?? "")} after ${quoteText(more[1] ?? "")} is not understood; a range may end with ${SUFFIX_WORDS}, nothing else`,
          },
        ]);
      }
      return fail([{ path, message: `${quoteText(part.trim())} is not a range; write it like "0-9", "0-F" or "00-59"` }]);
    }
    const [, startText = "", endText = ""] = range;
    const hex = /[a-f]/i.test(startText + endText);
    const base = hex ? 16 : 10;
    const start = parseInt(startText, base);
    const end = parseInt(endText, base);
    const zeros = padding === "zero" || (padding === "auto" && startText.length > 1 && startText.startsWith("0"));
    const step = end >= start ? 1 : -1;
    for (let k = start; ; k += step) {
      const digits = [...k.toString(base)].map((d) => HEX_FORMS[parseInt(d, base)] ?? d).join("");
      if (digits.length > positions) {
        return fail([
          {
            path,
            message: `${digits} needs ${digits.length} positions but the display has ${positions}; add positions or shorten the range`,
          },
        ]);
      }
      texts.push(digits.padStart(positions, zeros ? "0" : " "));
      if (texts.length > MAX_TEXTS)
        return fail([{ path, message: `gives more than ${MAX_TEXTS} texts; a counter has at most ${MAX_TEXTS} states` }]);
      if (k === end) break;
    }
  }
  if (texts.length < LIMITS.states.min) {
    return fail([{ path, message: `gives fewer than ${LIMITS.states.min} texts; a counter needs at least ${LIMITS.states.min} states` }]);
  }
  return ok(texts);
}
