/**
 * The print view: only visible when printing (styles.css @media print).
 * After the drawing sheets come the wiring list, with sheet and zone of
 * every diode and the inspection checklist, and the parts count with the
 * budget's design (the values the BOM and the decks carry).
 */
import { createMemo, For, Show } from "solid-js";
import { designModel, designNote } from "../../core/budget/segmentDesign.ts";
import { designators } from "../../core/matrix/designators.ts";
import {
  INSPECTION_CHECKLIST,
  networkHeading,
  networkRows,
  TIE_ON_HEADING,
  tieOnRows,
  WIRING_HEADER,
  wiringRows,
} from "../../core/papers/wiringList.ts";
import { bomLines } from "../../render/bom.ts";
import { ohmsText } from "../../render/units.ts";
import { paperDesign } from "../../render/papers.ts";
import { app } from "../state/appState.ts";

export function PrintView() {
  const lists = createMemo(() => {
    const r = app.live();
    if (!r) return null;
    // Sheets and zones only from the shown result's own drawing.
    const drawing = app.drawingCurrent() ? app.drawing() : null;
    const budget = app.currentBudget();
    const design = paperDesign({ project: r.project, matrix: r.matrix, budget });
    const parts = designators(r.spec, r.matrix, designModel(r.project.electrical, design), design.ohms);
    // Until the budget settles the emitter resistors, the print view shows no values it may then change.
    return {
      r,
      rows: wiringRows(r.matrix, drawing?.placements),
      tieOns: tieOnRows(parts.drivers),
      network: networkRows(parts, drawing?.placements),
      parts: budget ? bomLines(r.project.electrical, parts, design) : [],
      design,
    };
  });
  return (
    <Show when={lists()}>
      {(l) => (
        <section class="print-view" aria-hidden="true" data-testid="print-view">
          <h2>
            Wiring list: {l().r.project.title} ({l().r.matrix.count} diodes)
          </h2>
          <table class="print-table">
            <thead>
              <tr>
                <For each={WIRING_HEADER}>{(h) => <th>{h}</th>}</For>
              </tr>
            </thead>
            <tbody>
              <For each={l().rows}>
                {(w) => (
                  <tr>
                    <td>{w.step}</td>
                    <td>
                      <b>{w.ref}</b>
                    </td>
                    <td>{w.from}</td>
                    <td>{w.to}</td>
                    <td>{w.sheet ?? ""}</td>
                    <td>{w.zone}</td>
                    <td class="box">☐</td>
                  </tr>
                )}
              </For>
            </tbody>
          </table>
          <Show when={l().tieOns.length > 0}>
            <h2>{TIE_ON_HEADING}</h2>
            <table class="print-table" data-testid="print-tie-ons">
              <tbody>
                <For each={l().tieOns}>
                  {(t, i) => (
                    <tr>
                      <td>T{i() + 1}</td>
                      <td>
                        <b>{t.ref}</b>
                      </td>
                      <td>{ohmsText(t.ohms)}</td>
                      <td>{t.from}</td>
                      <td>{t.to}</td>
                      <td class="box">☐</td>
                    </tr>
                  )}
                </For>
              </tbody>
            </table>
          </Show>
          <Show when={l().network.length > 0}>
            <h2>{networkHeading(l().network)}</h2>
            <table class="print-table" data-testid="print-network">
              <tbody>
                <For each={l().network}>
                  {(n, i) => (
                    <tr>
                      <td>N{i() + 1}</td>
                      <td>
                        <b>{n.ref}</b>
                      </td>
                      <td>{n.ohms === null ? "diode" : ohmsText(n.ohms)}</td>
                      <td>{n.from}</td>
                      <td>{n.to}</td>
                      <td>{n.sheet ?? ""}</td>
                      <td>{n.zone}</td>
                      <td class="box">☐</td>
                    </tr>
                  )}
                </For>
              </tbody>
            </table>
          </Show>
          <h2>Inspection</h2>
          <table class="print-table">
            <tbody>
              <For each={INSPECTION_CHECKLIST}>
                {(c, i) => (
                  <tr>
                    <td>C{i() + 1}</td>
                    <td>
                      <b>{c.item}</b>
                    </td>
                    <td>{c.check}</td>
                    <td class="box">☐</td>
                  </tr>
                )}
              </For>
            </tbody>
          </table>
          <h2>Parts count</h2>
          <p>{l().parts.length > 0 ? designNote(l().design) : "The parts count follows when the budget has been worked out."}</p>
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
              <For each={l().parts}>
                {(g) => (
                  <tr>
                    <td>{g.quantity}</td>
                    <td>{g.references}</td>
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
