/**
 * The Drawing panel: the live matrix drawing (the printable sheets, laid
 * out by src/render/layout.ts and drawn by the svg.js adapter), zoomable
 * with buttons, the + and - keys or Ctrl+wheel. The diode under the pointer,
 * or picked with the arrow keys, is highlighted together with its row and
 * its column.
 */
import { createEffect, createMemo, createSignal, For, onCleanup, Show } from "solid-js";
import type { DiodeSymbol, Sheet } from "../../render/drawingModel.ts";
import { SVG, type Svg } from "@svgdotjs/svg.js";
import { drawSheet } from "../../render/drawSheet.ts";
import { drawingOptions } from "../../render/drawingOptions.ts";
import { driverSheets } from "../../render/papers.ts";
import { app } from "../state/appState.ts";
import { TitleBlockFields } from "./TitleBlockFields.tsx";

/** Zoom steps, as a share of the panel width. */
const ZOOMS = [0.5, 0.75, 1, 1.5, 2, 3, 4] as const;
const FIT = 2;
/** Pointer slack around a diode symbol, millimetres. */
const HIT_MM = 1.2;

export function DrawingPanel() {
  const [zoomIndex, setZoomIndex] = createSignal(FIT);
  const zoom = () => ZOOMS[zoomIndex()] ?? 1;
  const zoomBy = (step: number) => setZoomIndex((i) => Math.max(0, Math.min(ZOOMS.length - 1, i + step)));
  const [picked, setPicked] = createSignal<{ sheet: number; ref: string } | null>(null);

  const drawing = () => app.drawing();
  /**
   * The driver-stage sheets after the matrix sheets, so that the printed pack
   * holds them: they wait for the budget, which settles the resistor values.
   */
  const driver = createMemo(() => {
    const r = app.live();
    const budget = app.currentBudget();
    if (!r || !budget || !app.drawingCurrent()) return [];
    return driverSheets({
      project: r.project,
      spec: r.spec,
      matrix: r.matrix,
      options: drawingOptions(r.project, app.drawingChoice()),
      budget,
    });
  });
  const allDiodes = createMemo(() => drawing()?.sheets.flatMap((s) => s.diodes.map((d) => ({ sheet: s.number, d }))) ?? []);
  const pickedDiode = () => {
    const p = picked();
    return p ? (allDiodes().find((x) => x.sheet === p.sheet && x.d.ref === p.ref)?.d ?? null) : null;
  };
  const step = (delta: number) => {
    const list = allDiodes();
    if (list.length === 0) return;
    const p = picked();
    const i = p ? list.findIndex((x) => x.sheet === p.sheet && x.d.ref === p.ref) : -1;
    const next = list[(i + delta + list.length) % list.length];
    if (next) setPicked({ sheet: next.sheet, ref: next.d.ref });
  };

  return (
    <section class="panel drawing-panel" aria-labelledby="drawing-h">
      <div class="panel-head">
        <h2 id="drawing-h">Drawing</h2>
        <div class="tool-group" role="group" aria-label="Zoom">
          <button type="button" class="small-btn" onClick={() => zoomBy(-1)} aria-label="Zoom out">
            −
          </button>
          <span class="zoom-readout" aria-live="polite">
            {Math.round(zoom() * 100)} %
          </span>
          <button type="button" class="small-btn" onClick={() => zoomBy(1)} aria-label="Zoom in">
            +
          </button>
          <button type="button" class="small-btn" onClick={() => setZoomIndex(FIT)}>
            Fit
          </button>
        </div>
        <span class="muted small">
          {drawing()?.sheets.length ?? 0} sheet(s)
          <Show when={driver().length > 0}>, driver stages {driver().length}</Show>
        </span>
        <Show when={app.stale()}>
          <span class="chip stale">↻ stale</span>
        </Show>
        <Show when={!app.stale() && app.live() && !app.drawingCurrent()}>
          <span class="chip stale" data-testid="drawing-follows">
            ↻ drawing the new result
          </span>
        </Show>
        <span class="hover-readout" aria-live="polite" data-testid="diode-readout">
          <Show when={pickedDiode()} fallback={<span class="muted">point at a diode, or focus the drawing and use the arrow keys</span>}>
            {(d) => (
              <>
                <strong>{d().ref}</strong> anode {d().from} → cathode {d().to}
              </>
            )}
          </Show>
        </span>
      </div>
      <TitleBlockFields />
      <div
        class={`drawing-scroll ${app.stale() ? "is-stale" : ""}`}
        tabindex="0"
        role="group"
        aria-label="Matrix drawing: + and - zoom, arrow keys step through the diodes"
        onKeyDown={(e) => {
          if (e.key === "+" || e.key === "=") zoomBy(1);
          else if (e.key === "-") zoomBy(-1);
          else if (e.key === "ArrowRight" || e.key === "ArrowDown") step(1);
          else if (e.key === "ArrowLeft" || e.key === "ArrowUp") step(-1);
          else if (e.key === "Escape") setPicked(null);
          else return;
          e.preventDefault();
        }}
        onWheel={(e) => {
          if (!e.ctrlKey) return;
          e.preventDefault();
          zoomBy(e.deltaY < 0 ? 1 : -1);
        }}
      >
        <For each={drawing()?.sheets ?? []}>
          {(sheet, i) => (
            <SheetView
              sheet={sheet}
              first={i() === 0}
              zoom={zoom()}
              highlight={picked()?.sheet === sheet.number ? pickedDiode() : null}
              onPick={(ref) => {
                const p = picked();
                if (ref === null ? p !== null : p?.sheet !== sheet.number || p.ref !== ref)
                  setPicked(ref === null ? null : { sheet: sheet.number, ref });
              }}
            />
          )}
        </For>
        <For each={driver()}>
          {(sheet) => (
            <SheetView sheet={sheet} first={false} what="driver stages" zoom={zoom()} highlight={null} onPick={() => undefined} />
          )}
        </For>
      </div>
    </section>
  );
}

