/** A dismissable message: an opened file's problems, a share-link failure, autosave notes, a save that failed (with its download button). */
import { For, Show } from "solid-js";
import { app } from "../state/appState.ts";

const MARK = { info: "ℹ", warn: "⚠", danger: "✖" } as const;

export function NoticeBox() {
  return (
    <Show when={app.notice()}>
      {(n) => (
        <div class={`notice ${n().level}`} role={n().level === "info" ? "status" : "alert"} data-testid="notice">
          <div class="notice-head">
            <strong>
              {MARK[n().level]} {n().title}
            </strong>
            <Show when={n().action}>
              {(a) => (
                <button type="button" class="small-btn" onClick={() => a().run()} data-testid="notice-action">
                  {a().label}
                </button>
              )}
            </Show>
            <button type="button" class="small-btn" onClick={() => app.setNotice(null)} aria-label="Dismiss message">
              Dismiss
            </button>
          </div>
          <Show when={n().lines.length > 0}>
            <pre>
              <For each={n().lines}>{(l) => <>{l + "\n"}</>}</For>
            </pre>
          </Show>
        </div>
      )}
    </Show>
  );
}
