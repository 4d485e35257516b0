/**
 * The Electrical panel: the preset picker, the driver kind, and every value
 * of the `electrical` section, grouped (supplies, segment, driver, counter
 * lines, matrix diodes, tolerances), each with its unit. Fields the chosen
 * kind does not use stay editable, greyed, and say so on hover. An edit here works out the
 * budget again, never the matrix (appState.ts).
 */
import { For, Show } from "solid-js";
import { PRESET_INFO } from "../../core/project/electricalPresets.ts";
import { DRIVER_KINDS } from "../../core/project/electricalSchema.ts";
import type { DriverKind, PresetName } from "../../core/project/project.ts";
import { app } from "../state/appState.ts";
import { overriddenPaths } from "../state/instrumentDraft.ts";
import {
  ELECTRICAL_GROUPS,
  fieldText,
  KIND_NAMES,
  overridesText,
  setDriverKind,
  setElectricalPreset,
  setElectricalText,
  setOverridesText,
  usedBy,
  type NumberField,
  type OverrideField,
} from "../state/electricalForm.ts";

/** Groups open at first; the others are folded. */
const OPEN_GROUPS = new Set(["Segment supply", "Segment", "Driver"]);

const fieldId = (path: string) => `e-${path.replace(/\./g, "-")}`;

export function ElectricalPanel() {
  const e = () => app.draft().electrical;
  const overridden = () => overriddenPaths(app.instrument(), app.selected());
  const decoderName = () => app.instrument().decoders[app.selected()]?.name ?? "";
  const kind = () => e().driver.kind;
  const presetLabel = () => PRESET_INFO.find((p) => p.name === e().preset)?.label ?? "No preset: every value as given.";
  const invalid = (path: string) =>
    app
      .problems()
      .some((p) => p.path === `electrical.${path}` || p.path.startsWith(`electrical.${path}[`) || p.path.startsWith(`electrical.${path}.`));

  const NumberInput = (props: { field: NumberField }) => {
    const f = props.field;
    return (
      <>
        <label
          for={fieldId(f.path)}
          classList={{ unused: !usedBy(f, kind()) }}
          title={[f.hint, usedBy(f, kind()) ? "" : "not used by the chosen driver"].filter(Boolean).join("; ") || undefined}
        >
          {f.label}
        </label>
        <span class="with-unit">
          <input
            id={fieldId(f.path)}
            type="text"
            inputmode="decimal"
            spellcheck={false}
            value={fieldText(e(), f)}
            aria-invalid={invalid(f.path.replace(/\.(\d)$/, "[$1]")) ? "true" : undefined}
            onChange={(ev) => {
              const input = ev.currentTarget;
              const next = setElectricalText(app.draft(), f, input.value);
              if (next === null) input.value = fieldText(e(), f);
              else {
                app.edit(() => next);
                app.sealEdit();
              }
            }}
          />
          <span class="unit">{f.unit}</span>
        </span>
      </>
    );
  };

  const OverrideInput = (props: { field: OverrideField }) => {
    const f = props.field;
    const map = () => (f.path === "driver.emitterResistors" ? e().driver.emitterResistors : e().segment.seriesResistors);
    return (
      <>
        <label
          for={fieldId(f.path)}
          classList={{ unused: !usedBy(f, kind()) }}
          title={usedBy(f, kind()) ? "as 1a=330, 2b=300" : "not used by the chosen driver"}
        >
          {f.label}
        </label>
        <span class="with-unit">
          <input
            id={fieldId(f.path)}
            type="text"
            class="wide"
            spellcheck={false}
            placeholder="1a=330, 2b=300"
            value={overridesText(map())}
            aria-invalid={invalid(f.path) ? "true" : undefined}
            onChange={(ev) => {
              const input = ev.currentTarget;
              const next = setOverridesText(app.draft(), f.path, input.value);
              if (next === null) input.value = overridesText(map());
              else {
                app.edit(() => next);
                app.sealEdit();
              }
            }}
          />
          <span class="unit">Ω</span>
        </span>
      </>
    );
  };

  return (
    <section class="panel electrical-panel" aria-labelledby="electrical-h" data-testid="electrical-panel">
      <h2 id="electrical-h">Electrical</h2>
      <Show when={app.instrument().decoders.length > 1}>
        <p class="muted small shared-note" data-testid="electrical-shared">
          Shared by all {app.instrument().decoders.length} decoders: an edit here changes every decoder that takes the value.
          <Show when={overridden().length > 0}>
            {" "}
            <strong>{decoderName()}</strong> has its own <span data-testid="electrical-overrides">{overridden().join(", ")}</span> (from the
            file); edits of those change {decoderName()} alone.
          </Show>
        </p>
      </Show>
      <div class="form-grid">
        <label for="e-preset">Preset</label>
        <select
          id="e-preset"
          value={e().preset ?? ""}
          onChange={(ev) => {
            const name = ev.currentTarget.value;
            if (name === "") return;
            app.edit((x) => setElectricalPreset(x, name as PresetName));
            app.sealEdit();
          }}
        >
          <Show when={e().preset === null}>
            <option value="">(none)</option>
          </Show>
          <For each={PRESET_INFO}>{(p) => <option value={p.name}>{p.name}</option>}</For>
        </select>
        <span />
        <span class="muted small" data-testid="preset-label">
          {presetLabel()}
        </span>
        <label for="e-kind">Driver</label>
        <select
          id="e-kind"
          value={kind()}
          onChange={(ev) => {
            app.edit((x) => setDriverKind(x, ev.currentTarget.value as DriverKind));
            app.sealEdit();
          }}
        >
          <For each={DRIVER_KINDS}>{(k) => <option value={k}>{KIND_NAMES[k]}</option>}</For>
        </select>
      </div>
      <For each={ELECTRICAL_GROUPS}>
        {(g) => (
          <details class="electrical-group" open={OPEN_GROUPS.has(g.title)}>
            <summary>{g.title}</summary>
            <div class="form-grid">
              <For each={g.fields}>{(f) => <NumberInput field={f} />}</For>
              <For each={g.overrides ?? []}>{(f) => <OverrideInput field={f} />}</For>
            </div>
          </details>
        )}
      </For>
    </section>
  );
}
