/**
 * The Decoders panel: the instrument's decoders, to open one in the other
 * panels, add, rename, duplicate, reorder and remove them (each an undo
 * step), and, with two or more, the instrument summary: each decoder's
 * parts and supply figures and their totals (instrumentSummary.ts).
 */
import { createMemo, createSignal, For, Index, Show } from "solid-js";
import { milliamps, milliwatts } from "../../render/units.ts";
import { app } from "../state/appState.ts";
import { draftFromProject } from "../state/draft.ts";
import { newProject } from "../state/examples.ts";
import {
  addDecoder,
  canAddDecoder,
  decoderNameProblem,
  duplicateDecoder,
  moveDecoder,
  overriddenPaths,
  removeDecoder,
  renameDecoder,
} from "../state/instrumentDraft.ts";
import { instrumentTotals, logicNotes, totalsCaveat } from "../state/instrumentSummary.ts";
import type { DecoderSummary } from "../workers/summaryRun.ts";
import { HelpTip } from "./HelpTip.tsx";

export function InstrumentPanel() {
  const inst = () => app.instrument();
  const count = () => inst().decoders.length;
  const totals = createMemo(() => instrumentTotals(app.summary(), app.instrumentSummary()));
  const [nameText, setNameText] = createSignal<string | null>(null);
  const selectedName = () => inst().decoders[app.selected()]?.name ?? "";
  const nameProblem = () => {
    const t = nameText();
    return t === null ? null : decoderNameProblem(inst(), app.selected(), t);
  };

  const add = () => {
    const at = count();
    app.editInstrument((i) => addDecoder(i, draftFromProject(newProject())), null, at);
    app.sealEdit();
  };
  const duplicate = (k: number) => {
    app.editInstrument((i) => duplicateDecoder(i, k), null, k + 1);
    app.sealEdit();
  };
  const move = (k: number, to: number) => {
    const target = Math.max(0, Math.min(count() - 1, to));
    app.editInstrument((i) => moveDecoder(i, k, target), null, app.selected() === k ? target : undefined);
    app.sealEdit();
  };
  const remove = (k: number) => {
    const sel = app.selected();
    app.editInstrument((i) => removeDecoder(i, k), null, sel > k || sel === count() - 1 ? Math.max(0, sel - 1) : sel);
    app.sealEdit();
  };
  const rename = (text: string) => {
    setNameText(text);
    if (decoderNameProblem(inst(), app.selected(), text) === null) {
      const k = app.selected();
      app.editInstrument((i) => renameDecoder(i, k, text), `name:${k}`);
    }
  };

  return (
    <section class="panel instrument" aria-labelledby="instrument-h" data-testid="instrument" data-decoders={count()}>
      <div class="panel-head">
        <h2 id="instrument-h">
          Decoders <HelpTip term="decoders" />
        </h2>
        <button
          type="button"
          class="small-btn"
          onClick={add}
          disabled={!canAddDecoder(inst())}
          data-testid="decoder-add"
          title="Add a decoder: a new counter showing 0-9 on one digit"
        >
          + Add decoder
        </button>
      </div>
      <Show when={count() === 1}>
        <p class="muted small" data-testid="instrument-single">
          One decoder: a plain project, saved as one. Add a decoder for a clock, a timer or any instrument of several counters; they share
          the electrical values and get one summary and one set of papers.
        </p>
      </Show>
      <Show when={count() > 1}>
        <ol class="decoder-list" aria-label="Decoders of the instrument">
          <Index each={inst().decoders}>
            {(d, k) => (
              <li classList={{ "is-current": app.selected() === k }} data-testid={`decoder-row-${k}`}>
                <button
                  type="button"
                  class="decoder-pick"
                  aria-pressed={app.selected() === k ? "true" : "false"}
                  data-testid={`decoder-${k}`}
                  onClick={() => app.selectDecoder(k)}
                  title="Open this decoder in the panels"
                >
                  <span class="decoder-name">{d().name}</span>
                  <span class="muted small">
                    {" "}
                    {d().draft.counter.states} states · {d().draft.display.positions}{" "}
                    {d().draft.display.positions === 1 ? "digit" : "digits"}
                  </span>
                  <Show when={overriddenPaths(inst(), k).length > 0}>
                    <span
                      class="chip small"
                      data-testid={`decoder-own-${k}`}
                      title={`Electrical values of its own: ${overriddenPaths(inst(), k).join(", ")}`}
                    >
                      own electrical
                    </span>
                  </Show>
                </button>
                <span class="decoder-tools" role="group" aria-label={`${d().name}: order and copies`}>
                  <button
                    type="button"
                    class="small-btn"
                    disabled={k === 0}
                    onClick={() => move(k, k - 1)}
                    aria-label={`Move ${d().name} up`}
                  >
                    ↑
                  </button>
                  <button
                    type="button"
                    class="small-btn"
                    disabled={k === count() - 1}
                    onClick={() => move(k, k + 1)}
                    aria-label={`Move ${d().name} down`}
                  >
                    ↓
                  </button>
                  <button
                    type="button"
                    class="small-btn"
                    disabled={!canAddDecoder(inst())}
                    onClick={() => duplicate(k)}
                    aria-label={`Duplicate ${d().name}`}
                    data-testid={`decoder-duplicate-${k}`}
                  >
                    Copy
                  </button>
                  <button
                    type="button"
                    class="small-btn"
                    onClick={() => remove(k)}
                    aria-label={`Remove ${d().name}`}
                    data-testid={`decoder-remove-${k}`}
                  >
                    Remove
                  </button>
                </span>
              </li>
            )}
          </Index>
        </ol>
        <div class="form-grid">
          <label for="f-decoder-name">Name</label>
          <input
            id="f-decoder-name"
            type="text"
            data-testid="decoder-name"
            maxLength={60}
            value={nameText() ?? selectedName()}
            aria-invalid={nameProblem() ? "true" : undefined}
            onInput={(e) => rename(e.currentTarget.value)}
            onChange={() => {
              setNameText(null);
              app.sealEdit();
            }}
            onBlur={() => setNameText(null)}
          />
        </div>
        <Show when={nameProblem()}>
          {(p) => (
            <p class="chip danger small">
              ✖ {p()}: the name stays "{selectedName()}"
            </p>
          )}
        </Show>
        <h3>
          Summary <HelpTip term="instrumentTotals" />
        </h3>
        <table class="mini-table summary-table" data-testid="instrument-summary">
          <thead>
            <tr>
              <th>Decoder</th>
              <th class="num">Diodes</th>
              <th class="num">
                <abbr title="Transistors">Trans.</abbr>
              </th>
              <th class="num">
                <abbr title="Resistors">Res.</abbr>
              </th>
              <th class="num">
                <abbr title="Segment supply current, milliamperes: the decoder's share of the instrument's worst case">Seg. mA</abbr>
              </th>
              <th class="num">
                <abbr title="Logic supply current, milliamperes: the decoder's share of the instrument's worst case">Logic mA</abbr>
              </th>
              <th class="num">
                <abbr title="Power from both supplies, milliwatts: the decoder's share of the instrument's worst case">mW</abbr>
              </th>
            </tr>
          </thead>
          <tbody>
            <For each={inst().decoders}>
              {(d, k) => (
                <SummaryRow name={d.name} row={app.summary()[k()]} share={totals().supply?.shares[k()]} current={app.selected() === k()} />
              )}
            </For>
          </tbody>
          <tfoot>
            <tr data-testid="summary-total">
              <th>Total</th>
              <td class="num" data-testid="total-diodes">
                {totals().diodes}
              </td>
              <td class="num" data-testid="total-transistors">
                {totals().transistors}
              </td>
              <td class="num" data-testid="total-resistors">
                {totals().resistors}
              </td>
              <SupplyCells supply={totals().supply} total />
            </tr>
          </tfoot>
        </table>
        <Show when={totals().supply}>
          {(s) => (
            <p class="muted small" data-testid="summary-note">
              Supplies: the instrument's worst case over every combination of the counters' states, at nominal and both tolerance corners
              {s().bound === "per-case-sum"
                ? ": each decoder's worst state, summed (the decoders share supplies and temperature)."
                : ": each decoder's worst over nominal and both corners, summed, a bound (the decoders' supplies or temperatures differ)."}
            </p>
          )}
        </Show>
        <For
          each={logicNotes(
            app.summary(),
            inst().decoders.map((d) => d.name),
          )}
        >
          {(note) => (
            <p class="muted small" data-testid="logic-note">
              {note}
            </p>
          )}
        </For>
        <Show when={totalsCaveat(totals())}>
          {(c) => (
            <p class="chip stale" data-testid="summary-caveat">
              ↻ {c()}
            </p>
          )}
        </Show>
      </Show>
    </section>
  );
}

