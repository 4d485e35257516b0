/**
 * The glyph editor: pick a character, click segments of the drawn cell to
 * light or darken them, pick a built-in variant, add characters, and name the
 * segments of a custom cell.
 */
import { createMemo, createSignal, For, Show } from "solid-js";
import { SEG7_VARIANTS, segmentsOfString } from "../../core/glyphs/glyphs.ts";
import { app } from "../state/appState.ts";
import { CellFigure } from "./CellFigure.tsx";
import {
  addCharacter,
  builtinShape,
  charactersShown,
  sameShapes,
  draftFigure,
  draftSegments,
  effectiveGlyphs,
  setCustomSegments,
  setGlyph,
  toggleSegment,
} from "../state/draftEdits.ts";

export function GlyphEditor() {
  const d = () => app.draft();
  /** Characters opened through "Add character" that the texts do not show and the project has no entry for yet. */
  const [added, setAdded] = createSignal<readonly string[]>([]);
  const chars = createMemo(() => {
    const shown = charactersShown(d());
    const own = Object.keys(d().glyphs).filter((c) => c !== " " && !shown.includes(c));
    return [...shown, ...own, ...added().filter((c) => !shown.includes(c) && !own.includes(c))];
  });
  const [picked, setPicked] = createSignal<string | null>(null);
  const [addMessage, setAddMessage] = createSignal<string | null>(null);
  const current = () => {
    const p = picked();
    return p !== null && chars().includes(p) ? p : (chars()[0] ?? null);
  };
  const table = () => effectiveGlyphs(d());
  const lit = () => {
    const c = current();
    return c === null ? [] : (table()[c] ?? []);
  };
  const variants = () => {
    const c = current();
    return c !== null && d().display.cell !== "custom" ? (SEG7_VARIANTS[c] ?? []) : [];
  };
  const [newChar, setNewChar] = createSignal("");
  const addChar = () => {
    const r = addCharacter(d(), newChar());
    setAddMessage(r.message);
    const c = r.char;
    if (c === null) return;
    if (!added().includes(c)) setAdded((a) => [...a, c]);
    setPicked(c);
    setNewChar("");
  };
  const builtin = () => {
    const c = current();
    return c === null ? undefined : builtinShape(d(), c);
  };
  const lookAlikes = () => sameShapes(d());
  const [segText, setSegText] = createSignal<string | null>(null);

  return (
    <section class="panel" aria-labelledby="glyph-h">
      <h2 id="glyph-h">Glyphs</h2>
      <div class="glyph-chars" role="group" aria-label="Character to edit">
        <For each={chars()}>
          {(c) => (
            <button
              type="button"
              class={`char-chip ${c === current() ? "picked" : ""}`}
              aria-pressed={c === current()}
              data-char={c}
              onClick={() => setPicked(c)}
              title={`edit “${c}”${c in d().glyphs ? " (own shape)" : ""}`}
            >
              <span class="char-mono">{c}</span>
              <Show when={c in d().glyphs}>
                <span class="own-mark" aria-label="own shape">
                  *
                </span>
              </Show>
            </button>
          )}
        </For>
      </div>
      <Show when={current() !== null} fallback={<p class="muted">No characters shown yet.</p>}>
        <div class="glyph-edit">
          <div data-testid="glyph-cell">
            <CellFigure
              kind={d().display.cell}
              segments={draftSegments(d())}
              figure={draftFigure(d())}
              lit={lit()}
              height={150}
              labels
              title={`segments of “${current()}”: click or press Enter to toggle`}
              onToggle={(s) => {
                const c = current();
                if (c !== null) app.edit((x) => toggleSegment(x, c, s));
              }}
            />
          </div>
          <div class="glyph-side">
            <p>
              <span class="char-mono big">{current()}</span> lights <code>{lit().join(" ") || "nothing"}</code>
            </p>
            <Show when={variants().length > 0}>
              <p class="label">Built-in variants</p>
              <div class="variant-row">
                <For each={variants()}>
                  {(v) => {
                    const segs = segmentsOfString(v);
                    const on = () => segs.join() === lit().join();
                    return (
                      <button
                        type="button"
                        class={`variant ${on() ? "picked" : ""}`}
                        aria-pressed={on()}
                        onClick={() => app.edit((x) => setGlyph(x, current() ?? "", segs))}
                        title={v}
                      >
                        <CellFigure kind="seg7" segments={[]} lit={segs} height={36} />
                        <span>{v}</span>
                      </button>
                    );
                  }}
                </For>
              </div>
            </Show>
            <Show when={current() !== null && current()! in d().glyphs && builtin()}>
              {(shape) => (
                <button
                  type="button"
                  class="linkish"
                  data-testid="back-to-builtin"
                  onClick={() => app.edit((x) => setGlyph(x, current() ?? "", shape()))}
                >
                  Back to built-in shape
                </button>
              )}
            </Show>
          </div>
        </div>
      </Show>
      <div class="pattern-row">
        <label for="f-newchar">Add character</label>
        <input
          id="f-newchar"
          type="text"
          maxLength={2}
          size={3}
          value={newChar()}
          onInput={(e) => setNewChar(e.currentTarget.value)}
          onKeyDown={(e) => e.key === "Enter" && addChar()}
        />
        <button type="button" onClick={addChar} data-testid="add-char">
          Add
        </button>
      </div>
      <Show when={addMessage()}>
        <p class="muted small" role="status" data-testid="add-char-message">
          {addMessage()}
        </p>
      </Show>
      <For each={lookAlikes()}>
        {(g) => (
          <p class="chip warn" role="status" data-testid="same-shape">
            ⚠ {g.chars.map((c) => (c === " " ? "blank" : `“${c}”`)).join(" and ")} look the same ({g.segments.join(" ") || "nothing lit"}):
            the display cannot tell them apart
          </p>
        )}
      </For>
      <Show when={d().display.cell === "custom"}>
        <div class="pattern-row">
          <label for="f-segments">Segments</label>
          <input
            id="f-segments"
            type="text"
            value={segText() ?? draftSegments(d()).join(" ")}
            onInput={(e) => setSegText(e.currentTarget.value)}
            onChange={(e) => {
              const names = e.currentTarget.value.split(/[\s,]+/).filter(Boolean);
              setSegText(null);
              app.edit((x) => setCustomSegments(x, names));
            }}
          />
        </div>
        <p class="muted small">Custom cell: segment names separated by spaces, e.g. tl tr ml c mr bl br.</p>
      </Show>
    </section>
  );
}
