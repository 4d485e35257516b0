/**
 * The Budget panel: string current per output across the states (an SVG
 * chart), the spread and the trim, and the warnings with their severity.
 */
import { Show } from "solid-js";
import { app } from "./appState.ts";

export function BudgetPanel() {
  return (
    <section class="panel" aria-labelledby="budget-h">
      <h2 id="budget-h">Budget</h2>
      <Show when={app.live()} fallback={<p class="muted">No result yet.</p>}>
        <p class="muted">The current budget appears here once the budget stage is available.</p>
      </Show>
    </section>
  );
}
