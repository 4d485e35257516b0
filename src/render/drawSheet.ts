/**
 * The svg.js adapter: copies a laid-out sheet onto an svg.js container.
 *
 * It holds no layout decisions; every position comes from the sheet. The
 * same code runs in the browser and, through a registered svgdom window, in
 * Node (see nodeWindow.ts). Black on white only, so it prints and copies in
 * black and white.
 */
import type { Svg } from "@svgdotjs/svg.js";
import { FONT_FAMILY, type Label, type Sheet } from "./drawingModel.ts";

const INK = "#000000";

/** Rounds to 0.001 mm, enough for print and stable in text output. */
const r3 = (v: number): number => Math.round(v * 1000) / 1000;

/**
 * Draws a sheet into an empty svg.js root: sets its size in millimetres and
 * a viewBox in millimetres, then adds every shape.
 *
 * @example
 * const root = SVG().addTo(element);
 * drawSheet(root, drawing.sheets[0]);
 */
export function drawSheet(root: Svg, sheet: Sheet): Svg {
  root.size(`${r3(sheet.widthMm)}mm`, `${r3(sheet.heightMm)}mm`).viewbox(0, 0, r3(sheet.widthMm), r3(sheet.heightMm));
  root.rect(r3(sheet.widthMm), r3(sheet.heightMm)).fill("#ffffff").attr({ x: 0, y: 0 });
  const lines = root.group().attr({ "stroke-linecap": "butt", fill: "none", stroke: INK });
  for (const r of sheet.rects) {
    lines.rect(r3(r.box.w), r3(r.box.h)).attr({ x: r3(r.box.x), y: r3(r.box.y), "stroke-width": r.width, fill: "none" });
  }
  for (const s of sheet.segments) {
    const l = lines.line(r3(s.a.x), r3(s.a.y), r3(s.b.x), r3(s.b.y)).attr({ "stroke-width": s.width });
    if (s.dashed) l.attr({ "stroke-dasharray": "1.5 1" });
  }
  for (const p of sheet.polygons) {
    root.polygon(p.points.map((q) => [r3(q.x), r3(q.y)]) as [number, number][]).attr({
      fill: p.filled ? INK : "none",
      stroke: INK,
      "stroke-width": p.width,
      "stroke-linejoin": "miter",
    });
  }
  for (const c of sheet.circles) {
    root
      .circle(r3(2 * c.r))
      .center(r3(c.at.x), r3(c.at.y))
      .attr(c.filled ? { fill: INK } : { fill: "none", stroke: INK, "stroke-width": 0.18 });
  }
  const diodes = root.group().attr({ stroke: INK, "stroke-width": 0.35 });
  for (const d of sheet.diodes) {
    const g = diodes.group().attr({ "data-ref": d.ref });
    const [b0, b1, apex] = d.triangle;
    const baseMid = { x: (b0.x + b1.x) / 2, y: (b0.y + b1.y) / 2 };
    const barMid = { x: (d.bar[0].x + d.bar[1].x) / 2, y: (d.bar[0].y + d.bar[1].y) / 2 };
    g.line(r3(d.anode.x), r3(d.anode.y), r3(baseMid.x), r3(baseMid.y));
    g.line(r3(barMid.x), r3(barMid.y), r3(d.cathode.x), r3(d.cathode.y));
    g.polygon([b0, b1, apex].map((q) => [r3(q.x), r3(q.y)]) as [number, number][]).attr({
      fill: INK,
      "stroke-width": 0.18,
      "stroke-linejoin": "miter",
    });
    g.line(r3(d.bar[0].x), r3(d.bar[0].y), r3(d.bar[1].x), r3(d.bar[1].y)).attr({ "stroke-width": 0.5 });
  }
  for (const dot of sheet.dots)
    root
      .circle(r3(2 * dot.r))
      .center(r3(dot.at.x), r3(dot.at.y))
      .attr({ fill: INK });
  const texts = root.group().attr({ "font-family": FONT_FAMILY, fill: INK });
  for (const l of sheet.labels) drawLabel(texts, l);
  return root;
}

type Container = ReturnType<Svg["group"]>;

function drawLabel(parent: Container, l: Label): void {
  // Spaces become no-break spaces: SVG would otherwise collapse runs of them
  // and the printed text would no longer match its box.
  const t = parent.plain(l.text.replace(/ /g, "\u00a0")).attr({
    x: r3(l.at.x),
    y: r3(l.at.y),
    "font-size": l.size,
    "text-anchor": l.anchor,
  });
  if (l.bold) t.attr({ "font-weight": "bold" });
  if (l.rotate !== 0) t.attr({ transform: `rotate(${l.rotate} ${r3(l.at.x)} ${r3(l.at.y)})` });
}
