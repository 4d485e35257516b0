/**
 * Where a line cut at a sheet edge continues. Next door, when the block
 * beyond the edge has a sheet; otherwise the line is followed through the
 * blocks that have none (along its own wires, and round a bus's corner into
 * the other wire of the same net) to the sheets where it shows again.
 */
import type { Chunk, Plan } from "./pagination.ts";
import type { Grid } from "./layoutGrid.ts";
import { X, Y } from "./layoutGrid.ts";

export type Edge = "left" | "right" | "up" | "down";

/** The sheets a net continues on past an edge of a block, ascending; empty where it ends. */
export type Continues = (ri: number, ci: number, net: string, edge: Edge) => readonly number[];

const EPS = 1e-6;
const STEP: Readonly<Record<Edge, readonly [number, number]>> = { left: [0, -1], right: [0, 1], up: [-1, 0], down: [1, 0] };

/**
 * @param sheetOf the sheet number of every block that has one, by `"ri,ci"`
 * @example
 * const continues = continuations(grid, plan, new Map([["0,0", 1], ["1,1", 2]]));
 * continues(0, 0, "B1", "down"); // [2]: B1's column turns into its row on sheet 2
 */
export function continuations(grid: Grid, p: Plan, sheetOf: ReadonlyMap<string, number>): Continues {
  const m = grid.m;
  const px = grid.pitchX;
  const colSpan = (c: Chunk) => ({ lo: X(c.first, px) - m.leftPad, hi: X(Math.max(c.last, c.first), px) + px - m.leftPad });
  const rowSpan = (r: Chunk) => ({ lo: Y(r.first, m) - m.topPad, hi: Y(r.last, m) + m.pitchY - m.topPad });
  const within = (v: number, s: { lo: number; hi: number }) => v >= s.lo - EPS && v < s.hi - EPS;
  const overlaps = (a: number, b: number, s: { lo: number; hi: number }) => b > s.lo + EPS && a < s.hi - EPS;
  // Each wire as the ordered list of blocks it passes through.
  const paths = new Map<string, [number, number][][]>();
  for (const w of grid.wires) {
    const blocks: [number, number][] = [];
    if (w.horizontal) {
      const ri = p.rowChunks.findIndex((r) => within(w.a.y, rowSpan(r)));
      p.colChunks.forEach((c, ci) => {
        if (ri >= 0 && overlaps(w.a.x, w.b.x, colSpan(c))) blocks.push([ri, ci]);
      });
    } else {
      const ci = p.colChunks.findIndex((c) => within(w.a.x, colSpan(c)));
      p.rowChunks.forEach((r, ri) => {
        if (ci >= 0 && overlaps(w.a.y, w.b.y, rowSpan(r))) blocks.push([ri, ci]);
      });
    }
    const list = paths.get(w.net) ?? [];
    list.push(blocks);
    paths.set(w.net, list);
  }
  const id = (ri: number, ci: number) => `${ri},${ci}`;
  return (ri, ci, net, edge) => {
    const [dr, dc] = STEP[edge];
    const start = id(ri + dr, ci + dc);
    const next = sheetOf.get(start);
    if (next !== undefined) return [next];
    const found = new Set<number>();
    const seen = new Set([id(ri, ci), start]);
    const queue = [start];
    for (let k = 0; k < queue.length; k++) {
      const here = queue[k] as string;
      for (const path of paths.get(net) ?? []) {
        const at = path.findIndex(([r, c]) => id(r, c) === here);
        if (at < 0) continue;
        for (const step of [path[at - 1], path[at + 1]]) {
          if (!step) continue;
          const there = id(step[0], step[1]);
          if (seen.has(there)) continue;
          seen.add(there);
          const sheet = sheetOf.get(there);
          if (sheet !== undefined) found.add(sheet);
          else queue.push(there);
        }
      }
    }
    return [...found].sort((a, b) => a - b);
  };
}
