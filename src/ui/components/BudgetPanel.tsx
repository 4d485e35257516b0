/**
 * The Budget panel: string current per output across the states (an SVG
 * chart), the spread, the design's emitter resistors with the trim and the
 * control that says whether the design takes it, supply figures, the
 * dark-decoded outputs' pull-ups and ghost check, and the warnings with
 * their severity (a word and a mark, never colour alone).
 */
import { createMemo, For, Show } from "solid-js";
import { TRIM_MODES, type TrimMode } from "../../core/budget/segmentDesign.ts";
import { warningText } from "../../render/budgetWarningText.ts";
import { budgetDesignNote } from "../../render/targetShortText.ts";
import { noSourceLineText } from "../../render/counterLineText.ts";
import { darkFigureLines, darkMarginsText, darkNetworkText } from "../../render/darkBudgetText.ts";
import { formatOhms, microampsShort, milliamps, milliwatts, percent } from "../../render/units.ts";
import { app } from "../state/appState.ts";
import { budgetChart, CHART_ROW_H } from "./budgetChart.ts";
import { spreadWords } from "./trimWords.ts";
import { HelpTip } from "./HelpTip.tsx";

const TRIM_LABEL: Readonly<Record<TrimMode, string>> = {
  auto: "where it improves the design",
  off: "off: the project's values",
  on: "always",
};

const LEVEL = { danger: { mark: "✖", word: "DANGER" }, warn: { mark: "⚠", word: "warning" }, info: { mark: "ℹ", word: "note" } } as const;
const WIDTH = 440;

