/**
 * The app's state as Solid signals: the undo history of drafts, the
 * validated project, the live (heuristic) result, the exact run, and
 * messages for the person. Components read these and call the actions; the
 * domain work happens in src/core through liveResult.ts.
 */
import { batch, createMemo, createRoot, createSignal } from "solid-js";
import type { BudgetFailure } from "../../core/budget/budget.ts";
import type { Budget } from "../../core/budget/budgetTypes.ts";
import type { TrimMode } from "../../core/budget/emitterDesign.ts";
import type { VerifiedMatrix } from "../../core/matrix/matrix.ts";
import type { Result } from "../../core/result/result.ts";
import type { PaperName } from "../../render/drawingModel.ts";
import { drawingOptions } from "../../render/drawingOptions.ts";
import { layoutMatrix, type MatrixDrawing } from "../../render/layout.ts";
import type { Project } from "../../core/project/project.ts";
import { parseProject, validateProject } from "../../core/project/projectSchema.ts";
import { parseProjectBytes } from "../../core/project/projectBytes.ts";
import { formatProblems, type Problem } from "../../core/result/result.ts";
import { readAutosave, writeAutosave } from "./autosave.ts";
import { draftFromProject, type Draft } from "./draft.ts";
import type { ExactProgress } from "../workers/exactProtocol.ts";
import { ExactRunner } from "../workers/exactRun.ts";
import { analysis } from "../workers/analysisClient.ts";
import { acceptMatrix, liveResult, withMatrix, type LiveResult } from "../workers/liveResult.ts";
import { canRedo, canUndo, record, redo, seal, startHistory, undo, type UndoHistory } from "./undoHistory.ts";

export type ExactState =
  | { readonly status: "idle" }
  | { readonly status: "off" }
  | { readonly status: "running"; readonly progress: ExactProgress; readonly startedAtMs: number }
  | { readonly status: "done"; readonly improved: boolean; readonly optimal: boolean }
  | { readonly status: "cancelled" }
  | { readonly status: "failed"; readonly message: string };

export interface Notice {
  readonly level: "info" | "warn" | "danger";
  readonly title: string;
  readonly lines: readonly string[];
}

/** Wait after the last edit before the exact optimizer starts, milliseconds. */
const EXACT_DELAY_MS = 500;
/** Wait after a result before the budget is asked for (typing settles first), milliseconds. */
const BUDGET_DELAY_MS = 150;

export interface BudgetView {
  /** The result the budget belongs to; it is stale when the shown result differs. */
  readonly forResult: LiveResult;
  /** The trim setting it was solved with; it is stale when the setting differs. */
  readonly trim: TrimMode;
  readonly result: Result<Budget, BudgetFailure | { readonly kind: "rejected"; readonly message: string }>;
}

