/**
 * The Comparison panel: the glyph-style comparison table (core
 * glyphStyles.ts), with a button that adopts a row's glyphs. The heuristic
 * figures come at once; "Exact" runs the optimizer on every row in the
 * worker, row by row with its progress. Each row shows one figure with its
 * status, combined with every other run on the same glyph set (figures.ts),
 * so the row in use always agrees with the result line, and exact results
 * survive adopting a row.
 */
import { createEffect, createMemo, createSignal, For, on, onCleanup, Show } from "solid-js";
import { rowKey, type GlyphStyleRow } from "../../core/compare/glyphStyles.ts";
import { segmentsOfString } from "../../core/glyphs/glyphs.ts";
import type { Project } from "../../core/project/project.ts";
import { app } from "../state/appState.ts";
import { combineFigures, tableCaption, type Figure } from "../state/figures.ts";
import { CellFigure } from "./CellFigure.tsx";
import { setGlyph } from "../state/draftEdits.ts";
import { draftFromProject } from "../state/draft.ts";
import { analysis } from "../workers/analysisClient.ts";
import { ExactRunner } from "../workers/exactRun.ts";

interface TableRow {
  readonly glyphs: Readonly<Record<string, string>>;
  readonly key: string;
  /** The heuristic's figure for the row. */
  readonly figure: Figure;
}

interface Table {
  readonly project: Project;
  readonly rows: readonly TableRow[];
}

/** The exact comparison in progress: which row, and its best and bound so far. */
interface Running {
  readonly key: string | null;
  readonly index: number;
  readonly total: number;
  readonly best: number | null;
  readonly bound: number | null;
  readonly startedAtMs: number;
}

