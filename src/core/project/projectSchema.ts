/**
 * The loose file format `diodeloom/project@1`, checked once at the edge.
 *
 * `parseProject` turns JSON text into a complete, frozen `Project`, or into a
 * list of problems that each name a field path and say what would fix it.
 * Field-by-field documentation: docs/project-format.md.
 */
import * as v from "valibot";
import { builtinCell, builtinGlyphs, segmentsOfString } from "../glyphs/glyphs.ts";
import type { Cell, ElectricalModel, Project, SynthesisFields, SynthesisOptions } from "./project.ts";
import { PROJECT_SCHEMA } from "./project.ts";
import { fail, ok, type Problem, type Result } from "../result/result.ts";
import { shockleyVoltage, thermalVoltage } from "../circuit/physics.ts";

/** Largest project file accepted, bytes. */
export const MAX_PROJECT_BYTES = 1024 * 1024;

const MAX_STATES = 256;
const MAX_POSITIONS = 8;
const SEGMENT_NAME = /^[a-z][a-z0-9]{0,7}$/;
const FORBIDDEN_KEYS = new Set(["__proto__", "constructor", "prototype"]);

// ---------------------------------------------------------------- helpers

function strict<const E extends v.ObjectEntries>(entries: E) {
  const keys = Object.keys(entries).join(", ");
  return v.strictObject(entries, (issue) =>
    issue.expected === "never"
      ? `unknown key ${issue.received}; remove it (allowed here: ${keys})`
      : `must be an object with the keys ${keys}`,
  );
}

interface NumberRule {
  readonly min?: number;
  /** Strictly greater than this. */
  readonly above?: number;
  readonly max?: number;
  readonly integer?: boolean;
  readonly unit?: string;
}

function num(rule: NumberRule) {
  const unit = rule.unit ? ` ${rule.unit}` : "";
  const what = rule.integer ? "a whole number" : "a number";
  const low = rule.min !== undefined ? `at least ${rule.min}` : rule.above !== undefined ? `greater than ${rule.above}` : undefined;
  const high = rule.max !== undefined ? `at most ${rule.max}` : undefined;
  const range =
    rule.min !== undefined && rule.max !== undefined
      ? ` from ${rule.min} to ${rule.max}${unit}`
      : low && high
        ? ` ${low} and ${high}${unit}`
        : low || high
          ? ` ${low ?? high}${unit}`
          : unit;
  const message = `must be ${what}${range}`;
  return v.pipe(
    v.number(message),
    v.check((x) => Number.isFinite(x), message),
    v.check((x) => !rule.integer || Number.isInteger(x), message),
    v.check((x) => rule.min === undefined || x >= rule.min, message),
    v.check((x) => rule.above === undefined || x > rule.above, message),
    v.check((x) => rule.max === undefined || x <= rule.max, message),
  );
}

function oneOf<const T extends readonly string[]>(options: T) {
  return v.picklist(options, `must be one of ${options.map((o) => `"${o}"`).join(", ")}`);
}

const glyphValue = v.union(
  [v.string(), v.array(v.string("segment names must be strings"))],
  "must be a string of one-letter segment names or an array of segment names",
);

// ---------------------------------------------------------------- the schema

const electricalDefaults: ElectricalModel = {
  temperatureC: 27,
  counterOutput: { high: 2.4, low: 0, resistance: 1000 },
  diode: { is: 4e-9, n: 1.9, rs: 0, maxForwardA: 0.1, maxReverseV: 75 },
  pullDown: 100_000,
  driver: {
    is: 1e-14,
    betaF: 150,
    betaR: 3,
    emitterResistor: 10_000,
    emitterResistors: {},
    maxVceV: 300,
    maxPowerW: 0.5,
  },
  string: { dies: 19, is: 1e-27, n: 2, targetA: 0.00014, maxA: 0.015 },
  supply: { volts: 100, minVolts: 90, maxVolts: 110 },
  tolerance: { resistorPct: 5, betaMin: 80, betaMax: 300, temperatureC: [0, 50] },
};

/** Defaults of the `electrical` section (documented in docs/project-format.md). */
export const ELECTRICAL_DEFAULTS: ElectricalModel = electricalDefaults;

const d = electricalDefaults;

