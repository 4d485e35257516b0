/**
 * Values as a message shows them: short, quoted, and safe to print on a
 * terminal.
 *
 * A message echoes what it received so a person can find it, but a project
 * file is someone else's text: it may hold escape sequences that retitle or
 * clear a terminal, bidirectional controls that reorder what is shown, or a
 * megabyte on one line. Every echoed value passes through here: control and
 * format characters are written as `\uXXXX` escapes and long values are cut
 * to an excerpt that says how long the whole is.
 */

/** Longest excerpt of a text, in characters, before it is cut. */
export const EXCERPT_CHARS = 40;

/**
 * Characters never printed as they are: C0 and C1 controls, DEL, the line and
 * paragraph separators, the bidirectional marks, embeddings, overrides and
 * isolates, the byte-order mark, and lone surrogates.
 */
const UNSAFE =
  /[\u0000-\u001f\u007f-\u009f\u200e\u200f\u2028-\u202e\u2066-\u2069\ufeff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;

const SHORT_ESCAPES: Readonly<Record<string, string>> = { "\n": "\\n", "\r": "\\r", "\t": "\\t", '"': '\\"', "\\": "\\\\" };

function escapeChar(ch: string): string {
  return SHORT_ESCAPES[ch] ?? `\\u${ch.charCodeAt(0).toString(16).padStart(4, "0")}`;
}

/** True when the text holds a character that `quoteText` would escape (other than a quote or backslash). */
export function hasUnsafeText(text: string): boolean {
  UNSAFE.lastIndex = 0;
  return UNSAFE.test(text);
}

/**
 * The text in double quotes, escaped like a JSON string (plus the C1
 * controls and the format characters JSON leaves alone), cut after
 * `maxChars` characters with the full length noted.
 *
 * @example
 * quoteText("Lap\u001b[2J");     // "\"Lap\\u001b[2J\""
 * quoteText("x".repeat(1000), 5); // "\"xxxxx…\" (1000 characters)"
 */
export function quoteText(text: string, maxChars: number = EXCERPT_CHARS): string {
  const chars = [...text];
  const cut = chars.length > maxChars;
  const shown = cut ? chars.slice(0, maxChars).join("") : text;
  const body = shown.replace(/["\\]/g, escapeChar).replace(UNSAFE, escapeChar);
  return cut ? `"${body}…" (${chars.length} characters)` : `"${body}"`;
}

/**
 * A received value as a message names it: numbers and literals as written,
 * text quoted (see `quoteText`), arrays and objects by kind and size.
 *
 * @example
 * describeValue(7);        // "7"
 * describeValue(["bc"]);   // "an array of 1 item"
 * describeValue(undefined) // "nothing"
 */
export function describeValue(value: unknown): string {
  if (value === undefined) return "nothing";
  if (value === null) return "null";
  if (typeof value === "string") return quoteText(value);
  if (typeof value === "number") return Object.is(value, -0) ? "0" : String(value);
  if (typeof value === "boolean") return String(value);
  if (Array.isArray(value)) return `an array of ${value.length} item${value.length === 1 ? "" : "s"}`;
  if (typeof value === "object") {
    const keys = Object.keys(value);
    if (keys.length === 0) return "an empty object";
    const shown = keys.slice(0, 3).map((k) => quoteText(k, 16));
    return `an object with the key${keys.length === 1 ? "" : "s"} ${shown.join(", ")}${keys.length > 3 ? ", …" : ""}`;
  }
  return typeof value;
}

/** A key a path may show bare: `display`, `1a`, `7`. Anything else is quoted in brackets. */
const BARE_KEY = /^[A-Za-z0-9_-]{1,40}$/;

/**
 * The path of a field in one style: object keys joined by dots, array
 * indices in brackets, and keys that are not plain names quoted in brackets.
 *
 * @example
 * fieldPath(["show", 1]);                 // "show[1]"
 * fieldPath(["electrical", "driver"]);    // "electrical.driver"
 * fieldPath(["glyphs", "."]);             // "glyphs[\".\"]"
 */
export function fieldPath(segments: readonly (string | number)[]): string {
  let out = "";
  for (const s of segments) {
    if (typeof s === "number") out += `[${s}]`;
    else if (BARE_KEY.test(s)) out += out === "" ? s : `.${s}`;
    else out += `[${quoteText(s, 24)}]`;
  }
  return out;
}
