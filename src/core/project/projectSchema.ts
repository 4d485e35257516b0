/**
 * The loose file format `diodeloom/project@2` (and format 1, migrated),
 * checked once at the edge.
 *
 * `parseProject` turns JSON text into a complete, frozen `Project`, or into a
 * list of problems that each name a field path and say what would fix it.
 * A format-1 file differs only in its `electrical` section, which keeps its
 * meaning (electricalSchema.ts). Field-by-field documentation:
 * docs/project-format.md.
 */
import * as v from "valibot";
import { builtinCell, builtinGlyphs, segmentsOfString } from "../glyphs/glyphs.ts";
import type { Cell, ElectricalModel, Project, SynthesisFields } from "./project.ts";
import { PROJECT_SCHEMA, PROJECT_SCHEMA_V1 } from "./project.ts";
import { fail, ok, type Problem, type Result } from "../result/result.ts";
import {
  checkElectrical,
  electricalOf,
  electricalOfV1,
  ElectricalSectionSchema,
  ElectricalSectionSchemaV1,
  type LooseElectrical,
  type LooseElectricalV1,
} from "./electricalSchema.ts";
import { checkCounter, CounterSectionSchema } from "./counterSchema.ts";
import { checkPolarity } from "./polaritySchema.ts";
import { choiceField, gotMessage, issuePath, mapField, numberField, objectField, textField } from "./fieldRules.ts";
import { readJson } from "./jsonText.ts";
import { figureOf, FigureSectionSchema } from "./figureSchema.ts";
import { fileSizeProblem, LIMITS } from "./limits.ts";
import { SynthesisSectionSchema, synthesisOf } from "./synthesisSchema.ts";
import { describeValue, fieldPath, hasUnsafeText, quoteText } from "./valueText.ts";

/** Largest project file accepted, bytes (see `LIMITS.fileBytes`). */
export const MAX_PROJECT_BYTES = LIMITS.fileBytes;

export { ELECTRICAL_DEFAULTS } from "./electricalSchema.ts";

const SEGMENT_NAME = /^[a-z][a-z0-9]{0,7}$/;
const FORBIDDEN_KEYS: ReadonlySet<string> = new Set(["__proto__", "constructor", "prototype"]);
const { states: STATES, positions: POSITIONS } = LIMITS;

// ---------------------------------------------------------------- the schema

const glyphValue = v.union(
  [v.string(), v.array(v.string())],
  gotMessage('must be a string of one-letter segment names ("abc") or an array of segment names (["tl", "c"])'),
);

/** The project object of one format; the formats differ in the schema name and the `electrical` section. */
const projectSchemaFor = <S extends string, E extends v.GenericSchema>(schema: S, electrical: E) =>
  objectField(
    {
      schema: v.literal(schema, gotMessage(`must be "${schema}"`)),
      title: v.optional(textField(LIMITS.titleChars), "Untitled"),
      counter: CounterSectionSchema,
      display: objectField({
        positions: v.optional(numberField({ ...POSITIONS, integer: true }), 1),
        cell: v.optional(choiceField(["seg7", "seg7dp", "custom"] as const), "seg7"),
        segments: v.optional(v.array(v.string(gotMessage("must be a segment name")), gotMessage("must be an array of segment names"))),
        figure: v.optional(FigureSectionSchema),
      }),
      glyphs: v.optional(mapField(glyphValue, 'must be an object mapping each character to its lit segments, e.g. {"7": "abcf"}'), {}),
      show: v.array(v.string(gotMessage("must be the text of one state")), gotMessage("must be an array with one text per state")),
      synthesis: v.optional(SynthesisSectionSchema, {}),
      electrical: v.optional(electrical, {}),
    },
    {
      schema: `add "schema": "${PROJECT_SCHEMA}"`,
      counter: `add "counter": {"states": N}, N the number of counter states (${STATES.min} to ${STATES.max})`,
      display: `add "display": {"positions": D, "cell": "seg7"}, or "display": {} for one seven-segment position`,
      show: 'add "show": an array with one text per counter state, e.g. ["0", "1", "2"]',
    },
  );

const ProjectSchema = projectSchemaFor(PROJECT_SCHEMA, ElectricalSectionSchema);
const ProjectSchemaV1 = projectSchemaFor(PROJECT_SCHEMA_V1, ElectricalSectionSchemaV1);

type LooseProject = Omit<v.InferOutput<typeof ProjectSchema>, "schema" | "electrical">;

// ---------------------------------------------------------------- entry points

/**
 * Parses project JSON text.
 *
 * @example
 * const r = parseProject('{"schema":"diodeloom/project@1","counter":{"states":2},"display":{},"show":["0","1"]}');
 * if (r.ok) console.log(r.value.display.cell.segments); // ["a", ..., "g"]
 */
export function parseProject(text: string): Result<Project> {
  const read = readProjectJson(text);
  return read.ok ? validateProject(read.value) : read;
}

/**
 * Reads a project file's JSON text within the file limits (size, nesting, no prototype keys), before any
 * field is checked; the one reader of single projects and instruments.
 */