const ElectricalSchema = strict({
  temperatureC: v.optional(num({ min: -55, max: 150, unit: "°C" }), d.temperatureC),
  counterOutput: v.optional(
    strict({
      high: v.optional(num({ min: -1000, max: 1000, unit: "V" }), d.counterOutput.high),
      low: v.optional(num({ min: -1000, max: 1000, unit: "V" }), d.counterOutput.low),
      resistance: v.optional(num({ above: 0, unit: "Ω" }), d.counterOutput.resistance),
    }),
    d.counterOutput,
  ),
  diode: v.optional(
    strict({
      is: v.optional(num({ above: 0, max: 1, unit: "A" }), d.diode.is),
      n: v.optional(num({ above: 0, max: 10 }), d.diode.n),
      rs: v.optional(num({ min: 0, unit: "Ω" }), d.diode.rs),
      maxForwardA: v.optional(num({ above: 0, unit: "A" }), d.diode.maxForwardA),
      maxReverseV: v.optional(num({ above: 0, unit: "V" }), d.diode.maxReverseV),
    }),
    d.diode,
  ),
  pullDown: v.optional(num({ above: 0, unit: "Ω" }), d.pullDown),
  driver: v.optional(
    strict({
      is: v.optional(num({ above: 0, max: 1, unit: "A" }), d.driver.is),
      betaF: v.optional(num({ above: 0 }), d.driver.betaF),
      betaR: v.optional(num({ above: 0 }), d.driver.betaR),
      emitterResistor: v.optional(num({ above: 0, unit: "Ω" }), d.driver.emitterResistor),
      emitterResistors: v.optional(v.record(v.string(), num({ above: 0, unit: "Ω" }), "must map output names to ohms"), {}),
      maxVceV: v.optional(num({ above: 0, unit: "V" }), d.driver.maxVceV),
      maxPowerW: v.optional(num({ above: 0, unit: "W" }), d.driver.maxPowerW),
    }),
    d.driver,
  ),
  string: v.optional(
    strict({
      dies: v.optional(num({ min: 1, max: 200, integer: true }), d.string.dies),
      is: v.optional(num({ above: 0, max: 1, unit: "A" }), d.string.is),
      n: v.optional(num({ above: 0, max: 10 }), d.string.n),
      targetA: v.optional(num({ above: 0, unit: "A" }), d.string.targetA),
      maxA: v.optional(num({ above: 0, unit: "A" }), d.string.maxA),
    }),
    d.string,
  ),
  supply: v.optional(
    strict({
      volts: v.optional(num({ above: 0, max: 1000, unit: "V" }), d.supply.volts),
      minVolts: v.optional(num({ above: 0, max: 1000, unit: "V" }), d.supply.minVolts),
      maxVolts: v.optional(num({ above: 0, max: 1000, unit: "V" }), d.supply.maxVolts),
    }),
    d.supply,
  ),
  tolerance: v.optional(
    strict({
      resistorPct: v.optional(num({ min: 0, max: 50, unit: "%" }), d.tolerance.resistorPct),
      betaMin: v.optional(num({ above: 0 }), d.tolerance.betaMin),
      betaMax: v.optional(num({ above: 0 }), d.tolerance.betaMax),
      temperatureC: v.optional(
        v.tuple([num({ min: -55, max: 150, unit: "°C" }), num({ min: -55, max: 150, unit: "°C" })], "must be [low, high] in °C"),
        d.tolerance.temperatureC as [number, number],
      ),
    }),
    d.tolerance,
  ),
});

const SynthesisSchema = strict({
  maxDepth: v.optional(num({ min: 1, max: 3, integer: true }), 2),
  depth: v.optional(oneOf(["mixed", "per-segment", "uniform"] as const), "per-segment"),
  buses: v.optional(v.boolean("must be true or false"), true),
  links: v.optional(v.boolean("must be true or false"), true),
  timeLimitMs: v.optional(num({ min: 1, max: 3_600_000, integer: true, unit: "ms" }), 20_000),
  seed: v.optional(num({ min: 0, max: 2 ** 31 - 1, integer: true }), 1),
});

/** The file keeps `maxDepth` and `depth`; in code they are the depth limit and the depth policy. */
function synthesisOf(f: SynthesisFields): SynthesisOptions {
  return { depthLimit: f.maxDepth, policy: f.depth, buses: f.buses, links: f.links, timeLimitMs: f.timeLimitMs, seed: f.seed };
}

