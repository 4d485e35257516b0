import { describe, expect, it } from "vitest";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";
import { serializeProject } from "../../../../src/core/project/projectWriter.ts";
import { example } from "../../../support/projects.ts";

const base = { schema: "diodeloom/project@1", counter: { states: 2 }, show: ["a", "b"] };

function custom(figure: unknown, segments = ["p", "q"]) {
  return parseProject(JSON.stringify({ ...base, display: { cell: "custom", segments, figure }, glyphs: { a: ["p"], b: ["q"] } }));
}

const problems = (r: ReturnType<typeof parseProject>) => (r.ok ? [] : r.error.map((p) => `${p.path}: ${p.message}`));

describe("display.figure: a custom cell's look", () => {
  it("reads the die roller's pips and writes them back with every size spelled out", () => {
    const p = example("die-roller");
    const f = p.display.cell.figure;
    expect(f?.width).toBe(30);
    expect(f?.shapes["c"]).toEqual({ kind: "dot", at: [15, 15], r: 3 });
    const again = parseProject(serializeProject(p));
    expect(again.ok && again.value).toEqual(p);
  });

  it("reads dots, bars and polylines, filling in a dot's radius and a stroke's width from the box", () => {
    const r = custom({
      box: [50, 20],
      shapes: {
        p: { dot: [10, 10] },
        q: {
          polyline: [
            [20, 5],
            [30, 15],
            [40, 5],
          ],
        },
      },
    });
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    expect(r.value.display.cell.figure?.shapes).toEqual({
      p: { kind: "dot", at: [10, 10], r: 1.6 },
      q: {
        kind: "polyline",
        points: [
          [20, 5],
          [30, 15],
          [40, 5],
        ],
        width: 2,
      },
    });
    const bar = custom({
      box: [10, 10],
      shapes: {
        p: {
          bar: [
            [1, 1],
            [9, 1],
          ],
          width: 2,
        },
        q: { dot: [5, 5], r: 1 },
      },
    });
    expect(bar.ok && bar.value.display.cell.figure?.shapes["p"]).toEqual({
      kind: "bar",
      points: [
        [1, 1],
        [9, 1],
      ],
      width: 2,
    });
  });

  it("names every segment left without a shape, and a shape for a name the cell lacks", () => {
    expect(problems(custom({ box: [10, 10], shapes: { p: { dot: [5, 5] } } }))).toEqual([
      'display.figure.shapes: no shape for "q"; give every segment a shape, e.g. "q": {"dot": [5, 5]}',
    ]);
    expect(problems(custom({ box: [10, 10], shapes: { p: { dot: [5, 5] }, q: { dot: [2, 2] }, z: { dot: [1, 1] } } }))).toEqual([
      'display.figure.shapes.z: "z" is not a segment of this cell; the segments are p q',
    ]);
  });

  it("refuses points outside the box, unknown keys, two kinds at once and strokes wider than the box allows", () => {
    const ok = { dot: [5, 5] };
    expect(problems(custom({ box: [10, 10], shapes: { p: { dot: [11, 5] }, q: ok } }))).toEqual([
      "display.figure.shapes.p.dot: got [11, 5]; must be a point [x, y] inside the box, x from 0 to 10 and y from 0 to 10",
    ]);
    expect(problems(custom({ box: [10, 10], shapes: { p: { dot: [1, 1], width: 2 }, q: ok } }))[0]).toMatch(
      /^display\.figure\.shapes\.p: unknown key "width"; a shape is \{"dot": \[x, y\]\}/,
    );
    expect(
      problems(
        custom({
          box: [10, 10],
          shapes: {
            p: {
              dot: [1, 1],
              bar: [
                [1, 1],
                [2, 2],
              ],
            },
            q: ok,
          },
        }),
      )[0],
    ).toMatch(/more than one shape kind \(dot, bar\)/);
    expect(
      problems(
        custom({
          box: [10, 10],
          shapes: {
            p: {
              bar: [
                [1, 1],
                [9, 1],
              ],
              width: 6,
            },
            q: ok,
          },
        }),
      ),
    ).toEqual(["display.figure.shapes.p.width: got 6; must be a number greater than 0 and at most 5, half the box's smaller side"]);
    expect(problems(custom({ box: [10, 10], shapes: { p: { bar: [[1, 1]] }, q: ok } }))).toEqual([
      "display.figure.shapes.p.bar: got [[1, 1]]; must be its two ends, [[x1, y1], [x2, y2]]",
    ]);
    expect(
      problems(
        custom({
          box: [10, 10],
          shapes: {
            p: {
              polyline: [
                [1, 1],
                [1, 1],
              ],
            },
            q: ok,
          },
        }),
      )[0],
    ).toMatch(/all its points are the same/);
    expect(problems(custom({ box: [0, 10], shapes: {} }))[0]).toMatch(/^display\.figure\.box\[0\]: got 0; must be a number from 1 to 1000/);
  });

  it("refuses a figure on a built-in cell, which is drawn as it is", () => {
    const r = parseProject(JSON.stringify({ ...base, show: ["1", "2"], display: { figure: { box: [1, 1], shapes: {} } } }));
    expect(problems(r)[0]).toMatch(/^display\.figure: a "seg7" cell is drawn as it is; only a "custom" cell gives a figure/);
  });
});
