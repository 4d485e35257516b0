/**
 * The optional `display.figure` of a custom cell: a small coordinate box
 * and each segment's position and shape in it (a dot, a bar or a polyline),
 * so a die face, a bar graph or an arrow looks like itself in the glyph
 * editor, the state list and the drawing's glyph key.
 *
 * ```json
 * "figure": { "box": [30, 30], "shapes": { "c": { "dot": [15, 15] }, "bar1": { "bar": [[2, 28], [28, 28]], "width": 3 } } }
 * ```
 *
 * The box's structure is checked by the schema; each shape is checked here,
 * with messages that name the segment and say what would fix it.
 */
import * as v from "valibot";
import type { Problem } from "../result/result.ts";
import type { CellFigure, FigurePoint, SegmentShape } from "./project.ts";
import { gotMessage, mapField, numberField, numberRuleText, objectField } from "./fieldRules.ts";
import { describeValue, fieldPath, quoteText } from "./valueText.ts";

/** The box's sides, in its own units. */
export const FIGURE_BOX = { min: 1, max: 1000 } as const;
/** Most points of a polyline. */
export const POLYLINE_POINTS = { min: 2, max: 16 } as const;
/** A dot's radius, and a bar's or polyline's width, when the file gives none: shares of the box's smaller side. */
export const FIGURE_DEFAULTS = { dotRadius: 0.08, strokeWidth: 0.1 } as const;

const side = numberField({ ...FIGURE_BOX });

/** `display.figure` as the file writes it. */
export const FigureSectionSchema = objectField(
  {
    box: v.strictTuple([side, side], gotMessage(`must be [width, height], two numbers from ${FIGURE_BOX.min} to ${FIGURE_BOX.max}`)),
    shapes: mapField(v.unknown(), 'must be an object giving each segment its shape, e.g. {"c": {"dot": [15, 15]}}'),
  },
  {
    box: `add "box": [width, height], the size of the coordinate box (${FIGURE_BOX.min} to ${FIGURE_BOX.max})`,
    shapes: 'add "shapes": one shape per segment, e.g. {"c": {"dot": [15, 15]}}',
  },
);

export type LooseFigure = v.InferOutput<typeof FigureSectionSchema>;

const SHAPE_HINT = 'a shape is {"dot": [x, y]}, {"bar": [[x1, y1], [x2, y2]]} or {"polyline": [[x1, y1], [x2, y2], ...]}';

/**
 * Checks a figure against its cell's segments: one shape for every segment,
 * none for another name, every point inside the box. Returns the strict
 * figure with the defaults filled in, or undefined with `problems` added.
 *
 * @example
 * figureOf({ box: [30, 30], shapes: { c: { dot: [15, 15] } } }, ["c"], problems);
 * // { width: 30, height: 30, shapes: { c: { kind: "dot", at: [15, 15], r: 2.4 } } }
 */
export function figureOf(loose: LooseFigure, segments: readonly string[], problems: Problem[]): CellFigure | undefined {
  const [width, height] = loose.box;
  const before = problems.length;
  const shapes: Record<string, SegmentShape> = {};
  for (const [name, value] of Object.entries(loose.shapes)) {
    const path = fieldPath(["display", "figure", "shapes", name]);
    if (!segments.includes(name)) {
      problems.push({ path, message: `${quoteText(name, 12)} is not a segment of this cell; the segments are ${segments.join(" ")}` });
      continue;
    }
    const shape = shapeOf(value, { width, height }, (...rest) => fieldPath(["display", "figure", "shapes", name, ...rest]), problems);
    if (shape) shapes[name] = shape;
  }
  const missing = segments.filter((s) => !(s in loose.shapes));
  if (missing.length > 0) {
    problems.push({
      path: "display.figure.shapes",
      message: `no shape for ${missing
        .slice(0, 4)
        .map((m) => quoteText(m, 12))
        .join(
          ", ",
        )}${missing.length > 4 ? ", …" : ""}; give every segment a shape, e.g. "${missing[0] ?? ""}": {"dot": [${width / 2}, ${height / 2}]}`,
    });
  }
  return problems.length > before ? undefined : { width, height, shapes };
}

interface Box {
  readonly width: number;
  readonly height: number;
}

/** The path of a shape's field, e.g. `at("dot")` gives `display.figure.shapes.c.dot`. */
type PathOf = (...rest: (string | number)[]) => string;

