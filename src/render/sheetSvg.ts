/**
 * A laid-out sheet as a standalone SVG document: the one serialiser for the
 * command line (under svgdom, see nodeWindow.ts) and the web app (in the
 * browser's DOM), so both write the same bytes.
 *
 * It writes the element tree drawSheet builds as XML itself rather than
 * asking the DOM for its markup: a browser gives an HTML serialisation
 * (`&nbsp;` for the no-break spaces of the labels), which is not XML and
 * which XML tools refuse.
 */
import { SVG } from "@svgdotjs/svg.js";
import type { Sheet } from "./drawingModel.ts";
import { drawSheet } from "./drawSheet.ts";

/** Escapes the characters XML reserves, in text and in double-quoted attribute values. */
function escapeXml(text: string): string {
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

const ELEMENT_NODE = 1;
const TEXT_NODE = 3;

/**
 * An element and everything in it as XML 1.0 text: attributes in document
 * order, every element closed with an end tag, text escaped, other
 * characters (such as U+00A0) written as they are, in UTF-8.
 */
export function xmlText(element: Element): string {
  let out = `<${element.tagName}`;
  for (const a of Array.from(element.attributes)) out += ` ${a.name}="${escapeXml(a.value)}"`;
  out += ">";
  for (const child of Array.from(element.childNodes)) {
    if (child.nodeType === ELEMENT_NODE) out += xmlText(child as Element);
    else if (child.nodeType === TEXT_NODE) out += escapeXml(child.nodeValue ?? "");
  }
  return `${out}</${element.tagName}>`;
}

/**
 * Renders a sheet to a standalone SVG document. Needs a DOM window for
 * svg.js: the page's own in the browser, `registerNodeWindow()` in Node.
 *
 * @example
 * registerNodeWindow();
 * await writeFile("matrix.svg", sheetSvgText(drawing.sheets[0]));
 */
export function sheetSvgText(sheet: Sheet): string {
  const root = SVG();
  drawSheet(root, sheet);
  const text = xmlText(root.node);
  root.remove();
  return `<?xml version="1.0" encoding="UTF-8"?>\n${text}\n`;
}