export function BudgetPanel() {
  const view = () => app.budget();
  const budget = createMemo(() => {
    const v = view();
    return v && v.result.ok ? v.result.value : null;
  });
  const chart = createMemo(() => {
    const b = budget();
    return b ? budgetChart(b, WIDTH) : null;
  });
  const failure = () => {
    const v = view();
    return v && !v.result.ok ? v.result.error : null;
  };
  const noSourceLine = () => {
    const v = view();
    const b = budget();
    return v && b ? noSourceLineText(b, v.forResult.project.counter.drive) : null;
  };
  const warnings = () => [...(budget()?.warnings ?? [])].filter((w) => w.code !== "hazardous-voltage" && w.code !== "mains-supply");

  return (
    <section class="panel" aria-labelledby="budget-h" data-testid="budget" data-supply-v={budget()?.supply.volts}>
      <div class="panel-head">
        <h2 id="budget-h">Budget</h2>
        <label class="label" for="f-trim">
          Trim <HelpTip term="trim" />
        </label>
        <select
          id="f-trim"
          data-testid="trim-mode"
          value={app.trimMode()}
          onChange={(e) => app.setTrimMode(e.currentTarget.value as TrimMode)}
          title="Whether the design (the BOM, the SPICE decks, the driver sheet, the print view) takes the trim of the resistors that set the segment currents"
        >
          <For each={TRIM_MODES}>{(m) => <option value={m}>{TRIM_LABEL[m]}</option>}</For>
        </select>
        <Show when={app.stale() || app.budgetStale() || (app.live() && !view())}>
          <span class="chip stale">↻ {app.stale() ? "stale: from the last valid project" : view() ? "stale, updating" : "working"}</span>
        </Show>
      </div>
      <Show when={failure()}>
        {(f) => (
          <p class="chip danger">
            ✖{" "}
            {f().kind === "no-convergence"
              ? `the DC solve did not converge in ${(f() as { state: string }).state} (${(f() as { during: string }).during}): `
              : ""}
            {f().message}
          </p>
        )}
      </Show>
      <Show when={budget()}>
        {(b) => (
          <>
            <p class="budget-summary" data-testid="budget-summary" data-target-a={b().targetA}>
              target <strong>{microampsShort(b().targetA)} µA</strong> ·{" "}
              <span data-testid="spread-words">
                {spreadWords({
                  spreadPct: b().spreadPct,
                  applied: b().trim.applied,
                  spreadPctBefore: b().trim.spreadPctBefore,
                  trimSpreadPct: b().trim.spreadPct,
                  series: b().trim.series,
                })}
              </span>{" "}
              <HelpTip term="spread" /> · supply max {milliamps(b().supply.maxCurrentA)} mA, {milliwatts(b().supply.maxPowerW, 0)} mW ·
              corners {microampsShort(b().corners.low.minCurrentA)}–{microampsShort(b().corners.high.maxCurrentA)} µA{" "}
              {b().corners.meetsTarget ? "✓ meet" : "⚠ miss"} the ±{b().corners.windowPct} % window <HelpTip term="corners" />
            </p>
            <Show when={chart()}>
              {(c) => (
                <svg
                  class="budget-chart"
                  viewBox={`0 0 ${c().width} ${c().height}`}
                  role="img"
                  aria-label="string current of each output in every lit state, with the nominal band, the band after the trim and the target"
                  data-testid="budget-chart"
                >
                  <For each={c().rows}>
                    {(r, i) => (
                      <g>
                        <Show when={i() % 2 === 1}>
                          <rect class="row-shade" x={0} y={r.y - CHART_ROW_H / 2} width={c().width} height={CHART_ROW_H} />
                        </Show>
                        <text class="chart-label" x={c().plotX0 - 4} y={r.y + 3} text-anchor="end">
                          {r.output}
                        </text>
                        <rect class="band" x={r.band.x0} y={r.y - 3} width={Math.max(0.8, r.band.x1 - r.band.x0)} height={6} />
                        <Show when={r.trimmed}>
                          {(t) => <rect class="band-trim" x={t().x0} y={r.y - 5} width={Math.max(0.8, t().x1 - t().x0)} height={10} />}
                        </Show>
                        <For each={r.ticks}>
                          {(t) => (
                            <line class="tick" x1={t.x} x2={t.x} y1={r.y - 4} y2={r.y + 4}>
                              <title>{`${r.output} in ${t.state}: ${microampsShort(t.currentA)} µA`}</title>
                            </line>
                          )}
                        </For>
                        <text class="chart-value" x={c().width - 2} y={r.y + 3} text-anchor="end">
                          {percent(r.spreadPct)} %
                        </text>
                      </g>
                    )}
                  </For>
                  <line class="target" x1={c().targetX} x2={c().targetX} y1={0} y2={c().height - 14} />
                  <For each={c().axis}>
                    {(a) => (
                      <>
                        <line class="axis-tick" x1={a.x} x2={a.x} y1={c().height - 16} y2={c().height - 12} />
                        <text class="chart-label" x={a.x} y={c().height - 3} text-anchor="middle">
                          {a.label}
                        </text>
                      </>
                    )}
                  </For>
                  <text class="chart-label" x={c().plotX0 - 4} y={c().height - 3} text-anchor="end">
                    µA
                  </text>
                </svg>
              )}
            </Show>
            <p class="legend muted small">
              <span class="key key-band" /> the design's min–max · <span class="key key-trim" /> with the trim ·{" "}
              <span class="key key-tick" /> one lit state · <span class="key key-target" /> target · right: spread
            </p>
            <details class="trim" open>
              <summary>Current-setting resistors</summary>
              <p class="design-note" data-testid="design-note">
                {budgetDesignNote(b())}
              </p>
              <table class="mini-table" data-testid="emitter-table">
                <thead>
                  <tr>
                    <th>Ref</th>
                    <th>Output</th>
                    <th>Value</th>
                    <th>{b().trim.series} trim</th>
                    <th>Trim µA</th>
                  </tr>
                </thead>
                <tbody>
                  <For each={Object.entries(b().drivers)}>
                    {([o, d]) => {
                      const t = () => b().trim.outputs[o];
                      return (
                        <tr data-testid={`emitter-${d.currentResistor.ref}`}>
                          <td>{d.currentResistor.ref}</td>
                          <td>{o}</td>
                          <td data-testid="emitter-value">{formatOhms(d.currentResistor.ohms)}</td>
                          <td>{t() ? formatOhms(t()?.ohms ?? 0) : ""}</td>
                          <td>{t() ? `${microampsShort(t()?.minA ?? 0)}–${microampsShort(t()?.maxA ?? 0)}` : ""}</td>
                        </tr>
                      );
                    }}
                  </For>
                </tbody>
              </table>
            </details>
            <Show when={b().dark}>
              {(d) => (
                <details class="trim" open data-testid="dark-budget" data-passes={d().passes ? "yes" : "no"}>
                  <summary>Dark-decoded outputs ({d().outputs.length})</summary>
                  <p class="design-note" data-testid="dark-network">
                    {darkNetworkText(d())}. {d().sizing}.
                  </p>
                  <table class="mini-table" data-testid="dark-parts">
                    <thead>
                      <tr>
                        <th>Output</th>
                        <th>Pull-up</th>
                        <th>{d().input === "divider" ? "Divider" : "Level shift"}</th>
                        <th>{d().input === "divider" ? "Lower" : "Bleed"}</th>
                      </tr>
                    </thead>
                    <tbody>
                      <For each={d().outputs}>
                        {(o) => (
                          <tr>
                            <td>{o.output}</td>
                            <td>{o.pullUp}</td>
                            <td>{d().input === "divider" ? (o.divider ?? "") : o.shiftDiodes.join(" ")}</td>
                            <td>{o.bleed}</td>
                          </tr>
                        )}
                      </For>
                    </tbody>
                  </table>
                  <p class="muted small">Ghost check, every state at the nominal values and both tolerance corners:</p>
                  <ul class="dark-figures" data-testid="dark-figures">
                    <For each={darkFigureLines(d(), b().targetA >= 1e-4 ? "mA" : "µA")}>{(line) => <li>{line}</li>}</For>
                  </ul>
                  <p class="muted small" data-testid="dark-margins">
                    {darkMarginsText(d())}
                  </p>
                </details>
              )}
            </Show>
            <Show when={noSourceLine()}>
              {(text) => (
                <p class="muted small" data-testid="counter-lines-note">
                  {text()}
                </p>
              )}
            </Show>
            <ul class="warnings" aria-label="Budget warnings">
              <For each={warnings()}>
                {(w) => (
                  <li class={`warning ${w.level}`} data-level={w.level}>
                    <span class="sev">
                      {LEVEL[w.level].mark} {LEVEL[w.level].word}
                    </span>{" "}
                    {warningText(w)}
                  </li>
                )}
              </For>
            </ul>
          </>
        )}
      </Show>
    </section>
  );
}
