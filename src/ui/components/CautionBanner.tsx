/** The safety cautions (core/safety.ts words), shown while any voltage the build carries is above 60 V DC. */
import { For, Show } from "solid-js";
import { carriedVoltages, safetyCautions, SELV_DC_LIMIT_V } from "../../core/budget/safety.ts";
import { app } from "../state/appState.ts";

export function CautionBanner() {
  const volts = () => carriedVoltages(app.draft().electrical);
  const cautions = () => safetyCautions(volts());
  return (
    <Show when={cautions().length > 0}>
      <aside class="caution" role="note" data-testid="caution">
        <details>
          <summary>
            <strong>⚠ DANGER: hazardous voltage.</strong> The supply reaches {Math.max(...volts())} V DC, above the {SELV_DC_LIMIT_V} V DC
            touch-safe limit: work only with it off and discharged, and follow local codes and licensed practice.{" "}
            <span class="linkish">Details</span>
          </summary>
          <For each={cautions()}>{(c) => <p>{c.message}</p>}</For>
        </details>
      </aside>
    </Show>
  );
}