/**
 * Sheets after the first wait their turn to be drawn, one per task, so that
 * a drawing of many sheets (a 256-state, 8-position direct matrix has 45)
 * never holds the page for long; the first is drawn at once with its result.
 */
const mountQueue: (() => void)[] = [];

function mountLater(job: () => void): void {
  mountQueue.push(job);
  if (mountQueue.length === 1) setTimeout(mountNext, 0);
}

function mountNext(): void {
  mountQueue.shift()?.();
  if (mountQueue.length > 0) setTimeout(mountNext, 0);
}

/** Draws a sheet into an element (emptied first) with the svg.js adapter and returns the svg.js root. */
function mountSheet(into: HTMLElement, sheet: Sheet): Svg {
  into.replaceChildren();
  const root = SVG().addTo(into);
  drawSheet(root, sheet);
  return root;
}

function SheetView(props: {
  sheet: Sheet;
  first: boolean;
  /** What the sheet belongs to, for its label; the matrix drawing unless given. */
  what?: string;
  zoom: number;
  highlight: DiodeSymbol | null;
  onPick: (ref: string | null) => void;
}) {
  let host: HTMLDivElement | undefined;
  let svgEl: SVGSVGElement | null = null;
  let overlay: SVGGElement | null = null;
  const NS = "http://www.w3.org/2000/svg";

  const [mounted, setMounted] = createSignal(0);
  createEffect(() => {
    const sheet = props.sheet;
    if (props.first) return draw(sheet);
    let live = true;
    onCleanup(() => void (live = false));
    mountLater(() => {
      if (live) draw(sheet);
    });
  });

  function draw(sheet: Sheet): void {
    if (!host) return;
    const root = mountSheet(host, sheet);
    svgEl = root.node;
    svgEl.classList.add("sheet-svg");
    svgEl.setAttribute("role", "img");
    const what = props.what ?? "matrix drawing";
    svgEl.setAttribute(
      "aria-label",
      props.what
        ? `${what}, sheet ${sheet.number} of ${sheet.count}`
        : `${what}, sheet ${sheet.number} of ${sheet.count}, ${sheet.diodes.length} diodes`,
    );
    svgEl.dataset.sheet = props.what ? `${what} ${sheet.number}` : String(sheet.number);
    if (props.first) svgEl.dataset.testid = "matrix-drawing";
    if (props.what && sheet.number === 1) svgEl.dataset.testid = "driver-sheet";
    overlay = document.createElementNS(NS, "g");
    overlay.setAttribute("class", "hl-layer");
    overlay.setAttribute("pointer-events", "none");
    svgEl.append(overlay);
    setMounted((n) => n + 1);
  }

  createEffect(() => {
    mounted(); // re-apply after a redraw
    if (!svgEl) return;
    const z = props.zoom;
    svgEl.setAttribute("width", `${z * 100}%`);
    svgEl.removeAttribute("height");
  });

  createEffect(() => {
    mounted();
    const d = props.highlight;
    if (!overlay) return;
    overlay.replaceChildren();
    if (!d) return;
    const add = (tag: string, attrs: Record<string, string | number>) => {
      const el = document.createElementNS(NS, tag);
      for (const [k, v] of Object.entries(attrs)) el.setAttribute(k, String(v));
      overlay?.append(el);
    };
    for (const s of props.sheet.segments) {
      if (s.net !== d.from && s.net !== d.to) continue;
      add("line", { x1: s.a.x, y1: s.a.y, x2: s.b.x, y2: s.b.y, class: s.net === d.from ? "hl-row" : "hl-col" });
    }
    const b = d.box;
    add("rect", { x: b.x - 0.8, y: b.y - 0.8, width: b.w + 1.6, height: b.h + 1.6, rx: 0.6, class: "hl-diode" });
  });

  const pick = (e: PointerEvent) => {
    if (!svgEl) return;
    const ctm = svgEl.getScreenCTM();
    if (!ctm) return;
    const p = new DOMPoint(e.clientX, e.clientY).matrixTransform(ctm.inverse());
    const hit = props.sheet.diodes.find(
      (d) => p.x >= d.box.x - HIT_MM && p.x <= d.box.x + d.box.w + HIT_MM && p.y >= d.box.y - HIT_MM && p.y <= d.box.y + d.box.h + HIT_MM,
    );
    props.onPick(hit?.ref ?? null);
  };
  onCleanup(() => host?.replaceChildren());
  return <div class="sheet-host" ref={host} onPointerMove={pick} onPointerLeave={() => props.onPick(null)} />;
}
