/**
 * The Project panel: title, counter and display, the per-state texts (as a
 * list, or filled from a counting pattern) and the synthesis options.
 */
import { createMemo, createSignal, For, Index, Show } from "solid-js";
import type { CellKind, CounterCodeKind, CounterDrive, DarkInput, DecodePolarity, DepthPolicy } from "../../core/project/project.ts";
import { LIMITS } from "../../core/project/limits.ts";
import { numberFromText } from "../../core/project/synthesisSchema.ts";
import { splitText } from "../../core/project/projectSchema.ts";
import { problemSentence } from "../state/problemWords.ts";
import { fillPattern } from "../../core/project/textPatterns.ts";
import { app } from "../state/appState.ts";
import { setInstrumentTitle } from "../state/instrumentDraft.ts";
import { CellFigure } from "./CellFigure.tsx";
import { HelpTip } from "./HelpTip.tsx";
import {
  draftFigure,
  draftSegments,
  effectiveGlyphs,
  setCell,
  setCounterCode,
  setCounterDrive,
  setCounterCodes,
  setPositions,
  setStates,
  setSynthesis,
  setText,
  setTexts,
  setTitle,
} from "../state/draftEdits.ts";

const CELL_NAMES: Record<CellKind, string> = { seg7: "7-segment", seg7dp: "7-segment + dp", custom: "custom" };
const CODE_NAMES: Record<CounterCodeKind, string> = {
  "one-hot": "ring (one line per state)",
  johnson: "Johnson (twisted ring)",
  binary: "binary (BCD at 10 states)",
  custom: "custom codes",
};
const DRIVE_NAMES: Record<CounterDrive, string> = {
  source: "active high (S)",
  sink: "active low (nS)",
  complementary: "both (S and nS)",
};
const DECODE_NAMES: Record<DecodePolarity, string> = { lit: "lit cells", dark: "dark cells", either: "cheaper per output" };
const DARK_INPUT_NAMES: Record<DarkInput, string> = { "level-shift": "level-shift diodes", divider: "divider" };
const POLICY_NAMES: Record<DepthPolicy, string> = { "per-segment": "per segment", mixed: "mixed", uniform: "uniform" };
const DEPTH_LIMITS = Array.from({ length: LIMITS.depthLimit.max - LIMITS.depthLimit.min + 1 }, (_, i) => LIMITS.depthLimit.min + i);

/** The number in a number field, or null while the field is empty or not a number. */
function numberOrNull(text: string): number | null {
  const x = numberFromText(text);
  return typeof x === "number" ? x : null;
}