const ProjectSchema = strict({
  schema: v.literal(PROJECT_SCHEMA, `must be "${PROJECT_SCHEMA}"`),
  title: v.optional(v.pipe(v.string("must be a string"), v.maxLength(200, "must be at most 200 characters")), "Untitled"),
  counter: strict({
    states: num({ min: 2, max: MAX_STATES, integer: true }),
    drive: v.optional(v.literal("source", 'must be "source" (the active line is high)'), "source"),
  }),
  display: strict({
    positions: v.optional(num({ min: 1, max: MAX_POSITIONS, integer: true }), 1),
    cell: v.optional(oneOf(["seg7", "seg7dp", "custom"] as const), "seg7"),
    segments: v.optional(v.array(v.string("segment names must be strings"), "must be an array of segment names")),
  }),
  glyphs: v.optional(v.record(v.string(), glyphValue, "must map characters to lit segments"), {}),
  show: v.array(v.string("each state's text must be a string"), "must be an array with one text per state"),
  synthesis: v.optional(SynthesisSchema, {}),
  electrical: v.optional(ElectricalSchema, {}),
});

type LooseProject = v.InferOutput<typeof ProjectSchema>;

// ---------------------------------------------------------------- entry points

/**
 * Parses project JSON text.
 *
 * @example
 * const r = parseProject('{"schema":"diodeloom/project@1","counter":{"states":2},"display":{},"show":["0","1"]}');
 * if (r.ok) console.log(r.value.display.cell.segments); // ["a", ..., "g"]
 */
export function parseProject(text: string): Result<Project> {
  if (text.length > MAX_PROJECT_BYTES || new TextEncoder().encode(text).length > MAX_PROJECT_BYTES) {
    return fail([{ path: "", message: `the file is larger than 1 MiB (${MAX_PROJECT_BYTES} bytes); a project needs far less` }]);
  }
  const forbidden: string[] = [];
  let data: unknown;
  try {
    data = JSON.parse(text, function (key) {
      if (FORBIDDEN_KEYS.has(key)) forbidden.push(key);
      return arguments[1] as unknown;
    });
  } catch (e) {
    return fail([{ path: "", message: `not valid JSON (${(e as Error).message}); check for a missing comma, quote or bracket` }]);
  }
  if (forbidden.length > 0) {
    return fail([{ path: "", message: `the key "${forbidden[0]}" is not allowed anywhere in a project; remove it` }]);
  }
  return validateProject(data);
}

/** Validates an already-parsed value (for example from the web app's state). */
export function validateProject(data: unknown): Result<Project> {
  if (typeof data !== "object" || data === null || Array.isArray(data)) {
    return fail([{ path: "", message: `a project must be a JSON object with "schema": "${PROJECT_SCHEMA}"` }]);
  }
  const schemaField = (data as Record<string, unknown>)["schema"];
  if (schemaField !== PROJECT_SCHEMA) {
    return fail([{ path: "schema", message: `must be "${PROJECT_SCHEMA}" (found ${JSON.stringify(schemaField) ?? "nothing"})` }]);
  }
  const parsed = v.safeParse(ProjectSchema, data, { abortPipeEarly: true });
  if (!parsed.success) {
    return fail(parsed.issues.slice(0, 20).map((i) => ({ path: v.getDotPath(i) ?? "", message: i.message })));
  }
  return complete(parsed.output);
}

// ---------------------------------------------------------------- cross-field checks

function complete(p: LooseProject): Result<Project> {
  const problems: Problem[] = [];
  const cell = resolveCell(p, problems);
  if (!cell) return fail(problems);

  const glyphOverrides: Record<string, readonly string[]> = {};
  const glyphs: Record<string, readonly string[]> = builtinGlyphs(cell);
  for (const [ch, value] of Object.entries(p.glyphs)) {
    const path = `glyphs.${ch}`;
    if ([...ch].length !== 1) {
      problems.push({ path, message: "glyph keys must be single characters" });
      continue;
    }
    const names = typeof value === "string" ? stringSegments(value, cell) : [...value];
    const bad = names.filter((s) => !cell.segments.includes(s));
    if (bad.length > 0) {
      problems.push({
        path,
        message: `unknown segment ${bad.map((b) => `"${b}"`).join(", ")}; this cell has ${cell.segments.join(" ")}`,
      });
      continue;
    }
    if (new Set(names).size !== names.length) {
      problems.push({ path, message: "a segment is listed twice; list each lit segment once" });
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
      message: `has ${p.show.length} texts but counter.states is ${n}; give exactly one text per state`,
    });
  }
  p.show.forEach((text, k) => {
    const positions = splitText(text, cell);
    if (positions.length !== p.display.positions) {
      problems.push({
        path: `show[${k}]`,
        message: `"${text}" fills ${positions.length} position(s) but display.positions is ${p.display.positions}; pad with spaces for blanks`,
      });
      return;
    }
    for (const pos of positions) {
      if (!(pos.char in glyphs)) {
        problems.push({
          path: `show[${k}]`,
          message: `no glyph for "${pos.char}"; add it under glyphs, e.g. "glyphs": {"${pos.char}": "${cell.kind === "custom" ? (cell.segments[0] ?? "") : "abcdefg"}"}`,
        });
      }
    }
  });

  const e = p.electrical as ElectricalModel;
  checkElectrical(e, cell, p.display.positions, problems);
  if (problems.length > 0) return fail(problems);

  const project: Project = {
    schema: PROJECT_SCHEMA,
    title: p.title,
    counter: { states: n, drive: "source" },
    display: { positions: p.display.positions, cell },
    glyphs,
    glyphOverrides,
    show: [...p.show],
    synthesis: synthesisOf(p.synthesis as SynthesisFields),
    electrical: e,
  };
  return ok(deepFreeze(project));
}

