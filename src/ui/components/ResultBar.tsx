/**
 * The result line: the verified diode count, how it was found, whether it
 * is stale, and the exact run's progress with its cancel button.
 */
import { createSignal, Match, onCleanup, Show, Switch } from "solid-js";
import { app } from "../state/appState.ts";
import { darkOutputs, matrixObjective, type DiodeMatrix } from "../../core/matrix/matrix.ts";
import { gapPercent } from "../workers/exactProtocol.ts";
import { doneText } from "../state/exactStatus.ts";
import { HelpTip } from "./HelpTip.tsx";

const METHOD_NAMES = { direct: "direct", heuristic: "heuristic", exact: "exact" } as const;

export function ResultBar() {
  // A clock for the running exact optimizer's elapsed time (display only).
  const [now, setNow] = createSignal(performance.now());
  const tick = setInterval(() => {
    if (app.exact().status === "running") setNow(performance.now());
  }, 500);
  onCleanup(() => clearInterval(tick));
  const limitS = () => Math.round(app.draft().synthesis.timeLimitMs / 1000);
  const m = () => app.live()?.matrix;
  // The shown matrix with the best bound any run found for its glyph set (figures.ts), so the line
  // and the comparison's row in use always agree.
  const bound = () => {
    const f = app.headerFigure();
    if (!f) return "";
    if (f.status === "proven") return "proven minimum";
    return f.lowerBound !== null ? `bound ${f.lowerBound}, gap ${f.count - f.lowerBound}` : "no bound yet";
  };
  return (
    <div class="result-bar" role="status" aria-live="polite">
      <Show when={m()} fallback={<span class="muted">No result yet</span>}>
        <span class="count" data-testid="diode-count" data-count={m() ? matrixObjective(m() as DiodeMatrix) : undefined}>
          <strong>{m() ? matrixObjective(m() as DiodeMatrix) : ""}</strong> diodes
          <Show when={darkOutputs(m() as DiodeMatrix).length > 0}>
            {" "}
            <span
              data-testid="dark-decode"
              title="each of these outputs has a pull-up and is pulled down in the states where its segment is dark"
            >
              ({m()?.count} in the matrix, {m()?.inputNetwork?.diodes ?? 0} level-shift; decoded dark:{" "}
              {darkOutputs(m() as DiodeMatrix).join(" ")})
            </span>
          </Show>
          <Show when={(m()?.gates.length ?? 0) > 0}>
            , <strong data-testid="gate-count">{m()?.gates.length}</strong> AND gates
          </Show>
        </span>
        <span class="chip ok" title="every state lights exactly its glyph (independent verifier)">
          ✓ verified
        </span>
        <HelpTip term="verified" />
        <span class="muted">
          {METHOD_NAMES[m()?.method ?? "direct"]} · {bound()} <HelpTip term="boundGap" /> · direct {app.live()?.directCount}{" "}
          <HelpTip term="direct" /> · {m()?.buses.length} bus · depth {m()?.longestPath}/{m()?.depthLimit}
        </span>
        <Show when={app.stale()}>
          <span class="chip stale" data-testid="stale">
            ↻ stale: fix the project to update
          </span>
        </Show>
        <Show when={app.liveMs() !== null}>
          <span
            class="muted small"
            data-testid="live-ms"
            data-ms={app.liveMs()?.toFixed(1)}
            data-pass={app.livePass()}
            title="edit to verified result, milliseconds"
          >
            {app.liveMs()?.toFixed(0)} ms
          </span>
          <span hidden data-testid="first-ms" data-ms={app.firstMs()?.toFixed(1)} data-pass={app.firstPass()} />
          <span hidden data-testid="synth-runs" data-runs={app.synthRuns()} />
        </Show>
      </Show>
      <Show when={app.liveBusy() && app.live()}>
        <span class="chip stale" data-testid="live-busy">
          <span class="spinner" aria-hidden="true" /> heuristic running
        </span>
      </Show>
      <Show when={app.liveNote()}>
        <span class="chip warn" data-testid="live-note">
          ⚠ {app.liveNote()}
        </span>
      </Show>
      <Show when={app.liveError()}>
        <span class="chip danger">✖ {app.liveError()}</span>
      </Show>
      <span class="exact" data-testid="exact-status" data-status={app.exact().status}>
        <Switch>
          <Match when={app.exact().status === "running" && app.exact()}>
            {(s) => {
              const p = () => (s() as Extract<ReturnType<typeof app.exact>, { status: "running" }>).progress;
              return (
                <>
                  <span class="spinner" aria-hidden="true" />
                  exact: best {p().best ?? "–"}, bound {p().bound ?? "–"}
                  <Show when={gapPercent(p()) !== null}>, gap {gapPercent(p())?.toFixed(1)} %</Show>
                  <span class="muted">
                    · {Math.max(0, Math.floor((now() - (s() as { startedAtMs: number }).startedAtMs) / 1000))} s of {limitS()} s
                  </span>
                  <button type="button" class="small-btn" onClick={() => app.cancelExact()} data-testid="exact-cancel">
                    Cancel
                  </button>
                </>
              );
            }}
          </Match>
          <Match when={app.exact().status === "done" && app.exact()}>
            {(s) => <>{doneText(s() as Extract<ReturnType<typeof app.exact>, { status: "done" }>)}</>}
          </Match>
          <Match when={app.exact().status === "cancelled"}>
            exact: cancelled{" "}
            <button type="button" class="small-btn" onClick={() => app.runExactNow()}>
              Run again
            </button>
          </Match>
          <Match when={app.exact().status === "failed" && app.exact()}>
            {(s) => <span class="chip warn">⚠ exact: {(s() as { message: string }).message}</span>}
          </Match>
          <Match when={app.exact().status === "off"}>exact: off</Match>
        </Switch>
      </span>
    </div>
  );
}
