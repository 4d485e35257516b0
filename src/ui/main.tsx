/** Entry of the web app: mounts the screen, wires the keyboard, loads the first project. */
import { render } from "solid-js/web";
import type { Instrument } from "../core/project/instrument.ts";
import { App } from "./components/App.tsx";
import { app } from "./state/appState.ts";
import { DEMO_EXAMPLE, loadExample } from "./state/examples.ts";
import { historyAction, isTextEntry } from "./state/undoKeys.ts";
import "./styles.css";

async function demoProject(): Promise<Instrument> {
  const r = await loadExample(import.meta.env.BASE_URL, DEMO_EXAMPLE);
  if (!r.ok) throw new Error(`bug: the demo project is invalid: ${JSON.stringify(r.error)}`);
  return r.value;
}

document.addEventListener("keydown", (e) => {
  const action = historyAction(e);
  if (!action) return;
  const target = document.activeElement as HTMLElement | null;
  if (
    isTextEntry(
      target ? { tagName: target.tagName, type: (target as HTMLInputElement).type, isContentEditable: target.isContentEditable } : null,
    )
  )
    return;
  e.preventDefault();
  if (action === "undo") app.undo();
  else app.redo();
});

// A link pasted into the address bar of the open page: opened like one at start, with the same notice when it is bad.
window.addEventListener("hashchange", () => void app.openShareLink(location.hash));

const root = document.getElementById("root");
if (!root) throw new Error("bug: index.html has no #root");
render(() => <App />, root);
void app.boot(location.hash, demoProject);
