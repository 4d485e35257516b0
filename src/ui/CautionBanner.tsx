/** The hazardous-voltage caution, shown while any supply value is above 60 V DC. */
import { Show } from "solid-js";
import { app } from "./appState.ts";

/** The usual touch-safe limit for SELV, volts DC (IEC 60335-1). */
const SELV_LIMIT_V = 60;

export function CautionBanner() {
  const hazardous = () => {
    const s = app.draft().electrical.supply;
    return Math.max(s.volts, s.maxVolts, s.minVolts) > SELV_LIMIT_V;
  };
  return (
    <Show when={hazardous()}>
      <aside class="caution" role="note" data-testid="caution">
        <strong>⚠ DANGER: hazardous voltage.</strong> The string supply ({app.draft().electrical.supply.maxVolts} V max) is above the
        60 V DC touch-safe limit. Fuse the live lead, insulate and shroud terminals, earth metal parts, discharge filter capacitors before
        touching, and follow local electrical codes and licensed practice.
      </aside>
    </Show>
  );
}
