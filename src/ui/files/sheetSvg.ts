/** A laid-out sheet drawn by the svg.js adapter, in the page or as standalone SVG text. */
import { SVG, type Svg } from "@svgdotjs/svg.js";
import type { Sheet } from "../../render/drawingModel.ts";
import { drawSheet } from "../../render/drawSheet.ts";

/** Draws a sheet into an element (emptied first) and returns the svg.js root. */
export function mountSheet(into: HTMLElement, sheet: Sheet): Svg {
  into.replaceChildren();
  const root = SVG().addTo(into);
  drawSheet(root, sheet);
  return root;
}

/** The sheet as a standalone SVG document. */
export function sheetSvgText(sheet: Sheet): string {
  const root = SVG();
  drawSheet(root, sheet);
  const text = root.svg();
  root.remove();
  return `<?xml version="1.0" encoding="UTF-8"?>\n${text}\n`;
}
