/**
 * A strict JSON reader (RFC 8259) for project files.
 *
 * `JSON.parse` keeps the last of two equal keys without a word, reports deep
 * nesting as a stack overflow, and names no line or field. This reader
 * gives the same values as `JSON.parse` for every text both accept, and
 * refuses instead: a key given twice in one object (naming its path), the
 * keys `__proto__`, `constructor` and `prototype`, and nesting deeper than
 * a limit. Every refusal names the line and column.
 *
 * It is a small recursive-descent reader over sticky regular expressions;
 * the recursion is bounded by the nesting limit, checked before it
 * descends.
 */
import { fail, ok, type Problem, type Result } from "../result/result.ts";
import { fieldPath, quoteText } from "./valueText.ts";

export interface JsonReadOptions {
  /** Deepest nesting of arrays and objects allowed. */
  readonly maxNesting: number;
  /** Keys refused anywhere in the text. */
  readonly forbiddenKeys?: ReadonlySet<string>;
  /** A character offset whose enclosing value's path `readJson` should report (see `JsonRead.pathAtLocate`). */
  readonly locate?: number;
}

export interface JsonRead {
  readonly value: unknown;
  /** The path of the innermost key or value holding `options.locate`, when one does. */
  readonly pathAtLocate?: string;
}

/** A refusal on the way; carries its problem out of the recursion. */
class Refusal {
  constructor(readonly problem: Problem) {}
}