function resolveCell(p: LooseProject, problems: Problem[]): Cell | undefined {
  const kind = p.display.cell;
  if (kind !== "custom") {
    if (p.display.segments !== undefined) {
      problems.push({
        path: "display.segments",
        message: `only a "custom" cell lists its segments; remove it or set display.cell to "custom"`,
      });
      return undefined;
    }
    return builtinCell(kind);
  }
  const segments = p.display.segments;
  if (!segments || segments.length === 0) {
    problems.push({
      path: "display.segments",
      message: 'a custom cell needs its segment names, e.g. ["tl", "tr", "ml", "c", "mr", "bl", "br"]',
    });
    return undefined;
  }
  if (segments.length > 32) {
    problems.push({ path: "display.segments", message: "a custom cell may have at most 32 segments" });
    return undefined;
  }
  segments.forEach((s, i) => {
    if (!SEGMENT_NAME.test(s)) {
      problems.push({
        path: `display.segments[${i}]`,
        message: `"${s}" is not a usable segment name; use 1-8 lower-case letters or digits, starting with a letter`,
      });
    }
  });
  if (new Set(segments).size !== segments.length) {
    problems.push({ path: "display.segments", message: "a segment name appears twice; names must be unique" });
  }
  return problems.length > 0 ? undefined : { kind: "custom", segments: [...segments] };
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

function checkElectrical(e: ElectricalModel, cell: Cell, positions: number, problems: Problem[]): void {
  const path = "electrical";
  const s = e.supply;
  if (!(s.minVolts <= s.volts && s.volts <= s.maxVolts)) {
    problems.push({
      path: `${path}.supply`,
      message: `needs minVolts <= volts <= maxVolts (got ${s.minVolts}, ${s.volts}, ${s.maxVolts})`,
    });
  }
  const vt = thermalVoltage(e.temperatureC);
  const stringV = e.string.dies * shockleyVoltage(e.string.targetA, e.string.is, e.string.n, vt);
  if (s.minVolts <= stringV) {
    problems.push({
      path: `${path}.supply.minVolts`,
      message: `${s.minVolts} V is below the ${stringV.toFixed(1)} V that ${e.string.dies} dies drop at the target current; raise the supply or use fewer dies`,
    });
  }
  if (e.counterOutput.high <= e.counterOutput.low) {
    problems.push({
      path: `${path}.counterOutput.high`,
      message: `must be above counterOutput.low (${e.counterOutput.low} V) for source drive`,
    });
  }
  if (e.tolerance.betaMin > e.tolerance.betaMax) {
    problems.push({ path: `${path}.tolerance.betaMin`, message: "must not exceed tolerance.betaMax" });
  }
  const [lo, hi] = e.tolerance.temperatureC;
  if (lo > hi) problems.push({ path: `${path}.tolerance.temperatureC`, message: "must be [low, high] with low <= high" });
  if (e.string.targetA > e.string.maxA) {
    problems.push({ path: `${path}.string.targetA`, message: `must not exceed string.maxA (${e.string.maxA} A)` });
  }
  for (const name of Object.keys(e.driver.emitterResistors)) {
    const m = /^(\d+)(.+)$/.exec(name);
    const pos = m ? Number(m[1]) : NaN;
    if (!m || !(pos >= 1 && pos <= positions) || !cell.segments.includes(m[2] ?? "")) {
      problems.push({
        path: `${path}.driver.emitterResistors.${name}`,
        message: `"${name}" is not an output of this display; outputs are named like "1${cell.segments[0] ?? "a"}"`,
      });
    }
  }
}

function deepFreeze<T>(value: T): T {
  if (typeof value === "object" && value !== null && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const child of Object.values(value)) deepFreeze(child);
  }
  return value;
}
