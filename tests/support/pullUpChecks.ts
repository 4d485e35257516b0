/**
 * Checks of the pull-ups drawn at the tops of columns (an AND gate's, a
 * dark-decoded output's) on laid-out sheets, read off the sheets alone:
 * the part's symbol, its designator and value, its two leads and what they
 * join, and the cross-reference a sheet further down prints in its place.
 */
import type { Box, Label, Point, Sheet } from "../../src/render/drawingModel.ts";
import { FRAME_MM } from "../../src/render/sheetFrame.ts";
import { arms, pieces, samePoint, touches } from "./layoutGeometry.ts";

/** A pull-up as the BOM lists it: its designator, its value as printed (null before the budget sizes it) and the node it pulls up. */
export interface PullUpPart {
  readonly ref: string;
  readonly value: string | null;
  readonly node: string;
}

const near = (a: number, b: number): boolean => Math.abs(a - b) < 1e-6;

/** A resistor body: an unfilled rectangle of four corners. */
function bodies(sheet: Sheet): Box[] {
  return sheet.polygons
    .filter((p) => !p.filled && p.points.length === 4)
    .map((p) => {
      const xs = p.points.map((q) => q.x);
      const ys = p.points.map((q) => q.y);
      return { x: Math.min(...xs), y: Math.min(...ys), w: Math.max(...xs) - Math.min(...xs), h: Math.max(...ys) - Math.min(...ys) };
    });
}

/**
 * The zone a point lies in, read from the border's own ticks: the zone
 * column is 1 plus the number of column ticks (short lines down from the
 * frame's top edge) left of the point, the zone row the letter after as
 * many letters as there are row ticks (from the frame's left edge) above it.
 */
export function zoneFromMarks(sheet: Sheet, at: Point): string {
  const ticks = sheet.segments.filter((s) => s.net === undefined);
  const columns = ticks.filter((s) => s.a.x === s.b.x && Math.min(s.a.y, s.b.y) === FRAME_MM).map((s) => s.a.x);
  const rows = ticks.filter((s) => s.a.y === s.b.y && Math.min(s.a.x, s.b.x) === FRAME_MM).map((s) => s.a.y);
  const column = 1 + columns.filter((x) => x <= at.x).length;
  const row = String.fromCharCode(65 + rows.filter((y) => y <= at.y).length);
  return `${row}${column}`;
}

/** Where a pull-up is drawn on a sheet: its body's middle; or every problem found with it, as sentences. */
export function pullUpProblems(sheet: Sheet, part: PullUpPart): { at: Point | null; problems: string[] } {
  const problems: string[] = [];
  const ref = sheet.labels.filter((l) => l.role === "part" && l.text === part.ref);
  if (ref.length !== 1) return { at: null, problems: [`${part.ref} is labelled ${ref.length} times on sheet ${sheet.number}`] };
  const label = ref[0] as Label;
  const values = sheet.labels.filter(
    (l) => l.role === "part" && near(l.at.x, label.at.x) && l.at.y > label.at.y && l.at.y < label.at.y + 5,
  );
  if (part.value !== null && !values.some((l) => l.text === part.value))
    problems.push(`${part.ref} has no value ${part.value} under its designator`);
  if (part.value === null && values.length > 0) problems.push(`${part.ref} prints a value (${values[0]?.text}) before it is sized`);
  // The body just left of the designator, level with it.
  const body = bodies(sheet).find(
    (b) => b.x + b.w <= label.box.x + 1e-9 && label.box.x - (b.x + b.w) < 2 && b.y < label.at.y && b.y + b.h > label.box.y,
  );
  if (body === undefined) return { at: null, problems: [...problems, `${part.ref}: no resistor body beside its designator`] };
  const x = body.x + body.w / 2;
  const all = pieces(sheet);
  // Its upper lead from the VLOGIC rail to the body's top, its lower lead from the body's bottom to the node's column.
  const upper = sheet.segments.find((s) => s.net === "VLOGIC" && near(s.a.x, x) && near(s.b.x, x) && near(s.b.y, body.y));
  const lower = sheet.segments.find((s) => s.net === part.node && near(s.a.x, x) && near(s.b.x, x) && near(s.a.y, body.y + body.h));
  if (upper === undefined) problems.push(`${part.ref}: no VLOGIC lead into the top of its body`);
  else {
    const rail = sheet.segments.find((s) => s.net === "VLOGIC" && s.a.y === s.b.y && touches(upper.a, s) > 0);
    if (rail === undefined) problems.push(`${part.ref}: its upper lead does not reach the VLOGIC rail`);
  }
  if (lower === undefined) problems.push(`${part.ref}: no lead of ${part.node} out of the bottom of its body`);
  else {
    // The lead ends where the node's column starts: two arms of the node meet there, and the column runs on down.
    const column = sheet.segments.find((s) => s.net === part.node && s.a.x === s.b.x && samePoint(s.a, lower.b));
    if (column === undefined) problems.push(`${part.ref}: its lower lead does not end on the top of ${part.node}'s column`);
    else if (arms(lower.b, part.node, all) !== 2) problems.push(`${part.ref}: ${part.node}'s column top is joined to something else too`);
  }
  return { at: { x, y: body.y + body.h / 2 }, problems };
}

/**
 * Every problem with the cross-reference a sheet prints over a column
 * whose pull-up is drawn on another sheet: the designator over the
 * column's top, centred on it, and under it `sh.N` naming that sheet.
 */
export function crossReferenceProblems(sheet: Sheet, part: PullUpPart, drawnOn: number): string[] {
  const column = sheet.segments.filter((s) => s.net === part.node && s.a.x === s.b.x).sort((a, b) => a.a.y - b.a.y)[0];
  const refs = sheet.labels.filter((l) => l.text === part.ref);
  const here = `${part.ref} over ${part.node} on sheet ${sheet.number}`;
  if (column === undefined) return refs.length === 0 ? [] : [`${here}: named on a sheet that does not show the column`];
  if (refs.length !== 1) return [`${here}: ${refs.length} labels`];
  const ref = refs[0] as Label;
  const problems: string[] = [];
  if (ref.role !== "continuation") problems.push(`${here}: a ${ref.role} label, not a cross-reference`);
  if (!near(ref.at.x, column.a.x) || ref.anchor !== "middle") problems.push(`${here}: not centred on the column`);
  if (ref.box.y + ref.box.h > column.a.y) problems.push(`${here}: not over the column's top`);
  // The next text down the column's line (the arrow's own mark at the cut stands further down).
  const mark = sheet.labels
    .filter((l) => l.role === "continuation" && near(l.at.x, ref.at.x) && l.at.y > ref.at.y)
    .sort((a, b) => a.at.y - b.at.y)[0];
  if (mark?.text !== `sh.${drawnOn}`) problems.push(`${here}: says ${mark?.text ?? "nothing"} under it, not sh.${drawnOn}`);
  return problems;
}