function shapeOf(value: unknown, box: Box, at: PathOf, problems: Problem[]): SegmentShape | undefined {
  const path = at();
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    problems.push({ path, message: `got ${describeValue(value)}; ${SHAPE_HINT}` });
    return undefined;
  }
  const o = value as Record<string, unknown>;
  const kinds = (["dot", "bar", "polyline"] as const).filter((k) => k in o);
  const allowed = kinds.length === 1 ? (kinds[0] === "dot" ? ["dot", "r"] : [kinds[0] as string, "width"]) : [];
  const unknown = Object.keys(o).filter((k) => !allowed.includes(k));
  if (kinds.length !== 1 || unknown.length > 0) {
    const why =
      kinds.length === 0
        ? "no shape kind given"
        : kinds.length > 1
          ? `more than one shape kind (${kinds.join(", ")})`
          : `unknown key ${quoteText(unknown[0] ?? "", 12)}`;
    problems.push({
      path,
      message: `${why}; ${SHAPE_HINT}${kinds[0] === "dot" ? ', with an optional "r"' : kinds.length === 1 ? ', with an optional "width"' : ""}`,
    });
    return undefined;
  }
  const small = Math.min(box.width, box.height);
  const sizeRule = { above: 0, max: small / 2 };
  const size = (key: "r" | "width", fallback: number): number | undefined => {
    const x = o[key];
    if (x === undefined) return fallback;
    if (typeof x === "number" && Number.isFinite(x) && x > 0 && x <= sizeRule.max) return x;
    problems.push({ path: at(key), message: `got ${describeValue(x)}; ${numberRuleText(sizeRule)}, half the box's smaller side` });
    return undefined;
  };
  const kind = kinds[0];
  if (kind === "dot") {
    const centre = pointOf(o["dot"], box, at("dot"), problems);
    const r = size("r", round(small * FIGURE_DEFAULTS.dotRadius));
    return centre && r !== undefined ? { kind: "dot", at: centre, r } : undefined;
  }
  const key = kind as "bar" | "polyline";
  const raw = o[key];
  const limits = kind === "bar" ? { min: 2, max: 2 } : POLYLINE_POINTS;
  if (!Array.isArray(raw) || raw.length < limits.min || raw.length > limits.max) {
    const want = kind === "bar" ? "its two ends, [[x1, y1], [x2, y2]]" : `${limits.min} to ${limits.max} points, [[x1, y1], [x2, y2], ...]`;
    problems.push({ path: at(key), message: `got ${coordinatesText(raw)}; must be ${want}` });
    return undefined;
  }
  const points = raw.map((q, i) => pointOf(q, box, at(key, i), problems));
  const width = size("width", round(small * FIGURE_DEFAULTS.strokeWidth));
  if (points.some((q) => q === undefined) || width === undefined) return undefined;
  const pts = points as FigurePoint[];
  if (pts.every((q) => q[0] === pts[0]?.[0] && q[1] === pts[0]?.[1])) {
    problems.push({
      path: at(key),
      message: `all its points are the same; a ${kind} needs two different points (for a round pip, use "dot")`,
    });
    return undefined;
  }
  return kind === "bar"
    ? { kind: "bar", points: [pts[0] as FigurePoint, pts[1] as FigurePoint], width }
    : { kind: "polyline", points: pts, width };
}

function pointOf(value: unknown, box: Box, path: string, problems: Problem[]): FigurePoint | undefined {
  const ok =
    Array.isArray(value) &&
    value.length === 2 &&
    value.every((x) => typeof x === "number" && Number.isFinite(x)) &&
    (value[0] as number) >= 0 &&
    (value[0] as number) <= box.width &&
    (value[1] as number) >= 0 &&
    (value[1] as number) <= box.height;
  if (ok) return [value[0] as number, value[1] as number];
  problems.push({
    path,
    message: `got ${coordinatesText(value)}; must be a point [x, y] inside the box, x from 0 to ${box.width} and y from 0 to ${box.height}`,
  });
  return undefined;
}

/** Coordinates as written, when they are short lists of numbers (`[11, 5]`); anything else as `describeValue` puts it. */
function coordinatesText(value: unknown): string {
  const numbers = (x: unknown): boolean => (Array.isArray(x) ? x.every(numbers) : typeof x === "number" && Number.isFinite(x));
  const text = JSON.stringify(value)?.replace(/,/g, ", ") ?? "";
  return Array.isArray(value) && numbers(value) && text.length <= 60 ? text : describeValue(value);
}

/** Rounds a default size to 3 decimals, so that a written file reads cleanly. */
function round(x: number): number {
  return Math.round(x * 1000) / 1000;
}

/**
 * The figure as the file writes it, every size spelled out.
 *
 * @example
 * figureFields({ width: 30, height: 30, shapes: { c: { kind: "dot", at: [15, 15], r: 2.4 } } });
 * // { box: [30, 30], shapes: { c: { dot: [15, 15], r: 2.4 } } }
 */
export function figureFields(f: CellFigure): { box: [number, number]; shapes: Record<string, Record<string, unknown>> } {
  const shapes: Record<string, Record<string, unknown>> = {};
  for (const [name, s] of Object.entries(f.shapes)) {
    shapes[name] = s.kind === "dot" ? { dot: [...s.at], r: s.r } : { [s.kind]: s.points.map((q) => [...q]), width: s.width };
  }
  return { box: [f.width, f.height], shapes };
}