function createAppState() {
  const [history, setHistory] = createSignal<UndoHistory<Draft>>(startHistory(placeholderDraft()));
  const draft = createMemo(() => history().present);
  const validation = createMemo(() => validateProject(draft()));
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
  const [exact, setExact] = createSignal<ExactState>({ status: "idle" });
  const [exactEnabled, setExactEnabled] = createSignal(true);
  const [notice, setNotice] = createSignal<Notice | null>(null);
  const [ready, setReady] = createSignal(false);
  const [paper, setPaperSignal] = createSignal<PaperName>(readPaper());
  const [budget, setBudget] = createSignal<BudgetView | null>(null);
  /** Whether the design takes the emitter-resistor trim (the Budget panel's control); every paper follows it. */
  const [trimMode, setTrimMode] = createSignal<TrimMode>("auto");
  /** The drawing of the shown result, laid out once for the screen, the print view and the exports. */
  const drawing = createMemo<MatrixDrawing | null>(() => {
    const r = live();
    return r ? layoutMatrix(r.project, r.spec, r.matrix, drawingOptions(r.project, { paper: paper() })) : null;
  });
  let budgetTimer: ReturnType<typeof setTimeout> | undefined;

  /** Shows a result and schedules its budget. */
  function show(r: LiveResult): void {
    setLive(r);
    scheduleBudget(r);
  }

  /** Asks the worker for the budget of a result with the current trim setting. */
  function scheduleBudget(r: LiveResult): void {
    clearTimeout(budgetTimer);
    budgetTimer = setTimeout(async () => {
      const trim = trimMode();
      if (live() !== r) return;
      const reply = await analysis.request<"budget">({ job: "budget", project: draftFromProject(r.project), matrix: r.matrix, trim });
      if (live() === r && trimMode() === trim) setBudget({ forResult: r, trim, result: reply.result });
    }, BUDGET_DELAY_MS);
  }

  const stale = createMemo(() => live() !== null && liveDraft() !== draft());
  const runner = new ExactRunner();
  let exactTimer: ReturnType<typeof setTimeout> | undefined;
  let pass = 0;
  let editStartedAt = 0;

  /** Recomputes the live result for the current draft (called after every change). */
  async function recompute(): Promise<void> {
    const d = draft();
    const v = validation();
    const mine = ++pass;
    cancelExact(false);
    if (!v.ok) return;
    const r = await liveResult(v.value);
    if (mine !== pass) return;
    batch(() => {
      if (r.ok) {
        show(r.value);
        setLiveError(null);
      } else {
        setLiveError(r.error.kind === "bug" ? `${r.error.message}\n${r.error.details.join("\n")}` : r.error.message);
      }
      setLiveDraft(d);
      setLiveMs(performance.now() - editStartedAt);
      setLivePass((n) => n + 1);
    });
    if (v.ok && persist) writeAutosave(localStorage, v.value);
    if (r.ok) scheduleExact(d, v.value);
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
    if (draft() !== d) return;
    const base = live();
    if (!base) return;
    setExact({
      status: "running",
      progress: { best: base.matrix.count, bound: base.matrix.lowerBound, elapsedS: 0 },
      startedAtMs: performance.now(),
    });
    runner.start(draftFromProject(project), {
      progress: (p) => {
        const s = exact();
        if (s.status === "running")
          setExact({ ...s, progress: { ...p, best: p.best ?? s.progress.best, bound: p.bound ?? s.progress.bound } });
      },
      done: (m) => {
        const current = live();
        if (draft() !== d || !current) return;
        const checked = acceptMatrix(current.spec, current.settings, m);
        if (!checked.ok) {
          setExact({ status: "failed", message: `the optimizer's matrix failed verification and is not shown: ${checked.error[0] ?? ""}` });
          return;
        }
        const better = adoptIfBetter(current, checked.value);
        setExact({ status: "done", improved: better, optimal: checked.value.optimal });
      },
      failed: (message) => setExact({ status: "failed", message }),
    });
  }

  /** Shows the exact matrix when it is no worse than the heuristic one (and so carries the bound). */
  function adoptIfBetter(current: LiveResult, m: VerifiedMatrix): boolean {
    if (m.count > current.matrix.count) return false;
    const improved = m.count < current.matrix.count;
    show(withMatrix(current.project, current.spec, current.settings, m));
    return improved;
  }

  function cancelExact(show = true): void {
    clearTimeout(exactTimer);
    const wasRunning = runner.running;
    runner.cancel();
    if (show && wasRunning) setExact({ status: "cancelled" });
    else if (!show) setExact({ status: exactEnabled() ? "idle" : "off" });
  }

  /** Applies an edit. Edits with the same key in a row make one undo step (typing). */
  function edit(change: (d: Draft) => Draft, key: string | null = null): void {
    const next = change(draft());
    if (next === draft()) return;
    forgetShareHash();
    editStartedAt = performance.now();
    setHistory((h) => record(h, next, key));
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

  /** Replaces the project (opened file, share link, example); undoable. */
  function replaceProject(p: Project): void {
    edit(() => draftFromProject(p));
    sealEdit();
  }

  /**
   * Opens project JSON, as text or as a file's bytes (read exactly as the
   * command line reads a file). A bad file leaves the open project as it
   * was and shows the same path-naming messages as the command line.
   */
  function openText(name: string, content: string | Uint8Array): boolean {
    const r = typeof content === "string" ? parseProject(content) : parseProjectBytes(content);
    if (!r.ok) {
      setNotice({
        level: "danger",
        title: `${name} was not opened; the project on screen is unchanged`,
        lines: formatProblems(r.error)
          .split("\n")
          .map((l) => `${name}: ${l}`),
      });
      return false;
    }
    replaceProject(r.value);
    setNotice({ level: "info", title: `Opened ${name}`, lines: [] });
    return true;
  }

  /** Loads the first project: share link, else autosave, else the demo. */
  async function boot(fromHash: () => Promise<Project | Problem[] | null>, demo: () => Promise<Project>): Promise<void> {
    const shared = await fromHash();
    let start: Project | null = null;
    if (Array.isArray(shared)) {
      setNotice({ level: "warn", title: "The share link could not be read", lines: formatProblems(shared).split("\n") });
    } else if (shared) {
      start = shared;
    }
    if (!start) {
      const saved = readAutosave(localStorage);
      if (saved.found) start = saved.project;
      if (saved.notes.length > 0) setNotice({ level: "warn", title: "Autosave", lines: saved.notes });
    }
    start ??= await demo();
    editStartedAt = performance.now();
    setHistory(startHistory(draftFromProject(start)));
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
    draft,
    validation,
    problems,
    live,
    drawing,
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
      setPaperSignal(p);
      try {
        localStorage.setItem(PAPER_KEY, p);
      } catch {
        // A refused store only loses the preference.
      }
    },
    liveError,
    liveMs,
    livePass,
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

function readPaper(): PaperName {
  try {
    return localStorage.getItem(PAPER_KEY) === "letter" ? "letter" : "a4";
  } catch {
    return "a4";
  }
}

/** A minimal valid draft to hold the place until the first project loads. */
function placeholderDraft(): Draft {
  const r = validateProject({ schema: "diodeloom/project@1", title: "Loading", counter: { states: 2 }, display: {}, show: ["0", "1"] });
  if (!r.ok) throw new Error("bug: the placeholder project is invalid");
  return draftFromProject(r.value);
}

export type AppState = ReturnType<typeof createAppState>;

/** The one app state of the page. */
export const app: AppState = createRoot(() => createAppState());
