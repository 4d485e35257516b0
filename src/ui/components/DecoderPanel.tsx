/**
 * The Decoder panel of a coded counter (Johnson, binary, custom): the
 * decoder on screen beside the two-rank one (diodes, resistors, gates), its
 * AND gates and the stage lines it uses straight, and what every code the
 * counter never reaches shows at power-up. Shown only for a coded counter.
 */
import { createMemo, For, Match, Show, Switch } from "solid-js";
import { decoderTerms } from "../../core/logic/decoderTerms.ts";
import { powerUpTable, powerUpText } from "../../core/logic/powerUp.ts";
import { app } from "../state/appState.ts";
import type { TwoRankFigures } from "../workers/analysisProtocol.ts";

const CODE_NAMES = { johnson: "Johnson", binary: "binary", custom: "custom-coded", "one-hot": "ring" } as const;

export function DecoderPanel() {
  const result = () => {
    const r = app.live();
    return r && r.spec.counter.kind !== "one-hot" ? r : undefined;
  };
  const terms = createMemo(() => {
    const r = result();
    return r ? decoderTerms(r.matrix) : [];
  });
  const powerUp = createMemo(() => {
    const r = result();
    return r ? powerUpTable(r.spec, r.matrix, r.project.glyphs) : null;
  });
  const rank = (): { state: "working" | "failed" | "ok"; message?: string; figures?: TwoRankFigures } => {
    const t = app.twoRank();
    if (!t) return { state: "working" };
    return t.ok ? { state: "ok", figures: t.value } : { state: "failed", message: `not worked out: ${t.error.message}` };
  };
  const shared = () => (result()?.matrix.longestPath ?? 1) > 1;
  return (
    <Show when={result()}>
      {(r) => (
        <section class="panel" aria-labelledby="decoder-h" data-testid="decoder-panel">
          <h2 id="decoder-h">Decoder</h2>
          <p class="muted small">
            {CODE_NAMES[r().spec.counter.kind]} counter of {r().spec.counter.stages} stages: stage lines Q0-Q{r().spec.counter.stages - 1}{" "}
            and their complements nQ.{" "}
            {shared() ? "AND gates, then shared OR nodes." : "Two-level logic: AND gates, then one OR diode to each output."}
          </p>
          <table class="mini-table" data-testid="decoder-table">
            <thead>
              <tr>
                <th>decoder</th>
                <th>diodes</th>
                <th>resistors</th>
                <th>gates</th>
              </tr>
            </thead>
            <tbody>
              <tr>
                <td>{shared() ? "this (shared nodes)" : "this (two-level)"}</td>
                <td>{r().matrix.count}</td>
                <td>{r().matrix.gates.length}</td>
                <td>{r().matrix.gates.length}</td>
              </tr>
              <tr data-testid="two-rank-row">
                <td>two ranks</td>
                <Switch>
                  <Match when={rank().state === "working"}>
                    <td colSpan={3} class="muted">
                      working it out…
                    </td>
                  </Match>
                  <Match when={rank().state === "failed"}>
                    <td colSpan={3}>{rank().message}</td>
                  </Match>
                  <Match when={rank().figures}>
                    {(f) => (
                      <>
                        <td title={`${f().gateDiodes} in the gates, ${f().matrixDiodes} in the matrix`}>{f().diodes}</td>
                        <td>{f().gates}</td>
                        <td>{f().gates}</td>
                      </>
                    )}
                  </Match>
                </Switch>
              </tr>
            </tbody>
          </table>
          <p class="muted small">Resistors: one pull-up per gate. Two ranks: one gate per state, then a full matrix on the state lines.</p>

          <h3>Terms</h3>
          <ul class="term-list" data-testid="gate-list">
            <For each={terms()}>
              {(t) => (
                <li>
                  <strong>{t.name}</strong>
                  {t.inputs.length > 1 ? ` = ${t.inputs.join(" · ")}` : ""} → {t.drives.join(" ")}
                  <span class="muted"> (high in {t.highIn.join(" ")})</span>
                </li>
              )}
            </For>
          </ul>

          <h3>Codes never reached</h3>
          <Show when={powerUp()}>
            {(table) => (
              <>
                <p class="muted small">What the display shows if the counter starts in, or falls into, a code it never counts through.</p>
                <Show when={table().listed} fallback={<p class="muted small">{table().unusedCodes} codes: too many to list.</p>}>
                  <ul class="term-list" data-testid="power-up-list">
                    <For each={table().entries}>{(e) => <li>{powerUpText(e)}</li>}</For>
                  </ul>
                </Show>
              </>
            )}
          </Show>
        </section>
      )}
    </Show>
  );
}
