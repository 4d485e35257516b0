/**
 * The app's state as Solid signals: the undo history of drafts, the
 * validated project, the live result and its drawing, the exact run, the
 * saved copies, and messages for the person. Components read these and call
 * the actions. Every solve and layout runs in a worker with a deadline
 * (src/ui/workers), so the page answers at any project size; the page itself
 * only validates drafts and verifies the matrices it is sent.
 */
import { batch, createEffect, createMemo, createRoot, createSignal, on } from "solid-js";
import type { BudgetFailure } from "../../core/budget/budget.ts";
import type { Budget } from "../../core/budget/budgetTypes.ts";
import type { TrimMode } from "../../core/budget/segmentDesign.ts";
import { darkOutputs, type VerifiedMatrix } from "../../core/matrix/matrix.ts";
import { paperDarkValues } from "../../render/papers.ts";
import type { Result } from "../../core/result/result.ts";
import type { PaperName } from "../../render/drawingModel.ts";
import type { MatrixDrawing } from "../../render/layout.ts";
import type { Project } from "../../core/project/project.ts";
import { compileSpec } from "../../core/spec/decodeSpec.ts";
import { isPaper, type DrawingOptions } from "../../render/drawingOptions.ts";
import { readTitleFields, titleOptions, writeTitleFields, type TitleFields } from "./titleBlock.ts";
import { synthSettings } from "../../core/synth/synthesize.ts";
import { validateProject } from "../../core/project/projectSchema.ts";
import { parseInstrument, parseInstrumentBytes, validateInstrument, type Instrument } from "../../core/project/instrument.ts";
import type { Problem } from "../../core/result/result.ts";
import { fileProblemLine } from "./problemWords.ts";
import { projectKey, readAutosave, writeAutosave, type KeyValueStore, type StoreFailure } from "./autosave.ts";
import { draftFromProject, type Draft } from "./draft.ts";
import {
  instrumentData,
  instrumentDraftOf,
  instrumentToJson,
  plainInstrument,
  projectInstrumentDraft,
  putDecoderDraft,
  type InstrumentDraft,
} from "./instrumentDraft.ts";
import { onlyElectricalChanged, sameSynthesisInput } from "./electricalForm.ts";
import { downloadText, fileStem } from "../files/download.ts";
import { pageStore, sessionPageStore } from "./pageStore.ts";
import { readUndo, writeUndo } from "./undoStore.ts";
import { keepCurrentProject, readRecent, type RecentProject } from "./recentProjects.ts";
import { decodeShareHash, isShareHash } from "./shareLink.ts";
import { loadExample, newProject, type ShippedExample } from "./examples.ts";
import type { TwoRankFigures, WorkerFailure } from "../workers/analysisProtocol.ts";
import type { SynthFailure } from "../../core/synth/synthesize.ts";
import { LiveRunner } from "../workers/liveRun.ts";
import { ExactRunner } from "../workers/exactRun.ts";
import { analysis } from "../workers/analysisClient.ts";
import { acceptMatrix, withMatrix, type LiveResult } from "../workers/liveResult.ts";
import { canRedo, canUndo, record, redo, seal, startHistory, undo, type UndoHistory } from "./undoHistory.ts";
import { rowKey } from "../../core/compare/glyphStyles.ts";
import type { ExactState } from "./exactStatus.ts";
import { matrixFigure, shownFigure, type Figure } from "./figures.ts";
import { KnownResults, type KnownResult } from "./knownResults.ts";
import { SummaryRunner, type DecoderSummary, type InstrumentSummary, type SummaryWant } from "../workers/summaryRun.ts";

export type { ExactState } from "./exactStatus.ts";

export interface Notice {
  readonly level: "info" | "warn" | "danger";
  readonly title: string;
  readonly lines: readonly string[];
  /** A button beside the message, e.g. to download the project when it cannot be saved. */
  readonly action?: { readonly label: string; run(): void };
}

/** Wait after the last edit of an instrument before its summary is worked out again, milliseconds. */
const SUMMARY_DELAY_MS = 600;
/** Time a decoder's summary may take beyond its own time limit, milliseconds. */
const SUMMARY_GRACE_MS = 30_000;
/** Wait after the last edit before the exact optimizer starts, milliseconds. */
const EXACT_DELAY_MS = 500;
/** Wait after a change of the undo history before it is written for a reload, milliseconds. */
const UNDO_WRITE_DELAY_MS = 200;
/** Wait after a result before the budget is asked for (typing settles first), milliseconds. */
const BUDGET_DELAY_MS = 150;
/**
 * Time the exact run may take beyond its own limit and the heuristic it
 * starts with, before the page stops it, milliseconds.
 */
const EXACT_GRACE_MS = 10_000;