/** The supply cells of a row: a decoder's share of the worst case, or the totals; dots while unknown. */
function SupplyCells(props: { supply: { segmentA: number; logicA: number; powerW: number } | null | undefined; total?: boolean }) {
  const id = (name: string) => (props.total ? `total-${name}` : undefined);
  return (
    <Show
      when={props.supply}
      fallback={
        <td colSpan={3} class="muted num">
          …
        </td>
      }
    >
      {(s) => (
        <>
          <td class="num" data-testid={id("segment-ma")}>
            {milliamps(s().segmentA)}
          </td>
          <td class="num" data-testid={id("logic-ma")}>
            {milliamps(s().logicA)}
          </td>
          <td class="num" data-testid={id("supply-mw")}>
            {milliwatts(s().powerW, 0)}
          </td>
        </>
      )}
    </Show>
  );
}

function SummaryRow(props: {
  name: string;
  row: DecoderSummary | undefined;
  share: { segmentA: number; logicA: number; powerW: number } | undefined;
  current: boolean;
}) {
  const status = () => props.row?.status ?? "computing";
  const figures = () => (props.row?.status === "done" ? props.row.figures : null);
  const failure = () => (props.row?.status === "failed" ? props.row.message : null);
  return (
    <tr classList={{ "is-current": props.current }} data-status={status()}>
      <td>{props.name}</td>
      <Show
        when={figures()}
        fallback={
          <td colSpan={6} class="muted" title={failure() ?? undefined}>
            {failure() !== null ? `✖ no figures: ${failure()}` : "↻ working out…"}
          </td>
        }
      >
        {(f) => (
          <>
            <td class="num">{f().diodes}</td>
            <td class="num">{f().transistors}</td>
            <td class="num">{f().resistors}</td>
            <Show
              when={f().budget.ok}
              fallback={
                <td colSpan={3} class="muted">
                  ✖ no budget
                </td>
              }
            >
              <SupplyCells supply={props.share} />
            </Show>
          </>
        )}
      </Show>
    </tr>
  );
}
