/**
 * The Comparison panel: the glyph-style comparison table (core
 * glyphStyles.ts), with a button that adopts a row's glyphs. The heuristic
 * counts come at once; "Exact" runs the optimizer on every row in the worker.
 */
import { createEffect, createSignal, For, on, onCleanup, Show } from "solid-js";
import type { GlyphStyleRow } from "../../core/compare/glyphStyles.ts";
import { segmentsOfString } from "../../core/glyphs/glyphs.ts";
import type { Project } from "../../core/project/project.ts";
import { app } from "../state/appState.ts";
import { CellFigure } from "./CellFigure.tsx";
import { setGlyph } from "../state/draftEdits.ts";
import { draftFromProject } from "../state/draft.ts";
import { analysis } from "../workers/analysisClient.ts";
import { ExactRunner } from "../workers/exactRun.ts";

interface Table {
  readonly project: Project;
  readonly rows: readonly GlyphStyleRow[];
  readonly method: "heuristic" | "exact";
}

export function ComparisonPanel() {
  const [table, setTable] = createSignal<Table | null>(null);
  const [running, setRunning] = createSignal(false);
  const [error, setError] = createSignal<string | null>(null);
  const runner = new ExactRunner();
  let timer: ReturnType<typeof setTimeout> | undefined;
  onCleanup(() => runner.cancel());

  createEffect(
    on(
      // Once the live result is final: the comparison's syntheses would only slow the heuristic still running.
      () => (app.liveBusy() ? undefined : app.live()?.project),
      (project) => {
        clearTimeout(timer);
        runner.cancel();
        setRunning(false);
        if (!project) return;
        // In the analysis worker, once typing settles: the comparison runs several syntheses.
        timer = setTimeout(async () => {
          const r = (await analysis.request<"compare">({ job: "compare", project: draftFromProject(project) })).result;
          if (app.live()?.project !== project) return;
          if (r.ok) {
            setTable({ project, rows: r.value, method: "heuristic" });
            setError(null);
          } else setError(r.error.message);
        }, 250);
      },
    ),
  );

  const runExact = () => {
    const project = app.live()?.project;
    if (!project) return;
    setRunning(true);
    runner.start(
      draftFromProject(project),
      {
        progress: () => {},
        done: () => {},
        compared: (rows) => {
          setRunning(false);
          if (app.live()?.project === project) setTable({ project, rows, method: "exact" });
        },
        failed: (message) => {
          setRunning(false);
          setError(message);
        },
      },
      "compare",
    );
  };

  /** The table belongs to the project on screen; otherwise it is stale and cannot be adopted from. */
  const fresh = () => table() !== null && table()?.project === app.live()?.project;
  const current = (row: GlyphStyleRow) => {
    const p = app.live()?.project;
    return !!p && Object.entries(row.glyphs).every(([ch, lit]) => (p.glyphs[ch] ?? []).join("") === segmentsOfString(lit).join(""));
  };
  const adopt = (row: GlyphStyleRow) =>
    app.edit((d) => Object.entries(row.glyphs).reduce((x, [ch, lit]) => setGlyph(x, ch, segmentsOfString(lit)), d));

  return (
    <section class="panel" aria-labelledby="compare-h" data-testid="comparison">
      <div class="panel-head">
        <h2 id="compare-h">Comparison</h2>
        <Show when={table()}>
          <span class="muted small">{table()?.method} counts</span>
        </Show>
        <Show when={app.stale() && fresh()}>
          <span class="chip stale">↻ stale: from the last valid project</span>
        </Show>
        <Show when={table() && !fresh()}>
          <span class="chip stale" data-testid="comparison-stale">
            ↻ stale, updating
          </span>
        </Show>
        <Show
          when={!running()}
          fallback={
            <button type="button" class="small-btn" onClick={() => (runner.cancel(), setRunning(false))}>
              <span class="spinner" aria-hidden="true" /> Cancel exact
            </button>
          }
        >
          <button type="button" class="small-btn" onClick={runExact} disabled={!fresh() || table()?.rows.length === 0}>
            Exact
          </button>
        </Show>
      </div>
      <Show when={error()}>
        <p class="chip warn">⚠ {error()}</p>
      </Show>
      <Show when={table()} fallback={<p class="muted">Working…</p>}>
        {(t) => (
          <Show
            when={t().rows.length > 1 || Object.keys(t().rows[0]?.glyphs ?? {}).length > 0}
            fallback={<p class="muted">The texts use no character with built-in variants (6, 7, 9 on seven-segment cells).</p>}
          >
            <table class="mini-table compare-table">
              <thead>
                <tr>
                  <th>Glyphs</th>
                  <th>Diodes</th>
                  <th>Bound</th>
                  <th />
                </tr>
              </thead>
              <tbody>
                <For each={t().rows}>
                  {(row, i) => (
                    <tr class={fresh() && current(row) ? "is-current" : ""}>
                      <td class="glyph-cells">
                        <For each={Object.entries(row.glyphs)}>
                          {([ch, lit]) => (
                            <span class="glyph-pair" title={`${ch} = ${lit}`}>
                              <CellFigure kind="seg7" segments={[]} lit={segmentsOfString(lit)} height={24} />
                              <code>{lit}</code>
                            </span>
                          )}
                        </For>
                      </td>
                      <td>
                        <strong>{row.count}</strong>
                        {i() === 0 ? " ★ best" : ""}
                      </td>
                      <td>{row.optimal ? "= min" : (row.lowerBound ?? "–")}</td>
                      <td>
                        <Show when={fresh() && !current(row)} fallback={<span class="muted small">{fresh() ? "in use" : "–"}</span>}>
                          <button type="button" class="small-btn" onClick={() => adopt(row)} data-testid={`adopt-${i()}`}>
                            Adopt
                          </button>
                        </Show>
                      </td>
                    </tr>
                  )}
                </For>
              </tbody>
            </table>
          </Show>
        )}
      </Show>
    </section>
  );
}