export function readProjectJson(text: string): Result<unknown> {
  // A leading byte-order mark is accepted, as in a file (see projectBytes.ts).
  const body = text.startsWith("\uFEFF") ? text.slice(1) : text;
  const size = body.length > MAX_PROJECT_BYTES ? body.length * 3 : new TextEncoder().encode(body).length;
  const tooLarge = fileSizeProblem(size);
  if (tooLarge) return fail([tooLarge]);
  const read = readJson(body, { maxNesting: LIMITS.nesting, forbiddenKeys: FORBIDDEN_KEYS });
  if (!read.ok) return fail([read.error]);
  return ok(read.value.value);
}

/** Most problems reported at once; the rest usually follow from the first ones. */
const MAX_PROBLEMS = 20;

/** Validates an already-parsed value (for example from the web app's state). */
export function validateProject(data: unknown): Result<Project> {
  if (typeof data !== "object" || data === null || Array.isArray(data)) {
    return fail([{ path: "", message: `got ${describeValue(data)}; a project must be a JSON object with "schema": "${PROJECT_SCHEMA}"` }]);
  }
  const schemaField = (data as Record<string, unknown>)["schema"];
  if (schemaField !== PROJECT_SCHEMA && schemaField !== PROJECT_SCHEMA_V1) {
    const message =
      schemaField === undefined
        ? `missing; add "schema": "${PROJECT_SCHEMA}" (is this a diodeloom project?)`
        : `got ${describeValue(schemaField)}; must be "${PROJECT_SCHEMA}" (or "${PROJECT_SCHEMA_V1}", the first format)`;
    return fail([{ path: "schema", message }]);
  }
  if ("decoders" in data) {
    return fail([
      {
        path: "decoders",
        message:
          "this file holds an instrument of several decoders; read it as an instrument (parseInstrument; the command line and the app do), or take one decoder out into a file of its own",
      },
    ]);
  }
  const issues = (i: readonly v.BaseIssue<unknown>[]) =>
    fail(i.slice(0, MAX_PROBLEMS).map((x) => ({ path: issuePath(x), message: x.message })));
  if (schemaField === PROJECT_SCHEMA_V1) {
    const parsed = v.safeParse(ProjectSchemaV1, data, { abortPipeEarly: true });
    if (!parsed.success) return issues(parsed.issues);
    return complete(parsed.output, electricalOfV1(parsed.output.electrical as LooseElectricalV1), true);
  }
  const parsed = v.safeParse(ProjectSchema, data, { abortPipeEarly: true });
  if (!parsed.success) return issues(parsed.issues);
  return complete(parsed.output, electricalOf(parsed.output.electrical as LooseElectrical), false);
}

/** A problem of a migrated format-1 file, with the names that file uses (`string.dies`, not `segment.leds`). */
function inFormat1(p: Problem): Problem {
  const rename = (t: string): string =>
    t
      .replace(/segment\.leds/g, "string.dies")
      .replace(/segment\./g, "string.")
      .replace(/(\d+) LEDs?\b/g, "$1 dies")
      .replace(/fewer LEDs in each segment/g, "fewer dies");
  return { path: rename(p.path), message: rename(p.message) };
}

// ---------------------------------------------------------------- cross-field checks

function complete(p: LooseProject, e: ElectricalModel, format1: boolean): Result<Project> {
  const problems: Problem[] = [];
  const cell = resolveCell(p, problems);
  if (!cell) return fail(problems);

  const glyphOverrides: Record<string, readonly string[]> = {};
  const glyphs: Record<string, readonly string[]> = builtinGlyphs(cell);
  for (const [ch, value] of Object.entries(p.glyphs)) {
    const path = fieldPath(["glyphs", ch]);
    if ([...ch].length !== 1) {
      problems.push({ path, message: `the key is ${[...ch].length} characters; a glyph key is one character` });
      continue;
    }
    if (hasUnsafeText(ch)) {
      problems.push({ path, message: "the key is a control character; a glyph key is a character a text can show" });
      continue;
    }
    const names = typeof value === "string" ? stringSegments(value, cell) : [...value];
    const bad = names.filter((s) => !cell.segments.includes(s));
    if (bad.length > 0) {
      problems.push({
        path,
        message: `got ${describeValue(value)}; unknown segment ${bad
          .slice(0, 3)
          .map((b) => quoteText(b, 12))
          .join(", ")}${bad.length > 3 ? ", …" : ""}; this cell has ${cell.segments.join(" ")}`,
      });
      continue;
    }
    if (new Set(names).size !== names.length) {
      problems.push({ path, message: `got ${describeValue(value)}; a segment is listed twice; list each lit segment once` });
      continue;
    }
    const ordered = cell.segments.filter((s) => names.includes(s));
    glyphOverrides[ch] = ordered;
    glyphs[ch] = ordered;
  }

  const n = p.counter.states;
  if (p.show.length !== n) {
    problems.push({
      path: "show",
      message: `got ${p.show.length} texts but counter.states is ${n}; give exactly one text per state`,
    });
  }
  p.show.slice(0, STATES.max).forEach((text, k) => {
    const path = fieldPath(["show", k]);
    if (hasUnsafeText(text)) {
      problems.push({ path, message: `got ${quoteText(text)}; a text holds control characters, which no display shows; remove them` });
      return;
    }
    const positions = splitText(text, cell);
    if (positions.length !== p.display.positions) {
      problems.push({
        path,
        message: `got ${quoteText(text)}, which fills ${positions.length} position(s) but display.positions is ${p.display.positions}; pad with spaces for blanks`,
      });
      return;
    }
    for (const pos of positions) {
      if (!(pos.char in glyphs)) {
        const example = cell.kind === "custom" ? (cell.segments[0] ?? "") : "abcdefg";
        problems.push({
          path,
          message: `got ${quoteText(text)}; no glyph for ${quoteText(pos.char)}; add it under glyphs, e.g. "glyphs": {${JSON.stringify(pos.char)}: "${example}"}`,
        });
      }
    }
  });

  const counter = checkCounter(p.counter, problems);
  const synthesis = synthesisOf(p.synthesis as SynthesisFields);
  if (format1 && p.counter.drive !== "source") {
    problems.push({
      path: "counter.drive",
      message: `got "${p.counter.drive}"; format 1 knows only "source" drive; use "schema": "${PROJECT_SCHEMA}" for active-low lines`,
    });
  } else if (counter !== undefined) checkPolarity(counter, synthesis, e, problems);
  const electrical: Problem[] = [];
  checkElectrical(e, cell, p.display.positions, electrical);
  problems.push(...(format1 ? electrical.map(inFormat1) : electrical));
  if (problems.length > 0 || counter === undefined) return fail(problems.slice(0, MAX_PROBLEMS));

  const project: Project = {
    schema: PROJECT_SCHEMA,
    title: p.title,
    counter,
    display: { positions: p.display.positions, cell },
    glyphs,
    glyphOverrides,
    show: [...p.show],
    synthesis,
    electrical: e,
  };
  return ok(deepFreeze(project));
}