export interface BudgetView {
  /** The result the budget belongs to; it is stale when the shown result differs. */
  readonly forResult: LiveResult;
  /** The trim setting it was solved with; it is stale when the setting differs. */
  readonly trim: TrimMode;
  readonly result: Result<Budget, BudgetFailure | WorkerFailure>;
}

function createAppState() {
  const [history, setHistory] = createSignal<UndoHistory<InstrumentDraft>>(startHistory(placeholderDraft()));
  /** The whole project: every decoder and the shared electrical section. */
  const instrument = createMemo(() => history().present);
  const [selectedSignal, setSelected] = createSignal(0);
  /** The decoder open in the panels (0-based), within the decoders there are. */
  const selected = createMemo(() => Math.max(0, Math.min(instrument().decoders.length - 1, selectedSignal())));
  /** The selected decoder as a single-decoder draft: what every panel shows and edits. */
  const draft = createMemo(() => (instrument().decoders[selected()] ?? instrument().decoders[0])!.draft);
  const validation = createMemo(() => validateProject(draft()));
  /** The whole instrument checked by the core (names, every decoder); it is saved only when this validates. */
  const instrumentValidation = createMemo(() => validateInstrument(instrumentData(instrument())));
  /** Problems of the current draft, empty when it validates. */
  const problems = createMemo<readonly Problem[]>(() => {
    const v = validation();
    return v.ok ? [] : v.error;
  });

  const [live, setLive] = createSignal<LiveResult | null>(null);
  /** The draft the shown result was computed from; the result is stale when it differs. */
  const [liveDraft, setLiveDraft] = createSignal<Draft | null>(null);
  const [liveError, setLiveError] = createSignal<string | null>(null);
  const [liveMs, setLiveMs] = createSignal<number | null>(null);
  /** Counts the results shown, so a test can tell that a new one arrived. */
  const [livePass, setLivePass] = createSignal(0);
  /** Time from the last edit to the first figure on screen (the direct matrix's or the heuristic's), milliseconds. */
  const [firstMs, setFirstMs] = createSignal<number | null>(null);
  /** Counts the first figures shown, one per edit, so a test can tell that a new one arrived. */
  const [firstPass, setFirstPass] = createSignal(0);
  /** Counts the synthesis runs started (an electrical edit starts none), so a test can tell. */
  const [synthRuns, setSynthRuns] = createSignal(0);
  const [exact, setExact] = createSignal<ExactState>({ status: "idle" });
  const [exactEnabled, setExactEnabled] = createSignal(true);
  /** A run of the live worker has not given its final answer yet. */
  const [liveBusy, setLiveBusy] = createSignal(false);
  /** Why the shown result is not the heuristic's (its deadline passed), or null. */
  const [liveNote, setLiveNote] = createSignal<string | null>(null);
  const [notice, setNotice] = createSignal<Notice | null>(null);
  const [ready, setReady] = createSignal(false);
  const store = pageStore();
  /** The tab's session storage: the undo history over a reload (undoStore.ts). */
  const sessionStore = sessionPageStore();
  /** The project the autosave last wrote (its projectKey), which the stored undo history is tied to. */
  let savedKey: string | null = null;
  let undoTimer: ReturnType<typeof setTimeout> | undefined;
  /** Writes the undo history for a reload; on every change, a moment later, and at once when the page goes. */
  function keepHistory(): void {
    clearTimeout(undoTimer);
    if (persist && savedKey !== null && ready()) writeUndo(sessionStore, history(), savedKey);
  }
  createEffect(
    on(history, () => {
      clearTimeout(undoTimer);
      // When the page is idle, so the write never holds up a result on its way to the screen.
      undoTimer = setTimeout(
        () => (typeof requestIdleCallback === "function" ? requestIdleCallback(keepHistory, { timeout: 2000 }) : keepHistory()),
        UNDO_WRITE_DELAY_MS,
      );
    }),
  );
  if (typeof window !== "undefined") window.addEventListener("pagehide", keepHistory);
  const [paper, setPaperSignal] = createSignal<PaperName>(readPaper(store));
  /** Why the last autosave failed, or null while saving works. */
  const [saveProblem, setSaveProblem] = createSignal<StoreFailure | null>(null);
  const [recent, setRecent] = createSignal<readonly RecentProject[]>([]);
  const [budget, setBudget] = createSignal<BudgetView | null>(null);
  /** Whether the design takes the emitter-resistor trim (the Budget panel's control); every paper follows it. */
  const [trimMode, setTrimMode] = createSignal<TrimMode>("auto");

  /**
   * The instrument summary: every decoder's matrix, budget and parts in a
   * worker of its own, kept by decoder (summaryRun.ts). A plain project has
   * none: its figures are the result line's and the Budget panel's.
   */
  const [summaryVersion, setSummaryVersion] = createSignal(0);
  const summaryRunner = new SummaryRunner(() => setSummaryVersion((n) => n + 1));
  const summaryWant = createMemo<SummaryWant>(() => {
    const trim = trimMode();
    const inst = instrument();
    return {
      title: inst.title,
      decoders: inst.decoders.map((d) => ({
        // The title comes from the instrument's and changes no figure.
        key: JSON.stringify([{ ...d.draft, title: "" }, trim]),
        name: d.name,
        project: d.draft,
        trim,
        deadlineMs: d.draft.synthesis.timeLimitMs + SUMMARY_GRACE_MS,
      })),
    };
  });
  let summaryTimer: ReturnType<typeof setTimeout> | undefined;
  createEffect(
    on(summaryWant, (w) => {
      clearTimeout(summaryTimer);
      if (w.decoders.length < 2) return summaryRunner.want({ title: w.title, decoders: [] });
      summaryTimer = setTimeout(() => summaryRunner.want(w), SUMMARY_DELAY_MS);
    }),
  );
  /** What is known of each decoder, in the list's order; empty for a plain project. */
  const summary = createMemo<readonly DecoderSummary[]>(() => {
    summaryVersion();
    const w = summaryWant();
    return w.decoders.length < 2 ? [] : w.decoders.map((d) => summaryRunner.get(d.key));
  });
  /** The instrument's budget (every decoder's worst state, summed, at nominal and both corners), as far as it is known. */
  const instrumentSummary = createMemo<InstrumentSummary>(() => {
    summaryVersion();
    return summaryRunner.instrument(summaryWant());
  });
  /** The title-block fields the person filled in (titleBlock.ts). */
  const [titleFields, setTitleFieldsSignal] = createSignal<TitleFields>(readTitleFields(store));
  /** Paper and title block, as every drawing is laid out; compared by value. */
  const drawingChoice = createMemo<Partial<DrawingOptions>>(
    () => ({ paper: paper(), ...titleOptions(titleFields()) }),
    { paper: "a4" },
    {
      equals: (a, b) => JSON.stringify(a) === JSON.stringify(b),
    },
  );
  /**
   * The drawing on screen, laid out (in a worker) for the screen, the print
   * view and the exports, and the result it belongs to: for a moment after an
   * edit it is still the previous result's, while the new one's is laid out.
   */
  const [laid, setLaid] = createSignal<{ readonly drawing: MatrixDrawing; readonly of: LiveResult } | null>(null);
  let budgetTimer: ReturnType<typeof setTimeout> | undefined;
  /** A coded counter's two-rank decoder, for the project it was worked out for (its JSON). */
  const [twoRank, setTwoRank] = createSignal<{
    readonly key: string;
    readonly result: Result<TwoRankFigures, SynthFailure | WorkerFailure>;
  } | null>(null);
  let twoRankKey: string | null = null;
  /** Results already worked out, by glyph set; `knownVersion` counts their changes for the screen. */
  const known = new KnownResults();
  const [knownVersion, setKnownVersion] = createSignal(0);
  function remember(key: string, result: KnownResult): void {
    if (known.remember(key, result)) setKnownVersion((n) => n + 1);
  }
  /** The glyph-set key of the shown result's project. */
  const liveKey = createMemo(() => {
    const r = live();
    return r ? rowKey(r.project) : null;
  });
  /** The figure of the shown matrix, with the best bound any run found for its glyph set. */
  const headerFigure = createMemo<Figure | null>(() => {
    knownVersion();
    const r = live();
    const key = liveKey();
    if (!r || key === null) return null;
    return shownFigure(matrixFigure(r.matrix), known.get(key)?.figure);
  });

  /**
   * Shows a result with its drawing and, when it is final (not the direct
   * matrix shown while the heuristic still works), schedules its budget.
   * Without a drawing (a direct matrix, whose drawing follows) the previous
   * one stays on screen, marked as not yet this result's. A drawing laid out
   * for other choices than the paper and title block chosen now is laid out
   * again.
   */
  function show(r: LiveResult, laidOut: LaidOut | null, final = true): void {
    batch(() => {
      setLive(r);
      if (laidOut) setLaid({ drawing: laidOut.drawing, of: r });
    });
    if (final) scheduleBudget(r);
    if (final && r.spec.counter.kind !== "one-hot") void requestTwoRank(r.project);
    if (laidOut && JSON.stringify(laidOut.choice) !== JSON.stringify(drawingChoice())) void relayout(r);
  }

  /** Asks the worker for a coded project's two-rank decoder, once per project. */
  async function requestTwoRank(project: Project): Promise<void> {
    const key = JSON.stringify(draftFromProject(project));
    if (key === twoRankKey) return;
    twoRankKey = key;
    const reply = await analysis.request<"two-rank">({ job: "two-rank", project: draftFromProject(project) });
    if (twoRankKey === key) setTwoRank({ key, result: reply.result });
  }

  /**
   * Lays out the shown result again, for the paper and title block chosen
   * now and, once its budget has sized the dark-decoded outputs' network,
   * with those values (the exports' and the BOM's).
   */
  async function relayout(r: LiveResult): Promise<void> {
    const choice = drawingChoice();
    const b = budget();
    const darkValues =
      b !== null && b.forResult === r ? paperDarkValues({ project: r.project, spec: r.spec, budget: b.result }) : undefined;
    const reply = await analysis.request<"layout">({
      job: "layout",
      project: draftFromProject(r.project),
      matrix: r.matrix,
      drawing: choice,
      ...(darkValues === undefined ? {} : { darkValues }),
    });
    if (live() !== r || drawingChoice() !== choice) return;
    if (reply.result.ok) setLaid({ drawing: reply.result.value, of: r });
    else setLiveNote(`the drawing could not be made: ${reply.result.error.message}`);
  }

  /** Asks the worker for the budget of a result with the current trim setting. */
  function scheduleBudget(r: LiveResult): void {
    clearTimeout(budgetTimer);
    budgetTimer = setTimeout(async () => {
      const trim = trimMode();
      if (live() !== r) return;
      const reply = await analysis.request<"budget">({ job: "budget", project: draftFromProject(r.project), matrix: r.matrix, trim });
      if (live() === r && trimMode() === trim) {
        setBudget({ forResult: r, trim, result: reply.result });
        // The drawing prints the values the budget sized for the dark-decoded outputs' network.
        if (darkOutputs(r.matrix).length > 0) void relayout(r);
      }
    }, BUDGET_DELAY_MS);
  }

  const stale = createMemo(() => live() !== null && liveDraft() !== draft());
  const runner = new ExactRunner();
  const liveRunner = new LiveRunner();
  let exactTimer: ReturnType<typeof setTimeout> | undefined;
  let pass = 0;
  let editStartedAt = 0;
  /** Time the last live run took to its final answer, milliseconds (the exact run repeats that work first). */
  let liveRunMs = 0;
  /** Ends the wait of the previous recompute() when a newer one supersedes it. */
  let settlePending: (() => void) | null = null;

  /**
   * Recomputes the live result for the current draft (called after every
   * change): saves a valid draft, then sends it to the live worker. Resolves
   * once a result (or a message) is on screen, or a newer change superseded it.
   */
  function recompute(): Promise<void> {
    settlePending?.();
    settlePending = null;
    const d = draft();
    const v = validation();
    const mine = ++pass;
    const shown = live();
    const before = liveDraft();
    if (v.ok && shown && before && !liveBusy() && onlyElectricalChanged(before, d)) {
      rebudget(v.value, d, shown);
      return Promise.resolve();
    }
    cancelExact(false);
    // The budget and comparison of the result now stale would only slow the next one down.
    clearTimeout(budgetTimer);
    analysis.cancel("budget");
    analysis.cancel("compare");
    if (!v.ok) {
      liveRunner.cancel();
      setLiveBusy(false);
      return Promise.resolve();
    }
    const project = v.value;
    if (persist) saveInstrument();
    const spec = compileSpec(project);
    const settings = synthSettings(project, { mode: "fast" });
    const startedAt = performance.now();
    const sentChoice = drawingChoice();
    setLiveBusy(true);
    return new Promise<void>((resolve) => {
      settlePending = resolve;
      let first = true;
      const settle = (final: boolean, update: () => void) => {
        if (mine !== pass) return resolve();
        batch(() => {
          update();
          setLiveDraft(d);
          if (first) {
            first = false;
            setFirstMs(performance.now() - editStartedAt);
            setFirstPass((n) => n + 1);
          }
          if (final) {
            setLiveBusy(false);
            setLiveMs(performance.now() - editStartedAt);
            setLivePass((n) => n + 1);
          }
        });
        resolve();
      };
      setSynthRuns((n) => n + 1);
      liveRunner.start(draftFromProject(project), sentChoice, project.synthesis.timeLimitMs, {
        drawing: (drawing) => {
          // The direct matrix's drawing, after its figure.
          const shown = live();
          if (mine !== pass || !shown || shown.matrix.method !== "direct") return;
          setLaid({ drawing, of: shown });
          if (JSON.stringify(sentChoice) !== JSON.stringify(drawingChoice())) void relayout(shown);
        },
        matrix: (reply, final) => {
          const checked = acceptMatrix(spec, settings, reply.matrix);
          settle(final, () => {
            if (!checked.ok) {
              setLiveError(`internal error: the live worker's matrix failed verification and is not shown: ${checked.error[0] ?? ""}`);
              return;
            }
            show(
              withMatrix(project, spec, settings, checked.value),
              reply.drawing ? { drawing: reply.drawing, choice: sentChoice } : null,
              final,
            );
            setLiveError(null);
            setLiveNote(null);
          });
          if (final && checked.ok && mine === pass) {
            liveRunMs = performance.now() - startedAt;
            if (!showKnown(d, project)) scheduleExact(d, project);
          }
        },
        failed: (message) => settle(true, () => setLiveError(message)),
        deadline: () =>
          settle(true, () => {
            setLiveNote(
              `the heuristic did not finish within the ${Math.round(project.synthesis.timeLimitMs / 1000)} s limit, so this is the direct matrix (one diode per lit cell)`,
            );
            // The direct matrix is the final result now: its budget follows, and its drawing if it had not come.
            const shown = live();
            if (shown) scheduleBudget(shown);
            if (shown && laid()?.of !== shown) void relayout(shown);
          }),
      });
    });
  }

  /**
   * An edit of the electrical section alone: the matrix stays (the synthesis
   * reads no electrical value), the budget is worked out again, and the
   * drawing, whose notes name the diode ratings and the tie-on supply, is
   * laid out again. The exact run, which looks for a smaller matrix of the
   * same glyphs, goes on.
   */
  function rebudget(project: Project, d: Draft, shown: LiveResult): void {
    if (persist) saveInstrument();
    clearTimeout(budgetTimer);
    analysis.cancel("budget");
    const r = withMatrix(project, shown.spec, shown.settings, shown.matrix);
    batch(() => {
      setLive(r);
      setLiveDraft(d);
    });
    scheduleBudget(r);
    void relayout(r);
  }

  /** Saves the instrument when every decoder validates (else the last good copy stays). */
  function saveInstrument(): void {
    const v = instrumentValidation();
    if (v.ok) save(v.value);
  }

  /** Saves a valid project; says so at once when the browser refuses, with the project to download. */
  function save(project: Instrument): void {
    const w = writeAutosave(store, project);
    if (w.ok) savedKey = projectKey(project);
    if (!w.ok) {
      const first = saveProblem() === null;
      setSaveProblem({ reason: w.reason, message: w.message });
      if (first) setNotice(saveFailedNotice(w.message));
      return;
    }
    if (saveProblem() !== null) {
      setSaveProblem(null);
      if (notice()?.title === SAVE_FAILED_TITLE) setNotice(null);
    }
    if (w.notes.length > 0) setNotice({ level: "warn", title: "Autosave", lines: w.notes });
  }

  function saveFailedNotice(message: string): Notice {
    return {
      level: "danger",
      title: SAVE_FAILED_TITLE,
      lines: [`${message}.`, "Your edits stay on screen until you close or reload the page: download the project to keep them."],
      action: { label: "Download project", run: () => downloadDraft(instrument()) },
    };
  }

  /**
   * Before another project replaces the one on screen (a share link, a file,
   * a recent project): keeps the person's saved project in the recent list.
   */
  function keepOutgoing(incoming: Instrument): void {
    if (!persist) return;
    const r = keepCurrentProject(store, incoming);
    if (!r.ok) {
      const kept = r.kept;
      setNotice({
        level: "danger",
        title: `"${kept.title}" could not be kept in Recent projects`,
        lines: [`${r.message}.`, "Download it now to keep a copy."],
        action: { label: "Download it", run: () => downloadDraft(instrumentDraftOf(kept)) },
      });
    }
    setRecent(readRecent(store));
  }

  let persist = true;

  function scheduleExact(d: Draft, project: Project): void {
    clearTimeout(exactTimer);
    if (!exactEnabled()) {
      setExact({ status: "off" });
      return;
    }
    exactTimer = setTimeout(() => startExact(d, project), EXACT_DELAY_MS);
  }

  function startExact(d: Draft, project: Project): void {
    if (!sameSynthesisInput(draft(), d)) return;
    const base = live();
    if (!base) return;
    setExact({
      status: "running",
      progress: { best: base.matrix.count, bound: base.matrix.lowerBound, elapsedS: 0 },
      startedAtMs: performance.now(),
    });
    const deadlineMs = project.synthesis.timeLimitMs + liveRunMs + EXACT_GRACE_MS;
    runner.start(
      draftFromProject(project),
      {
        progress: (p) => {
          const s = exact();
          if (s.status === "running")
            setExact({ ...s, progress: { ...p, best: p.best ?? s.progress.best, bound: p.bound ?? s.progress.bound } });
        },
        done: (m) => {
          const current = live();
          if (!sameSynthesisInput(draft(), d) || !current) return;
          const checked = acceptMatrix(current.spec, current.settings, m);
          if (!checked.ok) {
            setExact({
              status: "failed",
              message: `the optimizer's matrix failed verification and is not shown: ${checked.error[0] ?? ""}`,
            });
            return;
          }
          remember(rowKey(current.project), { figure: matrixFigure(checked.value), matrix: checked.value });
          void adoptIfBetter(d, current, checked.value, false);
        },
        failed: (message) => setExact({ status: "failed", message }),
      },
      { job: "matrix", deadlineMs },
    );
  }

  /**
   * After the live result: when an earlier run (the project's exact run, a
   * comparison row) worked out this glyph set better, shows its matrix at
   * once (an exact run still follows when it is not proven). Returns false
   * when nothing better is known.
   */
  function showKnown(d: Draft, project: Project): boolean {
    const current = live();
    const key = liveKey();
    if (!current || key === null) return false;
    const entry = known.get(key);
    if (!entry || entry.figure.status === "heuristic" || entry.figure.count > current.matrix.count) return false;
    const checked = acceptMatrix(current.spec, current.settings, entry.matrix);
    if (!checked.ok || checked.value.method !== "exact") return false;
    void adoptIfBetter(d, current, checked.value, true).then(() => {
      if (!checked.value.optimal && sameSynthesisInput(draft(), d)) scheduleExact(d, project);
    });
    return true;
  }

  /**
   * Shows the exact matrix when it is no worse than the heuristic one (and so
   * carries the bound), together with its drawing once a worker has laid it out.
   */
  async function adoptIfBetter(d: Draft, current: LiveResult, m: VerifiedMatrix, reused: boolean): Promise<void> {
    const done: ExactState = {
      status: "done",
      improved: m.count < current.matrix.count,
      optimal: m.optimal,
      deadlineHit: m.deadlineHit,
      count: m.count,
      lowerBound: m.lowerBound,
      reused,
    };
    // The shown matrix stays when it is smaller; the line then gives its count with the exact run's bound.
    if (m.count > current.matrix.count) return void setExact({ ...done, count: current.matrix.count });
    const r = withMatrix(current.project, current.spec, current.settings, m);
    const choice = drawingChoice();
    const reply = await analysis.request<"layout">({
      job: "layout",
      project: draftFromProject(r.project),
      matrix: r.matrix,
      drawing: choice,
    });
    if (!sameSynthesisInput(draft(), d) || live() !== current) return;
    if (!reply.result.ok) setLiveNote(`the drawing could not be made: ${reply.result.error.message}`);
    show(r, reply.result.ok ? { drawing: reply.result.value, choice } : null);
    setExact(done);
  }

  function cancelExact(show = true): void {
    clearTimeout(exactTimer);
    const wasRunning = runner.running;
    runner.cancel();
    if (show && wasRunning) setExact({ status: "cancelled" });
    else if (!show) setExact({ status: exactEnabled() ? "idle" : "off" });
  }

  /** Applies an edit of the selected decoder. Edits with the same key in a row make one undo step (typing). */
  function edit(change: (d: Draft) => Draft, key: string | null = null): void {
    const next = change(draft());
    if (next === draft()) return;
    editInstrument((inst) => putDecoderDraft(inst, selected(), next), key);
  }

  /**
   * Applies an edit of the instrument (the decoder list), one undo step, and
   * opens decoder `select` in the panels when given.
   */
  function editInstrument(change: (i: InstrumentDraft) => InstrumentDraft, key: string | null = null, select?: number): void {
    const next = change(instrument());
    if (next === instrument() && (select === undefined || select === selected())) return;
    forgetShareHash();
    editStartedAt = performance.now();
    batch(() => {
      if (next !== instrument()) setHistory((h) => record(h, next, key));
      if (select !== undefined) setSelected(select);
    });
    void recompute();
  }

  /** Opens decoder `index` in the panels (not an edit: nothing to undo). */
  function selectDecoder(index: number): void {
    if (index === selected() || !instrument().decoders[index]) return;
    editStartedAt = performance.now();
    setSelected(index);
    void recompute();
  }

  /** Ends a typing run, so the next edit is its own undo step. */
  function sealEdit(): void {
    setHistory((h) => seal(h));
  }

  function doUndo(): void {
    if (!canUndo(history())) return;
    editStartedAt = performance.now();
    setHistory((h) => undo(h));
    void recompute();
  }

  function doRedo(): void {
    if (!canRedo(history())) return;
    editStartedAt = performance.now();
    setHistory((h) => redo(h));
    void recompute();
  }

  /** Replaces the project (opened file, share link, recent project); undoable, and the outgoing one stays in Recent. */
  function replaceProject(p: Instrument): void {
    keepOutgoing(p);
    editInstrument(() => instrumentDraftOf(p), null, 0);
    sealEdit();
  }

  /** Opens a share link (the page's hash); a bad one leaves the project as it is and says why. */
  async function openShareLink(hash: string): Promise<void> {
    if (!isShareHash(hash)) return;
    const r = await decodeShareHash(hash);
    if (!r.ok) setNotice(shareLinkNotice(r.error));
    else replaceProject(r.value);
  }

  /** Reopens a project from the recent list; the one on screen takes its place there. */
  function openRecent(index: number): void {
    const entry = recent()[index];
    if (!entry) return;
    replaceProject(entry.project);
    setNotice({ level: "info", title: `Opened "${entry.title}" from Recent projects`, lines: [] });
  }

  /**
   * Opens a shipped example, or a new project when `example` is null (the
   * New menu): like an opened file, undoable, with the person's project kept
   * under Recent.
   */
  async function openExample(example: ShippedExample | null): Promise<void> {
    if (example === null) {
      replaceProject(plainInstrument(newProject()));
      setNotice({ level: "info", title: "Started a new project; the one you had is under Recent", lines: [] });
      return;
    }
    const r = await loadExample(import.meta.env.BASE_URL, example);
    if (!r.ok) {
      setNotice({
        level: "danger",
        title: `The example ${example.file} was not opened; the project on screen is unchanged`,
        lines: r.error.map((p) => `${example.file}: ${fileProblemLine(p)}`),
      });
      return;
    }
    replaceProject(r.value);
    setNotice({ level: "info", title: `Opened the example "${r.value.title}"; the project you had is under Recent`, lines: [] });
  }

  /**
   * Opens project JSON, as text or as a file's bytes (read exactly as the
   * command line reads a file). A bad file leaves the open project as it
   * was and shows the same path-naming messages as the command line.
   */
  function openText(name: string, content: string | Uint8Array): boolean {
    const r = typeof content === "string" ? parseInstrument(content) : parseInstrumentBytes(content);
    if (!r.ok) {
      setNotice({
        level: "danger",
        title: `${name} was not opened; the project on screen is unchanged`,
        lines: r.error.map((p) => `${name}: ${fileProblemLine(p)}`),
      });
      return false;
    }
    replaceProject(r.value);
    setNotice({ level: "info", title: `Opened ${name}`, lines: [] });
    return true;
  }

  /**
   * Loads the first project: a share link, else the autosave, else the demo.
   * A shared project never takes the place of the person's own: that one is
   * kept in the recent list first.
   */
  async function boot(hash: string, demo: () => Promise<Instrument>): Promise<void> {
    const shared = isShareHash(hash) ? await decodeShareHash(hash) : null;
    const saved = readAutosave(store);
    let start: Instrument | null = null;
    if (shared && !shared.ok) setNotice(shareLinkNotice(shared.error));
    else if (shared) {
      start = shared.value;
      keepOutgoing(start);
    }
    if (saved.notes.length > 0 && !(shared && !shared.ok)) setNotice({ level: "warn", title: "Autosave", lines: saved.notes });
    setRecent(readRecent(store));
    // The undo history comes back with the person's own project, when it belongs to the one the autosave holds.
    const kept = !start && saved.found ? readUndo(sessionStore, projectKey(saved.project)) : null;
    if (saved.found) savedKey = projectKey(saved.project);
    if (!start && saved.found) start = saved.project;
    start ??= await demo();
    editStartedAt = performance.now();
    setHistory(kept ?? startHistory(instrumentDraftOf(start)));
    await recompute();
    setReady(true);
  }

  function setExactOn(on: boolean): void {
    setExactEnabled(on);
    const v = validation();
    if (!on) {
      cancelExact(false);
      setExact({ status: "off" });
    } else if (v.ok) scheduleExact(draft(), v.value);
  }

  return {
    history,
    /** The whole project: every decoder and the shared electrical section. */
    instrument,
    /** The decoder open in the panels, 0-based. */
    selected,
    selectDecoder,
    editInstrument,
    /** Problems of the whole instrument (a decoder's name, any decoder's fields), empty when it validates. */
    /** Each decoder's figures for the instrument summary, in the list's order; empty for a plain project. */
    summary,
    instrumentSummary,
    /** The whole instrument as the core reads it, or its problems. */
    instrumentValidation,
    instrumentProblems: () => {
      const v = instrumentValidation();
      return v.ok ? [] : v.error;
    },
    draft,
    validation,
    problems,
    live,
    /** The drawing on screen: the shown result's, or for a moment the previous result's (see `drawingCurrent`). */
    drawing: () => laid()?.drawing ?? null,
    /** True while the drawing on screen belongs to the shown result. */
    drawingCurrent: () => {
      const l = laid();
      return l !== null && l.of === live();
    },
    /** The shown matrix's figure with the best bound known for its glyph set. */
    headerFigure,
    /** The best figure known for a glyph set (a `rowKey`), from any run; reactive. */
    knownFigure: (key: string): Figure | undefined => {
      knownVersion();
      return known.get(key)?.figure;
    },
    /** Glyph sets already proven, for an exact comparison to skip. */
    provenRows: () => {
      knownVersion();
      return known.proven();
    },
    /** Keeps what a run found for a glyph set (a comparison row, for one). */
    remember,
    /** The two-rank decoder of the shown coded project, or undefined while it is being worked out. */
    twoRank: () => {
      const r = live();
      const t = twoRank();
      return r && t && t.key === JSON.stringify(draftFromProject(r.project)) ? t.result : undefined;
    },
    budget,
    budgetStale: () => budget() !== null && (budget()?.forResult !== live() || budget()?.trim !== trimMode()),
    /** The budget of the shown result with the current trim setting, or undefined while it is being worked out. */
    currentBudget: () => {
      const b = budget();
      return b && b.forResult === live() && b.trim === trimMode() ? b.result : undefined;
    },
    trimMode,
    setTrimMode: (mode: TrimMode) => {
      if (mode === trimMode()) return;
      setTrimMode(mode);
      const r = live();
      if (r) scheduleBudget(r);
    },
    paper,
    setPaper: (p: PaperName) => {
      if (p === paper()) return;
      setPaperSignal(p);
      const r = live();
      if (r) void relayout(r);
      try {
        store.setItem(PAPER_KEY, p);
      } catch {
        // A refused store only loses the preference.
      }
    },
    /** The title-block fields as typed (some may not check out yet). */
    titleFields,
    /** Sets the title-block fields; every drawing follows the ones that check out. */
    setTitleFields: (fields: TitleFields) => {
      const before = drawingChoice();
      setTitleFieldsSignal(fields);
      writeTitleFields(store, fields);
      const r = live();
      if (r && drawingChoice() !== before) void relayout(r);
    },
    /** Paper and title block, as every drawing and export is laid out. */
    drawingChoice,
    liveBusy,
    liveNote,
    saveProblem,
    recent,
    openRecent,
    openShareLink,
    /** Downloads the project on screen as a file (the Save button). */
    downloadProject: () => downloadDraft(instrument()),
    liveError,
    liveMs,
    livePass,
    firstMs,
    firstPass,
    synthRuns,
    stale,
    exact,
    exactEnabled,
    notice,
    ready,
    canUndo: () => canUndo(history()),
    canRedo: () => canRedo(history()),
    setNotice,
    edit,
    sealEdit,
    undo: doUndo,
    redo: doRedo,
    replaceProject,
    openText,
    openExample,
    boot,
    cancelExact: () => cancelExact(true),
    runExactNow: () => {
      const v = validation();
      if (v.ok) startExact(draft(), v.value);
    },
    setExactOn,
    /** For tests of a fresh start: stop writing the autosave. */
    setPersist: (on: boolean) => void (persist = on),
  };
}