const WHITESPACE = /[ \t\n\r]*/y;
const STRING = /"(?:[^"\\\u0000-\u001f]|\\(?:["\\/bfnrt]|u[0-9a-fA-F]{4}))*"/y;
const NUMBER = /-?(?:0|[1-9][0-9]*)(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?/y;
const LITERAL = /true|false|null/y;

/** Line and column (both from 1) of a character offset. */
export function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = text.indexOf("\n"); i !== -1 && i < offset; i = text.indexOf("\n", i + 1)) {
    line++;
    lineStart = i + 1;
  }
  return { line, column: offset - lineStart + 1 };
}

/**
 * Reads JSON text, or says where and why it is refused.
 *
 * @example
 * readJson('{"a": 1, "a": 2}', { maxNesting: 8 });
 * // fail({ path: "a", message: "appears twice in one object (at line 1, column 2 and again at line 1, column 10); keep one of them" })
 */
export function readJson(text: string, options: JsonReadOptions): Result<JsonRead, Problem> {
  let pos = 0;
  let pathAtLocate: string | undefined;
  const path: (string | number)[] = [];
  const forbidden = options.forbiddenKeys ?? new Set<string>();
  const locate = options.locate ?? -1;

  const where = (offset: number): string => {
    const { line, column } = lineColumn(text, offset);
    return `line ${line}, column ${column}`;
  };
  const found = (): string => (pos >= text.length ? "the end of the file" : quoteText(text.slice(pos, pos + 12), 12));
  const syntax = (expected: string): Refusal =>
    new Refusal({
      path: "",
      message: `not valid JSON: expected ${expected} at ${where(pos)}, found ${found()}; check for a missing comma, quote or bracket`,
    });
  const skipSpace = (): void => {
    WHITESPACE.lastIndex = pos;
    WHITESPACE.exec(text);
    pos = WHITESPACE.lastIndex;
  };
  const match = (re: RegExp): string | undefined => {
    re.lastIndex = pos;
    const m = re.exec(text);
    if (!m) return undefined;
    pos = re.lastIndex;
    return m[0];
  };
  const noteLocate = (start: number, end: number): void => {
    if (locate >= start && locate < end) pathAtLocate = fieldPath(path);
  };
  /** Reads a string token; a value string notes `locate` here, a key once it is on the path. */
  const readString = (isKey = false): string => {
    const start = pos;
    const token = match(STRING);
    if (token === undefined) {
      const bad = /[\u0000-\u001f]/.exec(text.slice(pos + 1, pos + 1 + 10_000));
      if (text[pos] === '"' && bad) {
        pos += 1 + bad.index;
        throw syntax("a character other than a raw control character inside the string (write it as \\n, \\t or \\u00XX)");
      }
      throw syntax("a complete string in double quotes");
    }
    if (!isKey) noteLocate(start, pos);
    return JSON.parse(token) as string;
  };

  const readValue = (depth: number): unknown => {
    skipSpace();
    const c = text[pos];
    if (c === "{" || c === "[") {
      if (depth >= options.maxNesting) {
        const inside = path.length > 0 ? `, inside ${fieldPath(path.slice(0, 3))}${path.length > 3 ? "…" : ""}` : "";
        throw new Refusal({
          path: "",
          message: `arrays and objects nest deeper than ${options.maxNesting} levels at ${where(pos)}${inside}; a project needs far fewer`,
        });
      }
      return c === "{" ? readObject(depth + 1) : readArray(depth + 1);
    }
    if (c === '"') return readString();
    const start = pos;
    const num = match(NUMBER);
    if (num !== undefined) {
      noteLocate(start, pos);
      return Number(num);
    }
    const lit = match(LITERAL);
    if (lit !== undefined) return lit === "true" ? true : lit === "false" ? false : null;
    throw syntax("a value (an object, array, string, number, true, false or null)");
  };

  const readObject = (depth: number): Record<string, unknown> => {
    pos++; // {
    const obj: Record<string, unknown> = {};
    const seenAt = new Map<string, number>();
    skipSpace();
    if (text[pos] === "}") {
      pos++;
      return obj;
    }
    for (;;) {
      skipSpace();
      if (text[pos] !== '"') throw syntax("a key in double quotes");
      const keyAt = pos;
      const key = readString(true);
      path.push(key);
      noteLocate(keyAt, pos);
      if (forbidden.has(key)) {
        throw new Refusal({
          path: fieldPath(path),
          message: `the key ${quoteText(key)} is not allowed anywhere in a project (${where(keyAt)}); remove it`,
        });
      }
      const first = seenAt.get(key);
      if (first !== undefined) {
        throw new Refusal({
          path: fieldPath(path),
          message: `appears twice in one object (at ${where(first)} and again at ${where(keyAt)}); keep one of them`,
        });
      }
      seenAt.set(key, keyAt);
      skipSpace();
      if (text[pos] !== ":") throw syntax('":" after the key');
      pos++;
      const value = readValue(depth);
      // A plain assignment would treat "__proto__" as the prototype; define it as data instead.
      Object.defineProperty(obj, key, { value, enumerable: true, writable: true, configurable: true });
      path.pop();
      skipSpace();
      if (text[pos] === ",") {
        pos++;
        continue;
      }
      if (text[pos] === "}") {
        pos++;
        return obj;
      }
      throw syntax('"," or "}" after a member of an object');
    }
  };

  const readArray = (depth: number): unknown[] => {
    pos++; // [
    const arr: unknown[] = [];
    skipSpace();
    if (text[pos] === "]") {
      pos++;
      return arr;
    }
    for (;;) {
      path.push(arr.length);
      arr.push(readValue(depth));
      path.pop();
      skipSpace();
      if (text[pos] === ",") {
        pos++;
        continue;
      }
      if (text[pos] === "]") {
        pos++;
        return arr;
      }
      throw syntax('"," or "]" after an item of an array');
    }
  };

  try {
    skipSpace();
    if (pos >= text.length) return fail({ path: "", message: "the file is empty; a project is a JSON object, {...}" });
    const value = readValue(0);
    skipSpace();
    if (pos < text.length) throw syntax("the end of the file after the top-level value");
    return ok(pathAtLocate === undefined ? { value } : { value, pathAtLocate });
  } catch (e) {
    if (e instanceof Refusal) return fail(e.problem);
    throw e;
  }
}
