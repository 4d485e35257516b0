/**
 * The toolbar: a new project or a shipped example, open and save the project, the recent projects, share link,
 * exports, print with paper size, undo and redo, and the exact optimizer
 * switch. A mark beside Save says when the browser refuses the autosave.
 */
import { createSignal, For, Show } from "solid-js";
import { fileSizeProblem } from "../../core/project/limits.ts";
import { app } from "../state/appState.ts";
import { instrumentData, instrumentToJson } from "../state/instrumentDraft.ts";
import { exportInstrument } from "../files/instrumentExport.ts";
import type { Instrument } from "../../core/project/instrument.ts";
import { downloadText, fileStem } from "../files/download.ts";
import { exportFiles, type ExportKind } from "../files/exportFiles.ts";
import { encodeShareHash } from "../state/shareLink.ts";
import { EXAMPLES, type ShippedExample } from "../state/examples.ts";
import { HelpPage } from "./HelpPage.tsx";

import { PAPER_NAMES, type PaperName } from "../../render/drawingModel.ts";

type Paper = PaperName;

const PAPER_LABELS: Readonly<Record<Paper, string>> = { a4: "A4", a3: "A3 (big matrices)", letter: "Letter" };

export function Toolbar(props: { paper: Paper; onPaper: (p: Paper) => void; exportKinds: readonly { kind: ExportKind; label: string }[] }) {
  let fileInput: HTMLInputElement | undefined;
  let menu: HTMLDetailsElement | undefined;
  const [shareState, setShareState] = createSignal<string | null>(null);

  const open = async (file: File) => {
    const tooLarge = fileSizeProblem(file.size);
    if (tooLarge) {
      app.setNotice({
        level: "danger",
        title: `${file.name} was not opened; the project on screen is unchanged`,
        lines: [`${file.name}: ${tooLarge.message}`],
      });
      return;
    }
    // The bytes, not file.text(): the same reading as the command line's (byte-order mark, UTF-8 check).
    app.openText(file.name, new Uint8Array(await file.arrayBuffer()));
  };
  let recentMenu: HTMLDetailsElement | undefined;
  let newMenu: HTMLDetailsElement | undefined;
  let helpPage: HTMLDialogElement | undefined;
  const pick = (ex: ShippedExample | null) => {
    if (newMenu) newMenu.open = false;
    void app.openExample(ex);
  };
  const save = () => app.downloadProject();
  const share = async () => {
    const hash = await encodeShareHash(instrumentToJson(app.instrument()));
    const url = `${location.origin}${location.pathname}${hash}`;
    history.replaceState(null, "", hash);
    try {
      await navigator.clipboard.writeText(url);
      setShareState("link copied");
    } catch {
      setShareState("link in the address bar");
    }
    setTimeout(() => setShareState(null), 4000);
  };
  const doExport = (kind: ExportKind) => {
    if (app.instrument().decoders.length > 1) return void doInstrumentExport(kind);
    const r = app.live();
    if (!r) return;
    const stem = fileStem(r.project.title);
    const files = exportFiles(r, kind, app.drawingChoice(), app.currentBudget());
    if (files.length === 0) {
      app.setNotice({
        level: "warn",
        title: "Nothing to export yet",
        lines: ["the budget is still being worked out; try again in a moment"],
      });
      return;
    }
    files.forEach((f) => downloadText(`${stem}-${f.name}`, f.content, f.mediaType));
    if (menu) menu.open = false;
  };

  /** An instrument's export: its one set of papers, as the command line writes it. */
  const doInstrumentExport = async (kind: ExportKind) => {
    const v = app.instrumentValidation();
    if (!v.ok) {
      app.setNotice({ level: "warn", title: "Nothing to export yet", lines: ["a decoder has problems to fix first"] });
      return;
    }
    setExporting(true);
    const r = await exportInstrument(v.value, instrumentData(app.instrument()), app.summary(), app.trimMode(), app.drawingChoice(), kind);
    setExporting(false);
    if (!r.ok || r.files.length === 0) {
      app.setNotice({
        level: "warn",
        title: "Nothing to export yet",
        lines: [r.ok ? "no file of this kind (a budget failed?)" : r.message],
      });
      return;
    }
    const stem = fileStem(v.value.title);
    r.files.forEach((f) => downloadText(`${stem}-${f.name}`, f.content, f.mediaType));
    if (menu) menu.open = false;
  };
  const [exporting, setExporting] = createSignal(false);

  return (
    <header class="toolbar" role="toolbar" aria-label="Project actions">
      <span class="brand" aria-label="diodeloom">
        diode<span>loom</span>
      </span>
      <div class="tool-group">
        <details class="menu" ref={newMenu}>
          <summary data-testid="new-menu">New ▾</summary>
          <div class="menu-items wide" role="group" aria-label="New project or example">
            <button type="button" data-testid="new-blank" onClick={() => pick(null)}>
              New project (0-9 on one digit)
            </button>
            <For each={EXAMPLES}>
              {(ex) => (
                <button type="button" data-testid={`example-${ex.file.replace(/\.json$/, "")}`} onClick={() => pick(ex)}>
                  Example: {ex.label}
                </button>
              )}
            </For>
          </div>
        </details>
        <button type="button" onClick={() => fileInput?.click()} data-testid="open">
          Open…
        </button>
        <input
          ref={fileInput}
          type="file"
          accept=".json,application/json"
          class="visually-hidden"
          tabindex="-1"
          data-testid="open-input"
          onChange={(e) => {
            const f = e.currentTarget.files?.[0];
            e.currentTarget.value = "";
            if (f) void open(f);
          }}
        />
        <button type="button" onClick={save} data-testid="save">
          Save
        </button>
        <Show when={app.saveProblem()}>
          {(p) => (
            <span class="chip danger" role="status" data-testid="save-problem" title={`Not saved in this browser: ${p().message}`}>
              ⚠ not saved in the browser
            </span>
          )}
        </Show>
        <Show when={app.recent().length > 0}>
          <details class="menu" ref={recentMenu}>
            <summary data-testid="recent-menu">Recent ▾</summary>
            <div class="menu-items" role="group" aria-label="Recent projects">
              <For each={app.recent()}>
                {(r, i) => (
                  <button
                    type="button"
                    data-testid={`recent-${i()}`}
                    onClick={() => {
                      if (recentMenu) recentMenu.open = false;
                      app.openRecent(i());
                    }}
                  >
                    {r.title} ({recentSize(r.project)})
                  </button>
                )}
              </For>
            </div>
          </details>
        </Show>
        <button type="button" onClick={() => void share()} data-testid="share">
          Share link
        </button>
        <Show when={shareState()}>
          <span class="muted small" role="status">
            {shareState()}
          </span>
        </Show>
      </div>
      <details
        class="menu"
        ref={menu}
        onKeyDown={(e) => {
          if (e.key === "Escape" && menu?.open) {
            menu.open = false;
            menu.querySelector("summary")?.focus();
          }
        }}
      >
        <summary data-testid="exports-menu">Export ▾</summary>
        <div class="menu-items" role="group" aria-label="Export">
          <Show when={app.instrument().decoders.length > 1}>
            <p class="muted small menu-note" data-testid="export-decoder-note">
              One set of papers for every decoder{exporting() ? ": preparing…" : ""}
            </p>
          </Show>
          <For each={props.exportKinds}>
            {(k) => (
              <button type="button" onClick={() => doExport(k.kind)} disabled={!app.live()} data-testid={`export-${k.kind}`}>
                {k.label}
              </button>
            )}
          </For>
        </div>
      </details>
      <div class="tool-group" role="group" aria-label="Print">
        <label for="f-paper" class="label">
          Paper
        </label>
        <select id="f-paper" value={props.paper} onChange={(e) => props.onPaper(e.currentTarget.value as Paper)}>
          <For each={PAPER_NAMES}>{(p) => <option value={p}>{PAPER_LABELS[p]}</option>}</For>
        </select>
        <button type="button" onClick={() => window.print()} data-testid="print">
          Print
        </button>
      </div>
      <div class="tool-group" role="group" aria-label="History">
        <button type="button" onClick={() => app.undo()} disabled={!app.canUndo()} data-testid="undo" title="Undo (Ctrl+Z)">
          Undo
        </button>
        <button type="button" onClick={() => app.redo()} disabled={!app.canRedo()} data-testid="redo" title="Redo (Ctrl+Shift+Z, Ctrl+Y)">
          Redo
        </button>
      </div>
      <label class="check-inline">
        <input
          type="checkbox"
          checked={app.exactEnabled()}
          onChange={(e) => app.setExactOn(e.currentTarget.checked)}
          data-testid="exact-toggle"
        />{" "}
        exact optimizer
      </label>
      <button type="button" onClick={() => helpPage?.showModal()} data-testid="help-open">
        Help
      </button>
      <HelpPage ref={(el) => (helpPage = el)} />
    </header>
  );
}

/** What the Recent menu says of a project's size: its states, or its decoders. */
function recentSize(p: Instrument): string {
  const only = p.decoders[0];
  return p.decoders.length === 1 && only ? `${only.project.counter.states} states` : `${p.decoders.length} decoders`;
}