export function ProjectPanel() {
  const d = () => app.draft();
  const [pattern, setPattern] = createSignal("");
  const [patternError, setPatternError] = createSignal<string | null>(null);
  const problemsAt = (path: string) =>
    app.problems().filter((p) => p.path === path || p.path.startsWith(`${path}.`) || p.path.startsWith(`${path}[`));

  const applyPattern = () => {
    const r = fillPattern(pattern(), d().display.positions);
    if (!r.ok) return setPatternError(r.error.map((p) => p.message).join("\n"));
    setPatternError(null);
    app.edit((x) => setTexts(x, r.value));
    app.sealEdit();
  };

  // The previews depend only on the cell and the glyph table, not on the texts: a memo compared
  // by value keeps typing in one row from redrawing every other row's preview.
  const sameJson = <T,>(a: T, b: T) => JSON.stringify(a) === JSON.stringify(b);
  const previewCell = createMemo(() => ({ kind: d().display.cell, segments: draftSegments(d()), figure: draftFigure(d()) }), undefined, {
    equals: sameJson,
  });
  const glyphTable = createMemo(() => effectiveGlyphs(d()), undefined, { equals: sameJson });
  const positionsOf = (text: string) => {
    const cell = previewCell();
    const table = glyphTable();
    return splitText(text, cell).map((p) => [...(table[p.char] ?? []), ...(p.dp ? ["dp"] : [])]);
  };

  return (
    <section class="panel" aria-labelledby="project-h">
      <h2 id="project-h">Project</h2>
      <div class="form-grid">
        <label for="f-title">{app.instrument().decoders.length > 1 ? "Instrument title" : "Title"}</label>
        <input
          id="f-title"
          type="text"
          value={app.instrument().title}
          maxLength={200}
          onInput={(e) => {
            const title = e.currentTarget.value;
            if (app.instrument().decoders.length > 1) app.editInstrument((i) => setInstrumentTitle(i, title), "title");
            else app.edit((x) => setTitle(x, title), "title");
          }}
          onChange={() => app.sealEdit()}
        />

        <label for="f-states">States</label>
        <input
          id="f-states"
          type="number"
          min={LIMITS.states.min}
          max={LIMITS.states.max}
          value={d().counter.states}
          onChange={(e) => app.edit((x) => setStates(x, Number(e.currentTarget.value) || 2))}
        />

        <label for="f-code">Counter code</label>
        <select
          id="f-code"
          value={d().counter.code}
          data-testid="counter-code"
          onChange={(e) => app.edit((x) => setCounterCode(x, e.currentTarget.value as CounterCodeKind))}
        >
          <For each={Object.keys(CODE_NAMES) as CounterCodeKind[]}>{(k) => <option value={k}>{CODE_NAMES[k]}</option>}</For>
        </select>

        <Show when={d().counter.code === "one-hot"}>
          <label for="f-drive">Counter lines</label>
          <select
            id="f-drive"
            value={d().counter.drive}
            data-testid="counter-drive"
            title="which level marks the active state: active-low lines take the dark cells of NPN drivers, or a high-side switch's lit cells"
            onChange={(e) => app.edit((x) => setCounterDrive(x, e.currentTarget.value as CounterDrive))}
          >
            <For each={Object.keys(DRIVE_NAMES) as CounterDrive[]}>{(k) => <option value={k}>{DRIVE_NAMES[k]}</option>}</For>
          </select>
        </Show>

        <Show when={d().counter.code === "custom"}>
          <label for="f-codes">Codes</label>
          <textarea
            id="f-codes"
            rows={3}
            spellcheck={false}
            title="one bit string per state, the highest stage leftmost, separated by spaces or new lines"
            value={(d().counter.codes ?? []).join(" ")}
            onChange={(e) => {
              app.edit((x) => setCounterCodes(x, e.currentTarget.value));
              app.sealEdit();
            }}
          />
        </Show>

        <label for="f-positions">Positions</label>
        <input
          id="f-positions"
          type="number"
          min={LIMITS.positions.min}
          max={LIMITS.positions.max}
          value={d().display.positions}
          onChange={(e) => app.edit((x) => setPositions(x, Number(e.currentTarget.value) || 1))}
        />

        <label for="f-cell">Cell</label>
        <select id="f-cell" value={d().display.cell} onChange={(e) => app.edit((x) => setCell(x, e.currentTarget.value as CellKind))}>
          <For each={Object.keys(CELL_NAMES) as CellKind[]}>{(k) => <option value={k}>{CELL_NAMES[k]}</option>}</For>
        </select>
      </div>

      <fieldset class="sub">
        <legend>Texts per state</legend>
        <div class="pattern-row">
          <label for="f-pattern" class="visually-hidden">
            Fill pattern
          </label>
          <input
            id="f-pattern"
            type="text"
            value={pattern()}
            placeholder="0-9, 1-12 with leading blank, 00-59"
            onInput={(e) => setPattern(e.currentTarget.value)}
            onKeyDown={(e) => e.key === "Enter" && applyPattern()}
          />
          <button type="button" onClick={applyPattern}>
            Fill
          </button>
        </div>
        <Show when={patternError()}>
          <p class="field-error" role="alert">
            {patternError()}
          </p>
        </Show>
        <Show when={problemsAt("show").some((p) => p.path === "show")}>
          <p class="field-error">
            {problemSentence(
              problemsAt("show").find((p) => p.path === "show")!,
              d(),
            )}
          </p>
        </Show>
        <ol class="state-list" aria-label="Text of each state">
          <Index each={d().show}>
            {(text, k) => {
              const err = () => app.problems().find((p) => p.path === `show[${k}]`);
              return (
                <li class={err() ? "has-error" : ""}>
                  <label for={`f-show-${k}`} class="state-name">
                    S{k}
                  </label>
                  <input
                    id={`f-show-${k}`}
                    class="state-text"
                    type="text"
                    value={text()}
                    data-testid={`state-text-${k}`}
                    aria-invalid={err() ? "true" : "false"}
                    aria-describedby={err() ? `f-show-err-${k}` : undefined}
                    onInput={(e) => app.edit((x) => setText(x, k, e.currentTarget.value), `show[${k}]`)}
                    onChange={() => app.sealEdit()}
                  />
                  <span class="state-preview" aria-hidden="true">
                    <For each={positionsOf(text())}>
                      {(lit) => (
                        <CellFigure
                          kind={previewCell().kind}
                          segments={previewCell().segments}
                          figure={previewCell().figure}
                          lit={lit}
                          height={22}
                        />
                      )}
                    </For>
                  </span>
                  <Show when={err()}>
                    <span id={`f-show-err-${k}`} class="field-error inline">
                      ⚠ {err() ? problemSentence(err()!, d()) : ""}
                    </span>
                  </Show>
                </li>
              );
            }}
          </Index>
        </ol>
      </fieldset>

      <fieldset class="sub">
        <legend>Synthesis</legend>
        <div class="form-grid">
          <label for="f-depth">
            Depth limit <HelpTip term="depthLimit" />
          </label>
          <select
            id="f-depth"
            value={String(d().synthesis.maxDepth)}
            onChange={(e) => app.edit((x) => setSynthesis(x, { maxDepth: Number(e.currentTarget.value) }))}
          >
            <For each={DEPTH_LIMITS}>{(k) => <option value={String(k)}>{k === 1 ? "1 diode" : `${k} diodes`}</option>}</For>
          </select>
          <label for="f-policy">
            Depth policy <HelpTip term="depthPolicy" />
          </label>
          <select
            id="f-policy"
            value={d().synthesis.depth}
            onChange={(e) => app.edit((x) => setSynthesis(x, { depth: e.currentTarget.value as DepthPolicy }))}
          >
            <For each={Object.keys(POLICY_NAMES) as DepthPolicy[]}>{(p) => <option value={p}>{POLICY_NAMES[p]}</option>}</For>
          </select>
          <label for="f-decode">Decode</label>
          <select
            id="f-decode"
            value={d().synthesis.decode}
            data-testid="decode-polarity"
            title="lit cells from active-high lines, dark cells onto active-low lines (a pull-up on each output), or the cheaper per output"
            onChange={(e) => app.edit((x) => setSynthesis(x, { decode: e.currentTarget.value as DecodePolarity }))}
          >
            <For each={Object.keys(DECODE_NAMES) as DecodePolarity[]}>{(k) => <option value={k}>{DECODE_NAMES[k]}</option>}</For>
          </select>
          <Show when={d().synthesis.decode !== "lit"}>
            <label for="f-dark-input">Dark input</label>
            <select
              id="f-dark-input"
              value={d().synthesis.darkInput}
              onChange={(e) => app.edit((x) => setSynthesis(x, { darkInput: e.currentTarget.value as DarkInput }))}
            >
              <For each={Object.keys(DARK_INPUT_NAMES) as DarkInput[]}>{(k) => <option value={k}>{DARK_INPUT_NAMES[k]}</option>}</For>
            </select>
          </Show>
          <span class="label">Sharing</span>
          <div class="checks">
            <label>
              <input
                type="checkbox"
                checked={d().synthesis.buses}
                onChange={(e) => app.edit((x) => setSynthesis(x, { buses: e.currentTarget.checked }))}
              />{" "}
              bus nodes <HelpTip term="busNode" />
            </label>
            <label>
              <input
                type="checkbox"
                checked={d().synthesis.links}
                onChange={(e) => app.edit((x) => setSynthesis(x, { links: e.currentTarget.checked }))}
              />{" "}
              links <HelpTip term="link" />
            </label>
          </div>
          <label for="f-limit">Exact limit (s)</label>
          <input
            id="f-limit"
            type="number"
            min={LIMITS.timeLimitMs.min / 1000}
            max={LIMITS.timeLimitMs.max / 1000}
            value={d().synthesis.timeLimitMs / 1000}
            onChange={(e) => {
              // Out-of-range values go into the draft, so the schema names them as it names a file's.
              const seconds = numberOrNull(e.currentTarget.value);
              if (seconds !== null) app.edit((x) => setSynthesis(x, { timeLimitMs: Math.round(seconds * 1000) }));
            }}
          />
          <label for="f-seed">
            Seed <HelpTip term="seed" />
          </label>
          <input
            id="f-seed"
            type="number"
            min={LIMITS.seed.min}
            max={LIMITS.seed.max}
            step="1"
            value={d().synthesis.seed}
            onChange={(e) => {
              const seed = numberOrNull(e.currentTarget.value);
              if (seed !== null) app.edit((x) => setSynthesis(x, { seed }));
            }}
          />
        </div>
      </fieldset>
      <Show when={app.problems().length > 0}>
        <div class="problems" role="status" data-testid="problems">
          <strong>⚠ The project has {app.problems().length} problem(s); results below are from the last valid version.</strong>
          <ul class="problem-list">
            <For each={app.problems()}>{(p) => <li>{problemSentence(p, d())}</li>}</For>
          </ul>
        </div>
      </Show>
    </section>
  );
}
