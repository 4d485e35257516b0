/**
 * An instrument: several decoders in one project file, sharing one
 * `electrical` section (a clock's minutes, tens and hours; a scoreboard's
 * home and guest counts).
 *
 * The file is `diodeloom/project@2` with a `decoders` array in place of the
 * single-decoder keys:
 *
 * ```json
 * { "schema": "diodeloom/project@2", "title": "Wall clock",
 *   "electrical": { "preset": "bench-5v-switch" },
 *   "decoders": [ { "name": "minutes", "counter": {...}, "display": {...}, "show": [...] }, ... ] }
 * ```
 *
 * Each decoder holds what a single-decoder project holds (`counter`,
 * `display`, `glyphs`, `show`, `synthesis`) and may give its own
 * `electrical`, which is merged over the shared one key by key before the
 * section is completed (a per-output resistor map given replaces the shared
 * one whole, as it does over a preset). Every decoder then becomes a complete
 * `Project` through the one validator of single projects, so a decoder means
 * exactly what the same single-decoder file means. A file without `decoders`
 * (format 1 or 2) is an instrument of one decoder named `main`.
 * docs/project-format.md documents the format.
 */
import { fail, ok, type Problem, type Result } from "../result/result.ts";
import { LIMITS } from "./limits.ts";
import { PROJECT_SCHEMA, PROJECT_SCHEMA_V1, type Project } from "./project.ts";
import { decodeProjectBytes } from "./projectBytes.ts";
import { readProjectJson, validateProject } from "./projectSchema.ts";
import { electricalFields, serializeProject } from "./projectWriter.ts";
import { describeValue, fieldPath, hasUnsafeText, quoteText } from "./valueText.ts";

/** One decoder of an instrument: its name and the complete single-decoder project it is. */
export interface InstrumentDecoder {
  readonly name: string;
  /**
   * The decoder as a complete project: the shared `electrical` section with
   * the decoder's own merged over it, and the title `"<instrument title> -
   * <name>"` (a single-decoder file's project is the file's own, title and all).
   */
  readonly project: Project;
}

/** A project file as an instrument of one or more decoders. */
export interface Instrument {
  readonly title: string;
  /** In the file's order; at least one. */
  readonly decoders: readonly InstrumentDecoder[];
  /** True when the file had no `decoders` key (a single-decoder project, format 1 or 2). */
  readonly single: boolean;
}

/** The name of the one decoder of a single-decoder file. */
export const SINGLE_DECODER_NAME = "main";

/** The keys of an instrument file, and of one decoder in it. */
export const INSTRUMENT_KEYS = ["schema", "title", "electrical", "decoders"] as const;
export const DECODER_KEYS = ["name", "counter", "display", "glyphs", "show", "synthesis", "electrical"] as const;

/** Most problems reported at once, as for a single project. */
const MAX_PROBLEMS = 20;
/** Loose maps that a value given replaces whole instead of merging into (keyed by one decoder's output names). */
const REPLACED_WHOLE: ReadonlySet<string> = new Set(["driver.emitterResistors", "segment.seriesResistors"]);

/**
 * Parses project JSON text as an instrument: a `decoders` file, or a
 * single-decoder file as an instrument of one decoder.
 *
 * @example
 * const r = parseInstrument(text);
 * if (r.ok) for (const d of r.value.decoders) console.log(d.name, d.project.counter.states);
 */
export function parseInstrument(text: string): Result<Instrument> {
  const read = readProjectJson(text);
  return read.ok ? validateInstrument(read.value) : read;
}

/** Reads a project file's bytes as an instrument: `decodeProjectBytes`, then `parseInstrument`. */
export function parseInstrumentBytes(bytes: Uint8Array): Result<Instrument> {
  const text = decodeProjectBytes(bytes);
  return text.ok ? parseInstrument(text.value) : text;
}

function isPlainObject(x: unknown): x is Record<string, unknown> {
  return typeof x === "object" && x !== null && !Array.isArray(x);
}

/**
 * Validates an already-parsed value as an instrument. Problems inside a
 * decoder carry its index (`decoders[2].show[4]`); a problem of the shared
 * `electrical` section keeps its own path and names the decoder it showed in.
 */
