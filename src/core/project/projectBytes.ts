/**
 * A project file as bytes, turned into text: the first step of reading a
 * file, shared by the command line and the app's Open.
 *
 * The file must be UTF-8 (docs/project-format.md). A leading UTF-8
 * byte-order mark is accepted and dropped, as editors on some systems write
 * one; a UTF-16 byte-order mark is named. Bytes that are not UTF-8 are
 * refused with the field they sit in, instead of being read as U+FFFD and
 * exported that way.
 */
import { fail, type Problem, type Result } from "../result/result.ts";
import { readJson } from "./jsonText.ts";
import { fileSizeProblem, LIMITS } from "./limits.ts";
import type { Project } from "./project.ts";
import { parseProject } from "./projectSchema.ts";

const UTF8_BOM = [0xef, 0xbb, 0xbf];

/**
 * The offset of the first byte that does not begin a well-formed UTF-8
 * sequence, or -1 when all of them are well formed (The Unicode Standard,
 * Table 3-7 "Well-Formed UTF-8 Byte Sequences"; docs/sources.md).
 *
 * @example
 * firstInvalidUtf8(new Uint8Array([0x41, 0xc3, 0x28])); // 1
 */
export function firstInvalidUtf8(bytes: Uint8Array): number {
  const n = bytes.length;
  const inRange = (i: number, lo: number, hi: number): boolean => i < n && (bytes[i] as number) >= lo && (bytes[i] as number) <= hi;
  let i = 0;
  while (i < n) {
    const b = bytes[i] as number;
    let len: number;
    if (b <= 0x7f) len = 1;
    else if (b >= 0xc2 && b <= 0xdf) len = inRange(i + 1, 0x80, 0xbf) ? 2 : 0;
    else if (b >= 0xe0 && b <= 0xef) {
      const lo = b === 0xe0 ? 0xa0 : 0x80;
      const hi = b === 0xed ? 0x9f : 0xbf;
      len = inRange(i + 1, lo, hi) && inRange(i + 2, 0x80, 0xbf) ? 3 : 0;
    } else if (b >= 0xf0 && b <= 0xf4) {
      const lo = b === 0xf0 ? 0x90 : 0x80;
      const hi = b === 0xf4 ? 0x8f : 0xbf;
      len = inRange(i + 1, lo, hi) && inRange(i + 2, 0x80, 0xbf) && inRange(i + 3, 0x80, 0xbf) ? 4 : 0;
    } else len = 0;
    if (len === 0) return i;
    i += len;
  }
  return -1;
}

function hexByte(b: number): string {
  return `0x${b.toString(16).toUpperCase().padStart(2, "0")}`;
}

/**
 * Decodes the bytes of a project file, or says why they are not a project's
 * text: too large, UTF-16, or not UTF-8 (with the field that holds the bad
 * bytes when the rest of the file can be read).
 *
 * @example
 * decodeProjectBytes(new TextEncoder().encode("\uFEFF{}")); // ok("{}")
 */
export function decodeProjectBytes(bytes: Uint8Array): Result<string> {
  const size = fileSizeProblem(bytes.length);
  if (size) return fail([size]);
  if ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff)) {
    return fail([{ path: "", message: "the file is UTF-16 (it starts with a UTF-16 byte-order mark); save it as UTF-8" }]);
  }
  const start = UTF8_BOM.every((b, i) => bytes[i] === b) ? 3 : 0;
  const body = bytes.subarray(start);
  const bad = firstInvalidUtf8(body);
  const decoder = new TextDecoder("utf-8", { ignoreBOM: true });
  if (bad < 0) return { ok: true, value: decoder.decode(body) };
  // Find the field that holds the bad bytes: read the text with them replaced, noting that spot.
  const lossy = decoder.decode(body);
  const at = decoder.decode(body.subarray(0, bad)).length;
  const read = readJson(lossy, { maxNesting: LIMITS.nesting, locate: at });
  const lines = lossy.slice(0, at).split("\n");
  const where = `line ${lines.length}, column ${(lines[lines.length - 1] ?? "").length + 1}`;
  const problem: Problem = {
    path: read.ok ? (read.value.pathAtLocate ?? "") : "",
    message: `holds a byte that is not UTF-8 (${hexByte(body[bad] ?? 0)} at byte ${start + bad}, ${where}); save the file as UTF-8, or retype the text there`,
  };
  return fail([problem]);
}

/**
 * Reads a project file from its bytes: `decodeProjectBytes`, then
 * `parseProject`.
 *
 * @example
 * const r = parseProjectBytes(await readFile("die-roller.json"));
 */
export function parseProjectBytes(bytes: Uint8Array): Result<Project> {
  const text = decodeProjectBytes(bytes);
  return text.ok ? parseProject(text.value) : text;
}