export function ComparisonPanel() {
  const [table, setTable] = createSignal<Table | null>(null);
  const [running, setRunning] = createSignal<Running | null>(null);
  const [error, setError] = createSignal<string | null>(null);
  const [now, setNow] = createSignal(performance.now());
  const runner = new ExactRunner();
  let timer: ReturnType<typeof setTimeout> | undefined;
  const tick = setInterval(() => running() && setNow(performance.now()), 500);
  onCleanup(() => (runner.cancel(), clearInterval(tick)));

  // Once the live result is final: the comparison's syntheses would only slow the heuristic still running.
  const settledProject = createMemo(() => (app.liveBusy() ? undefined : app.live()?.project));
  createEffect(
    on(settledProject, (project) => {
      clearTimeout(timer);
      runner.cancel();
      setRunning(null);
      if (!project) return;
      // In the analysis worker, once typing settles: the comparison runs several syntheses.
      timer = setTimeout(async () => {
        const r = (await analysis.request<"compare">({ job: "compare", project: draftFromProject(project) })).result;
        if (app.live()?.project !== project) return;
        if (r.ok) {
          setTable({ project, rows: r.value.map((row) => tableRow(project, row)) });
          setError(null);
        } else setError(r.error.message);
      }, 250);
    }),
  );

  const runExact = () => {
    const project = app.live()?.project;
    if (!project) return;
    setError(null);
    setRunning({ key: null, index: 0, total: table()?.rows.length ?? 0, best: null, bound: null, startedAtMs: performance.now() });
    const known = app.provenRows().map(([key, f]): [string, GlyphStyleRow] => [key, { glyphs: {}, ...f, optimal: true }]);
    runner.start(
      draftFromProject(project),
      {
        rowStart: (s) =>
          setRunning({ key: s.key, index: s.index, total: s.total, best: null, bound: null, startedAtMs: performance.now() }),
        progress: (p) => setRunning((r) => (r ? { ...r, best: p.best ?? r.best, bound: p.bound ?? r.bound } : r)),
        row: (d) => {
          if (d.matrix !== undefined)
            app.remember(d.key, { figure: { count: d.row.count, lowerBound: d.row.lowerBound, status: d.row.status }, matrix: d.matrix });
        },
        done: () => {},
        compared: () => setRunning(null),
        failed: (message) => {
          setRunning(null);
          setError(message);
        },
      },
      { job: "compare", known },
    );
  };

  /** The table belongs to the project on screen; otherwise it is stale and cannot be adopted from. */
  const fresh = () => table() !== null && table()?.project === app.live()?.project;
  const current = (row: TableRow) => {
    const p = app.live()?.project;
    return !!p && Object.entries(row.glyphs).every(([ch, lit]) => (p.glyphs[ch] ?? []).join("") === segmentsOfString(lit).join(""));
  };
  /** A row's one figure: its own, every run's on the same glyph set, and the result line's when it is the row in use. */
  const figureOf = (row: TableRow): Figure =>
    combineFigures([row.figure, app.knownFigure(row.key), fresh() && current(row) ? app.headerFigure() : null]) ?? row.figure;
  const shown = createMemo(() => {
    const t = table();
    if (!t) return [];
    const rows = t.rows.map((row) => ({ row, figure: figureOf(row) }));
    return rows.sort((a, b) => a.figure.count - b.figure.count || (b.figure.lowerBound ?? -1) - (a.figure.lowerBound ?? -1));
  });
  const adopt = (row: TableRow) =>
    app.edit((d) => Object.entries(row.glyphs).reduce((x, [ch, lit]) => setGlyph(x, ch, segmentsOfString(lit)), d));

  return (
    <section class="panel" aria-labelledby="compare-h" data-testid="comparison">
      <div class="panel-head">
        <h2 id="compare-h">Comparison</h2>
        <Show when={table()}>
          <span class="muted small" data-testid="comparison-caption">
            {tableCaption(shown().map((r) => r.figure.status))}
          </span>
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
          when={running()}
          fallback={
            <button type="button" class="small-btn" onClick={runExact} disabled={!fresh() || table()?.rows.length === 0}>
              Exact
            </button>
          }
        >
          {(r) => (
            <>
              <span class="muted small" data-testid="comparison-progress">
                <span class="spinner" aria-hidden="true" /> exact: row {r().index + 1} of {r().total}
              </span>
              <button type="button" class="small-btn" onClick={() => (runner.cancel(), setRunning(null))}>
                Cancel exact
              </button>
            </>
          )}
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
                  <th>Status</th>
                  <th>Bound</th>
                  <th />
                </tr>
              </thead>
              <tbody>
                <For each={shown()}>
                  {(item, i) => {
                    const working = () => running()?.key === item.row.key;
                    return (
                      <tr class={fresh() && current(item.row) ? "is-current" : ""} data-key-index={i()}>
                        <td class="glyph-cells">
                          <For each={Object.entries(item.row.glyphs)}>
                            {([ch, lit]) => (
                              <span class="glyph-pair" title={`${ch} = ${lit}`}>
                                <CellFigure kind="seg7" segments={[]} lit={segmentsOfString(lit)} height={24} />
                                <code>{lit}</code>
                              </span>
                            )}
                          </For>
                        </td>
                        <td>
                          <strong data-testid="row-count">{item.figure.count}</strong>
                          {i() === 0 ? " ★ best" : ""}
                        </td>
                        <td data-testid="row-status" data-status={working() ? "working" : item.figure.status}>
                          <Show when={working()} fallback={item.figure.status}>
                            <span class="spinner" aria-hidden="true" /> working: best {running()?.best ?? "–"}, bound{" "}
                            {running()?.bound ?? "–"}, {Math.max(0, Math.floor((now() - (running()?.startedAtMs ?? now())) / 1000))} s
                          </Show>
                        </td>
                        <td>{item.figure.lowerBound ?? "–"}</td>
                        <td>
                          <Show when={fresh() && !current(item.row)} fallback={<span class="muted small">{fresh() ? "in use" : "–"}</span>}>
                            <button type="button" class="small-btn" onClick={() => adopt(item.row)} data-testid={`adopt-${i()}`}>
                              Adopt
                            </button>
                          </Show>
                        </td>
                      </tr>
                    );
                  }}
                </For>
              </tbody>
            </table>
          </Show>
        )}
      </Show>
    </section>
  );
}

/** A row of the heuristic comparison with its glyph-set key. */
function tableRow(project: Project, row: GlyphStyleRow): TableRow {
  return {
    glyphs: row.glyphs,
    key: rowKey(project, row.glyphs),
    figure: { count: row.count, lowerBound: row.lowerBound, status: row.status },
  };
}