export function validateInstrument(data: unknown): Result<Instrument> {
  if (!isPlainObject(data) || !("decoders" in data)) {
    const single = validateProject(data);
    if (!single.ok) return single;
    return ok(
      Object.freeze({
        title: single.value.title,
        decoders: Object.freeze([Object.freeze({ name: SINGLE_DECODER_NAME, project: single.value })]),
        single: true,
      }),
    );
  }
  const problems: Problem[] = [];
  const schema = data["schema"];
  if (schema !== PROJECT_SCHEMA) {
    const message =
      schema === undefined
        ? `missing; add "schema": "${PROJECT_SCHEMA}" (is this a diodeloom project?)`
        : schema === PROJECT_SCHEMA_V1
          ? `got "${PROJECT_SCHEMA_V1}"; a file with "decoders" is format 2: use "${PROJECT_SCHEMA}" (and format 2's electrical section)`
          : `got ${describeValue(schema)}; must be "${PROJECT_SCHEMA}"`;
    return fail([{ path: "schema", message }]);
  }
  for (const key of Object.keys(data)) {
    if ((INSTRUMENT_KEYS as readonly string[]).includes(key)) continue;
    const inside = (DECODER_KEYS as readonly string[]).includes(key);
    problems.push({
      path: fieldPath([key]),
      message: inside
        ? `a file with "decoders" gives "${key}" inside each decoder; move it into the decoders that use it`
        : `unknown key; remove it or check its spelling (allowed here: ${INSTRUMENT_KEYS.join(", ")})`,
    });
  }
  const title = titleOf(data["title"], problems);
  const shared = data["electrical"] ?? {};
  if (!isPlainObject(shared)) {
    problems.push({ path: "electrical", message: `got ${describeValue(shared)}; must be an object (the section every decoder shares)` });
  }
  const list = data["decoders"];
  if (!Array.isArray(list)) {
    problems.push({
      path: "decoders",
      message: `got ${describeValue(list)}; must be an array of decoders, each {"name": ..., "counter": ..., "display": ..., "show": ...}`,
    });
    return fail(problems);
  }
  const { min, max } = LIMITS.decoders;
  if (list.length < min || list.length > max) {
    problems.push({ path: "decoders", message: `got ${list.length} decoders; an instrument has ${min} to ${max}` });
    return fail(problems);
  }
  if (problems.length > 0) return fail(problems);

  const names = list.map((d, i) => nameOf(d, i, problems));
  const seen = new Map<string, number>();
  names.forEach((name, i) => {
    if (name === undefined) return;
    const key = name.trim().toLowerCase();
    const first = seen.get(key);
    if (first !== undefined) {
      problems.push({
        path: fieldPath(["decoders", i, "name"]),
        message: `${quoteText(name)} is also the name of decoders[${first}]; each decoder needs a name of its own (letter case aside)`,
      });
    } else seen.set(key, i);
  });

  const decoders: InstrumentDecoder[] = [];
  const sharedSeen = new Set<string>();
  list.forEach((d, i) => {
    const at = (p: string): string => (p === "" ? `decoders[${i}]` : `decoders[${i}].${p}`);
    if (!isPlainObject(d)) {
      problems.push({
        path: at(""),
        message: `got ${describeValue(d)}; a decoder is an object {"name": ..., "counter": ..., "display": ..., "show": ...}`,
      });
      return;
    }
    const own = d["electrical"];
    if (own !== undefined && !isPlainObject(own)) {
      problems.push({
        path: at("electrical"),
        message: `got ${describeValue(own)}; must be an object: the parts of the shared electrical section this decoder changes`,
      });
      return;
    }
    const doc: Record<string, unknown> = { schema: PROJECT_SCHEMA, title: "decoder" };
    for (const [key, value] of Object.entries(d)) {
      if (key === "name" || key === "electrical") continue;
      if (key === "schema" || key === "title") {
        problems.push({ path: at(key), message: `"${key}" belongs to the whole file, not to a decoder; remove it here` });
        continue;
      }
      doc[key] = value;
    }
    doc["electrical"] = isPlainObject(shared) ? mergeLoose(shared, own ?? {}, "") : (own ?? {});
    const r = validateProject(doc);
    const name = names[i];
    if (!r.ok) {
      for (const p of r.error) {
        const fromShared = p.path.startsWith("electrical") && !hasPath(own, p.path.slice("electrical".length));
        if (!fromShared) {
          problems.push({ path: at(p.path), message: p.message });
          continue;
        }
        const once = `${p.path}\u0000${p.message}`;
        if (sharedSeen.has(once)) continue;
        sharedSeen.add(once);
        problems.push({ path: p.path, message: `${p.message} (the shared section, as decoder ${quoteText(name ?? String(i))} uses it)` });
      }
      return;
    }
    if (name !== undefined) {
      decoders.push(Object.freeze({ name, project: Object.freeze({ ...r.value, title: `${title} - ${name}` }) }));
    }
  });
  if (problems.length > 0) return fail(problems.slice(0, MAX_PROBLEMS));
  return ok(Object.freeze({ title, decoders: Object.freeze(decoders), single: false }));
}

function titleOf(value: unknown, problems: Problem[]): string {
  if (value === undefined) return "Untitled";
  if (typeof value !== "string") {
    problems.push({ path: "title", message: `got ${describeValue(value)}; must be a string` });
    return "Untitled";
  }
  if (value.length > LIMITS.titleChars) {
    problems.push({ path: "title", message: `got ${value.length} characters; must be at most ${LIMITS.titleChars}` });
  } else if (/[\u0000-\u001f\u007f-\u009f]/.test(value)) {
    problems.push({
      path: "title",
      message: `got ${quoteText(value)}; must be printable text; remove the control characters (shown as \\u escapes)`,
    });
  }
  return value;
}

