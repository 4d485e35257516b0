/**
 * The printable wiring list: an HTML page sized for A4, A3 or Letter, with the
 * column heads repeated on every printed page, an empty box to tick per
 * diode, and the inspection checklist at the end. Pure text, no DOM.
 */
import type { DiodeMatrix } from "../core/matrix/matrix.ts";
import type { Project } from "../core/project/project.ts";
import {
  INSPECTION_CHECKLIST,
  networkHeading,
  TIE_ON_HEADING,
  WIRING_HEADER,
  type NetworkRow,
  type TieOnRow,
  type WiringRow,
} from "../core/papers/wiringList.ts";
import { ohmsText } from "./units.ts";
import type { DrawingOptions } from "./drawingOptions.ts";

const PAGE_SIZE = { a4: "A4", a3: "A3", letter: "letter" } as const;

/** Escapes text for HTML element content and attribute values. */
function esc(text: string): string {
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

/** What the printable wiring list shows. */
export interface WiringPageInput {
  readonly project: Project;
  readonly matrix: DiodeMatrix;
  readonly rows: readonly WiringRow[];
  /** The tie-on resistors of the tied-on outputs (none when no output is tied on). */
  readonly tieOns?: readonly TieOnRow[];
  /** The AND gates' pull-ups and the dark-decoded outputs' input network (none without gates or dark-decoded outputs). */
  readonly network?: readonly NetworkRow[];
  readonly options: DrawingOptions;
  /** Number of matrix drawing sheets the rows refer to. */
  readonly sheetCount: number;
}

/**
 * The printable wiring list as one HTML page.
 *
 * @example
 * await writeFile("wiring.html", wiringPageHtml({ project, matrix, rows, options, sheetCount: drawing.sheets.length }));
 */
export function wiringPageHtml(input: WiringPageInput): string {
  const { project, matrix, rows, options, sheetCount } = input;
  const body = rows
    .map(
      (r) =>
        `<tr><td>${r.step}</td><td><b>${esc(r.ref)}</b></td><td>${esc(r.from)}</td><td>${esc(r.to)}</td><td>${r.sheet ?? ""}</td><td>${esc(r.zone)}</td><td class="box"></td></tr>`,
    )
    .join("\n");
  const tieOns = input.tieOns ?? [];
  const tieOnTable =
    tieOns.length === 0
      ? ""
      : `<h1>${esc(TIE_ON_HEADING)}</h1>
<table>
<thead><tr><th>Step</th><th>Ref</th><th>Value</th><th>From</th><th>To</th><th>Done</th></tr></thead>
<tbody>
${tieOns.map((t, i) => `<tr><td>T${i + 1}</td><td><b>${esc(t.ref)}</b></td><td>${esc(ohmsText(t.ohms))}</td><td>${esc(t.from)}</td><td>${esc(t.to)}</td><td class="box"></td></tr>`).join("\n")}
</tbody>
</table>
`;
  const network = input.network ?? [];
  const networkTable =
    network.length === 0
      ? ""
      : `<h1>${esc(networkHeading(network))}</h1>
<table>
<thead><tr><th>Step</th><th>Ref</th><th>Value</th><th>From</th><th>To</th><th>Sheet</th><th>Zone</th><th>Done</th></tr></thead>
<tbody>
${network.map((n, i) => `<tr><td>N${i + 1}</td><td><b>${esc(n.ref)}</b></td><td>${esc(n.ohms === null ? "diode" : ohmsText(n.ohms))}</td><td>${esc(n.from)}</td><td>${esc(n.to)}</td><td>${n.sheet ?? ""}</td><td>${esc(n.zone)}</td><td class="box"></td></tr>`).join("\n")}
</tbody>
</table>
`;
  const checks = INSPECTION_CHECKLIST.map(
    (c, i) => `<tr><td>C${i + 1}</td><td><b>${esc(c.item)}</b></td><td>${esc(c.check)}</td><td class="box"></td></tr>`,
  ).join("\n");
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>Wiring list: ${esc(project.title)}</title>
<style>
@page { size: ${PAGE_SIZE[options.paper]} portrait; margin: 10mm; }
body { font-family: 'DejaVu Sans Mono', 'Liberation Mono', 'Courier New', monospace; font-size: 9pt; color: #000; background: #fff; margin: 0; }
h1 { font-size: 12pt; margin: 0 0 2mm 0; }
p { margin: 0 0 2mm 0; }
table { border-collapse: collapse; width: 100%; margin-bottom: 4mm; }
th, td { border: 0.3mm solid #000; padding: 0.8mm 1.5mm; text-align: left; vertical-align: middle; }
thead { display: table-header-group; }
tr { break-inside: avoid; }
td.box { width: 8mm; }
th { background: #fff; font-weight: bold; }
.meta { width: auto; }
.meta td { border: none; padding: 0 6mm 0 0; white-space: nowrap; }
@media screen { body { margin: 10mm; } }
</style>
</head>
<body>
<h1>Wiring list: ${esc(project.title)}</h1>
<table class="meta">
<tr><td>Drawing number: ${esc(options.drawingNumber)}</td><td>Rev. ${esc(options.revision)}</td><td>Date of issue: ${esc(options.date || "________")}</td></tr>
<tr><td>Drawn by: ${esc(options.drawnBy)}</td><td>Diodes: ${matrix.count}</td><td>Drawing sheets: ${sheetCount}</td></tr>
</table>
<p>Fit the diodes in this order, row by row of the drawing. The anode goes to the From line; the band (cathode) to the To line. Tick Done as each one is soldered.</p>
<table>
<thead><tr>${WIRING_HEADER.map((h) => `<th>${esc(h)}</th>`).join("")}</tr></thead>
<tbody>
${body}
</tbody>
</table>
${tieOnTable}${networkTable}<h1>Inspection checklist</h1>
<table>
<thead><tr><th>#</th><th>Item</th><th>Check</th><th>Done</th></tr></thead>
<tbody>
${checks}
</tbody>
</table>
</body>
</html>
`;
}
