/**
 * The Drawing panel: the live matrix drawing, zoomable (buttons, + and -
 * keys, Ctrl+wheel), with the diode under the pointer or keyboard focus
 * highlighted together with its row and column.
 */
import { createMemo, createSignal, For, Show } from "solid-js";
import { app } from "./appState.ts";

const ZOOMS = [0.5, 0.67, 0.8, 1, 1.25, 1.5, 2, 3] as const;

export function DrawingPanel() {
  const [zoomIndex, setZoomIndex] = createSignal(3);
  const zoom = () => ZOOMS[zoomIndex()] ?? 1;
  const zoomBy = (step: number) => setZoomIndex((i) => Math.max(0, Math.min(ZOOMS.length - 1, i + step)));
  const [hover, setHover] = createSignal<string | null>(null);

  const grid = createMemo(() => {
    const r = app.live();
    if (!r) return null;
    const m = r.matrix;
    const outputs = new Set(m.outputs);
    const sources = [...m.states, ...m.buses, ...m.outputs.filter((o) => m.diodes.some((d) => d.from === o))];
    const sinks = [...m.buses, ...m.outputs];
    const label = (s: string) => {
      const k = m.states.indexOf(s);
      return k >= 0 ? `${s} “${r.spec.texts[k]}”` : outputs.has(s) ? `${s} link` : s;
    };
    return { sources, sinks, diodes: m.diodes, label };
  });
  const cell = 18;
  const left = 90;
  const top = 40;
  const hovered = () => grid()?.diodes.find((d) => d.ref === hover()) ?? null;

  return (
    <section class="panel drawing-panel" aria-labelledby="drawing-h">
      <div class="panel-head">
        <h2 id="drawing-h">Drawing</h2>
        <div class="tool-group" role="group" aria-label="Zoom">
          <button type="button" class="small-btn" onClick={() => zoomBy(-1)} aria-label="Zoom out">
            −
          </button>
          <span class="zoom-readout">{Math.round(zoom() * 100)} %</span>
          <button type="button" class="small-btn" onClick={() => zoomBy(1)} aria-label="Zoom in">
            +
          </button>
          <button type="button" class="small-btn" onClick={() => setZoomIndex(3)}>
            100 %
          </button>
        </div>
        <span class="hover-readout" aria-live="polite">
          <Show when={hovered()} fallback={<span class="muted">point at a diode</span>}>
            {(d) => (
              <>
                <strong>{d().ref}</strong> {d().from} → {d().to}
              </>
            )}
          </Show>
        </span>
      </div>
      <div
        class={`drawing-scroll ${app.stale() ? "is-stale" : ""}`}
        tabindex="0"
        aria-label="Matrix drawing; + and - zoom"
        onKeyDown={(e) => {
          if (e.key === "+" || e.key === "=") zoomBy(1);
          if (e.key === "-") zoomBy(-1);
        }}
        onWheel={(e) => {
          if (!e.ctrlKey) return;
          e.preventDefault();
          zoomBy(e.deltaY < 0 ? 1 : -1);
        }}
      >
        <Show when={grid()}>
          {(g) => {
            const w = () => left + g().sinks.length * cell + 20;
            const h = () => top + g().sources.length * cell + 20;
            const row = (n: string) => top + g().sources.indexOf(n) * cell + cell / 2;
            const col = (n: string) => left + g().sinks.indexOf(n) * cell + cell / 2;
            return (
              <svg data-testid="matrix-drawing" class="matrix-svg" viewBox={`0 0 ${w()} ${h()}`} width={w() * zoom()} height={h() * zoom()} role="img" aria-label={`matrix of ${g().diodes.length} diodes`}>
                <Show when={hovered()}>
                  {(d) => (
                    <>
                      <rect class="hl-band" x={0} y={row(d().from) - cell / 2} width={w()} height={cell} />
                      <rect class="hl-band" x={col(d().to) - cell / 2} y={0} width={cell} height={h()} />
                    </>
                  )}
                </Show>
                <For each={g().sources}>
                  {(s) => (
                    <>
                      <line class="wire" x1={left - 4} x2={w() - 10} y1={row(s)} y2={row(s)} />
                      <text class="wire-label" x={left - 8} y={row(s) + 3} text-anchor="end">
                        {g().label(s)}
                      </text>
                    </>
                  )}
                </For>
                <For each={g().sinks}>
                  {(s) => (
                    <>
                      <line class="wire" x1={col(s)} x2={col(s)} y1={top - 4} y2={h() - 10} />
                      <text class="wire-label" x={col(s)} y={top - 8} text-anchor="middle">
                        {s}
                      </text>
                    </>
                  )}
                </For>
                <For each={g().diodes}>
                  {(d) => (
                    <g class={`diode ${hover() === d.ref ? "hl" : ""}`} data-ref={d.ref} onPointerEnter={() => setHover(d.ref)} onPointerLeave={() => setHover(null)}>
                      <polygon points={`${col(d.to) - 4},${row(d.from) - 4} ${col(d.to) + 4},${row(d.from) - 4} ${col(d.to)},${row(d.from) + 3}`} />
                      <line x1={col(d.to) - 4} x2={col(d.to) + 4} y1={row(d.from) + 3} y2={row(d.from) + 3} />
                      <title>{`${d.ref}: ${d.from} → ${d.to}`}</title>
                    </g>
                  )}
                </For>
              </svg>
            );
          }}
        </Show>
      </div>
    </section>
  );
}