/** The decoder's name, or undefined (with a problem) when it has none fit to title its sheets. */
function nameOf(d: unknown, i: number, problems: Problem[]): string | undefined {
  if (!isPlainObject(d)) return undefined;
  const path = fieldPath(["decoders", i, "name"]);
  const value = d["name"];
  if (value === undefined) {
    problems.push({ path, message: `missing; add "name": a short name of the decoder, e.g. "minutes" (it titles the decoder's sheets)` });
    return undefined;
  }
  if (typeof value !== "string") {
    problems.push({ path, message: `got ${describeValue(value)}; must be a string` });
    return undefined;
  }
  if (value.trim() === "") {
    problems.push({ path, message: `got ${quoteText(value)}; a decoder's name needs a letter or digit` });
    return undefined;
  }
  if (value.length > LIMITS.decoderNameChars) {
    problems.push({ path, message: `got ${value.length} characters; must be at most ${LIMITS.decoderNameChars}` });
    return undefined;
  }
  if (hasUnsafeText(value) || value !== value.trim()) {
    problems.push({
      path,
      message: `got ${quoteText(value)}; must be printable text without control or direction characters and without spaces at its ends`,
    });
    return undefined;
  }
  return value;
}

/**
 * The loose `over` merged into the loose `base`: objects key by key, any
 * other value (a number, an array, null) and the per-output maps replacing
 * the base's whole. Keys are copied as data, so no key reaches a prototype.
 */
export function mergeLoose(
  base: Readonly<Record<string, unknown>>,
  over: Readonly<Record<string, unknown>>,
  at: string,
): Record<string, unknown> {
  const out = new Map(Object.entries(base));
  for (const [key, value] of Object.entries(over)) {
    const path = at === "" ? key : `${at}.${key}`;
    const below = out.get(key);
    out.set(key, isPlainObject(below) && isPlainObject(value) && !REPLACED_WHOLE.has(path) ? mergeLoose(below, value, path) : value);
  }
  // Object.fromEntries defines own data properties, even for a key "__proto__".
  return Object.fromEntries(out);
}

/** True when the loose value holds the key path `rest` (`.driver.kind`, `.segment.seriesResistors["1a"]`), or a value that is not an object on the way. */
function hasPath(value: unknown, rest: string): boolean {
  if (value === undefined) return false;
  const keys = [...rest.matchAll(/\.([A-Za-z0-9_-]+)|\[(\d+)\]|\["((?:[^"\\]|\\.)*)"\]/g)].map(
    (m) => m[1] ?? m[2] ?? JSON.parse(`"${m[3] ?? ""}"`),
  );
  let at: unknown = value;
  for (const key of keys) {
    if (!isPlainObject(at) && !Array.isArray(at)) return true;
    if (!(key in at)) return false;
    at = (at as Record<string, unknown>)[key];
  }
  return true;
}

/**
 * Writes an instrument back as project JSON. A single-decoder instrument is
 * written as `serializeProject` writes its project. Otherwise the shared
 * `electrical` section is the first decoder's, in full, and each decoder
 * gives only the parts where its own differs; every decoder's other keys are
 * spelled out as `serializeProject` spells them. It round-trips:
 * `parseInstrument(serializeInstrument(i))` gives an instrument equal to `i`.
 */
export function serializeInstrument(instrument: Instrument): string {
  const [first] = instrument.decoders;
  if (first === undefined) throw new RangeError("an instrument has at least one decoder");
  if (instrument.single && instrument.decoders.length === 1) return serializeProject(first.project);
  const shared = electricalFields(first.project.electrical) as unknown as Record<string, unknown>;
  const decoders = instrument.decoders.map((d) => {
    const { schema: _schema, title: _title, electrical, ...rest } = JSON.parse(serializeProject(d.project)) as Record<string, unknown>;
    const diff = looseDiff(shared, electrical as Record<string, unknown>, "");
    return { name: d.name, ...rest, ...(diff !== undefined ? { electrical: diff } : {}) };
  });
  return JSON.stringify({ schema: PROJECT_SCHEMA, title: instrument.title, electrical: shared, decoders }, null, 2) + "\n";
}

/** The parts of `own` that differ from `base`, as a loose section to merge over it; undefined when none differ. */
function looseDiff(base: Record<string, unknown>, own: Record<string, unknown>, at: string): Record<string, unknown> | undefined {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(own)) {
    const path = at === "" ? key : `${at}.${key}`;
    const b = base[key];
    if (isPlainObject(b) && isPlainObject(value) && !REPLACED_WHOLE.has(path)) {
      const d = looseDiff(b, value, path);
      if (d !== undefined) out[key] = d;
    } else if (JSON.stringify(b) !== JSON.stringify(value)) out[key] = value;
  }
  return Object.keys(out).length > 0 ? out : undefined;
}
