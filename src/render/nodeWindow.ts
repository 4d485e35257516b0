/**
 * Node only: svg.js on a svgdom window, so the CLI and tests can render
 * sheets to SVG text. The browser never imports this file.
 */
import { createSVGWindow } from "svgdom";
import { registerWindow, SVG } from "@svgdotjs/svg.js";
import type { Sheet } from "./drawingModel.ts";
import { drawSheet } from "./drawSheet.ts";

let registered = false;

function ensureWindow(): void {
  if (registered) return;
  const window = createSVGWindow();
  registerWindow(window, window.document);
  registered = true;
}

/**
 * Renders a sheet to a standalone SVG document.
 *
 * @example
 * await writeFile("matrix.svg", sheetToSvgText(drawing.sheets[0]));
 */
export function sheetToSvgText(sheet: Sheet): string {
  ensureWindow();
  const root = SVG();
  drawSheet(root, sheet);
  const text = root.svg();
  root.remove();
  return `<?xml version="1.0" encoding="UTF-8"?>\n${text}\n`;
}
