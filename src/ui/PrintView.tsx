/**
 * The print view: only visible when printing (see styles.css @media print).
 * It holds the drawing, the wiring list and the parts count.
 */
import { For, Show } from "solid-js";
import { refRanges } from "../core/parts.ts";
import { app } from "./appState.ts";

/** Title line above the drawing on paper. */
export function PrintHeader() {
  return (
    <Show when={app.live()}>
      {(r) => (
        <header class="print-header" aria-hidden="true">
          <h1>{r().project.title}</h1>
          <p>
            {r().matrix.count} diodes, verified; {r().spec.states.length} states, {r().spec.positions} position(s) of {r().spec.cell.kind}.
          </p>
        </header>
      )}
    </Show>
  );
}

export function PrintView() {
  return (
    <Show when={app.live()}>
      {(r) => (
        <section class="print-view" aria-hidden="true">
          <h2>Wiring list</h2>
          <table class="print-table">
            <thead>
              <tr>
                <th>Ref</th>
                <th>From (anode)</th>
                <th>To (cathode)</th>
                <th>Check</th>
              </tr>
            </thead>
            <tbody>
              <For each={r().matrix.diodes}>
                {(d) => (
                  <tr>
                    <td>{d.ref}</td>
                    <td>{d.from}</td>
                    <td>{d.to}</td>
                    <td>☐</td>
                  </tr>
                )}
              </For>
            </tbody>
          </table>
          <h2>Parts</h2>
          <table class="print-table">
            <thead>
              <tr>
                <th>Qty</th>
                <th>References</th>
                <th>Value</th>
                <th>Description</th>
              </tr>
            </thead>
            <tbody>
              <For each={r().parts}>
                {(g) => (
                  <tr>
                    <td>{g.refs.length}</td>
                    <td>{refRanges(g.refs)}</td>
                    <td>{g.value}</td>
                    <td>{g.description}</td>
                  </tr>
                )}
              </For>
            </tbody>
          </table>
        </section>
      )}
    </Show>
  );
}
