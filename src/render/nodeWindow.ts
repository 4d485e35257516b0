/**
 * Node only: gives svg.js a svgdom window, so that the command line and the
 * tests can draw sheets and write them with sheetSvg.ts. The browser never
 * imports this file (it has a window of its own).
 */
import { createSVGWindow } from "svgdom";
import { registerWindow } from "@svgdotjs/svg.js";

let registered = false;

/**
 * Registers a svgdom window with svg.js, once.
 *
 * @example
 * registerNodeWindow();
 * sheetSvgText(drawing.sheets[0]);
 */
export function registerNodeWindow(): void {
  if (registered) return;
  const window = createSVGWindow();
  registerWindow(window, window.document);
  registered = true;
}