function resolveCell(p: LooseProject, problems: Problem[]): Cell | undefined {
  const kind = p.display.cell;
  if (kind !== "custom") {
    if (p.display.figure !== undefined) {
      problems.push({
        path: "display.figure",
        message: `a "${kind}" cell is drawn as it is; only a "custom" cell gives a figure; remove it or set display.cell to "custom"`,
      });
      return undefined;
    }
    if (p.display.segments !== undefined) {
      problems.push({
        path: "display.segments",
        message: `got ${describeValue(p.display.segments)} for a "${kind}" cell; only a "custom" cell lists its segments; remove it or set display.cell to "custom"`,
      });
      return undefined;
    }
    return builtinCell(kind);
  }
  const segments = p.display.segments;
  if (!segments || segments.length === 0) {
    problems.push({
      path: "display.segments",
      message: `${segments ? "got an empty array" : "missing"}; a custom cell needs its segment names, e.g. ["tl", "tr", "ml", "c", "mr", "bl", "br"]`,
    });
    return undefined;
  }
  if (segments.length > LIMITS.customSegments) {
    problems.push({
      path: "display.segments",
      message: `got ${segments.length} names; a custom cell may have at most ${LIMITS.customSegments} segments`,
    });
    return undefined;
  }
  segments.forEach((s, i) => {
    if (!SEGMENT_NAME.test(s)) {
      problems.push({
        path: fieldPath(["display", "segments", i]),
        message: `got ${quoteText(s, 12)}; a segment name is 1-8 lower-case letters or digits, starting with a letter`,
      });
    }
  });
  if (new Set(segments).size !== segments.length) {
    const twice = segments.find((s, i) => segments.indexOf(s) !== i) ?? "";
    problems.push({ path: "display.segments", message: `${quoteText(twice, 12)} appears twice; names must be unique` });
  }
  if (problems.length > 0) return undefined;
  if (p.display.figure === undefined) return { kind: "custom", segments: [...segments] };
  const figure = figureOf(p.display.figure, segments, problems);
  return figure ? { kind: "custom", segments: [...segments], figure } : undefined;
}

/** A string glyph value lists one-letter segment names; `.` stands for `dp`. */
function stringSegments(value: string, cell: Cell): string[] {
  return cell.kind === "custom" ? [...value] : segmentsOfString(value);
}

/** One display position of a text: the glyph character, and whether its decimal point is lit. */
export interface TextPosition {
  readonly char: string;
  readonly dp: boolean;
}

/**
 * Splits a state's text into display positions. On a `seg7dp` cell a `.`
 * after another character lights that position's decimal point.
 */
export function splitText(text: string, cell: Cell): TextPosition[] {
  const chars = [...text];
  const out: TextPosition[] = [];
  for (const ch of chars) {
    const last = out[out.length - 1];
    if (cell.kind === "seg7dp" && ch === "." && last && !last.dp && last.char !== ".") {
      out[out.length - 1] = { char: last.char, dp: true };
    } else {
      out.push({ char: ch, dp: false });
    }
  }
  return out;
}

function deepFreeze<T>(value: T): T {
  if (typeof value === "object" && value !== null && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const child of Object.values(value)) deepFreeze(child);
  }
  return value;
}