const PAPER_KEY = "diodeloom.paper";

/**
 * Drops a share link from the address bar once the project is edited, so a
 * reload brings back the edited project (from the autosave), not the shared one.
 */
function forgetShareHash(): void {
  if (location.hash.startsWith("#p=")) history.replaceState(null, "", location.pathname + location.search);
}

function readPaper(store: KeyValueStore): PaperName {
  try {
    const stored = store.getItem(PAPER_KEY) ?? "";
    return isPaper(stored) ? stored : "a4";
  } catch {
    return "a4";
  }
}

const SAVE_FAILED_TITLE = "Your edits are not being saved in this browser";

/** The notice for a share link that cannot be read, the same at start and when the address changes. */
function shareLinkNotice(problems: readonly Problem[]): Notice {
  return {
    level: "warn",
    title: "The share link could not be read",
    lines: [...problems.map(fileProblemLine), "The project on screen is unchanged."],
  };
}

/** Saves the project (every decoder) as a file through the browser's download. */
function downloadDraft(d: InstrumentDraft): void {
  downloadText(`${fileStem(d.title)}.json`, instrumentToJson(d), "application/json");
}

/** A minimal valid draft to hold the place until the first project loads. */
function placeholderDraft(): InstrumentDraft {
  const r = validateProject({ schema: "diodeloom/project@2", title: "Loading", counter: { states: 2 }, display: {}, show: ["0", "1"] });
  if (!r.ok) throw new Error("bug: the placeholder project is invalid");
  return projectInstrumentDraft(r.value);
}

/** A drawing as laid out, with the paper and title block it was laid out for. */
interface LaidOut {
  readonly drawing: MatrixDrawing;
  readonly choice: Partial<DrawingOptions>;
}

export type AppState = ReturnType<typeof createAppState>;

/** The one app state of the page. */
export const app: AppState = createRoot(() => createAppState());
