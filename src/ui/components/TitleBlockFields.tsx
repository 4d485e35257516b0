/**
 * The title block's fields (drawing number, revision, date of issue, drawn
 * by), as `diodeloom export` takes them: checked by the same rules, each
 * empty field showing the default the drawing takes, each refused one saying
 * why beside it. Every drawing, print and export follows the fields that
 * check out.
 */
import { For, Show } from "solid-js";
import { DEFAULT_DRAWN_BY, defaultDrawingNumber } from "../../render/drawingOptions.ts";
import { app } from "../state/appState.ts";
import { titleFieldProblem, type TitleFields } from "../state/titleBlock.ts";

const FIELDS: readonly { key: keyof TitleFields; label: string; option: string }[] = [
  { key: "drawingNumber", label: "Drawing number", option: "--drawing-number" },
  { key: "revision", label: "Revision", option: "--revision" },
  { key: "date", label: "Date of issue", option: "--date" },
  { key: "drawnBy", label: "Drawn by", option: "--drawn-by" },
];

export function TitleBlockFields() {
  const placeholder = (key: keyof TitleFields): string => {
    if (key === "drawingNumber") {
      const r = app.live();
      return r ? defaultDrawingNumber(r.project) : "";
    }
    return key === "revision" ? "A" : key === "date" ? "YYYY-MM-DD, or empty to write by hand" : DEFAULT_DRAWN_BY;
  };
  return (
    <details class="title-block" data-testid="title-block">
      <summary>Title block</summary>
      <div class="form-grid">
        <For each={FIELDS}>
          {(f) => {
            const problem = () => titleFieldProblem(f.key, app.titleFields()[f.key]);
            return (
              <>
                <label for={`f-tb-${f.key}`}>{f.label}</label>
                <div>
                  <input
                    id={`f-tb-${f.key}`}
                    type="text"
                    data-testid={`title-${f.key}`}
                    value={app.titleFields()[f.key]}
                    placeholder={placeholder(f.key)}
                    aria-invalid={problem() ? "true" : undefined}
                    aria-describedby={problem() ? `f-tb-${f.key}-err` : undefined}
                    title={`As ${f.option} on the command line; empty takes the default shown`}
                    onInput={(e) => app.setTitleFields({ ...app.titleFields(), [f.key]: e.currentTarget.value })}
                  />
                  <Show when={problem()}>
                    <div id={`f-tb-${f.key}-err`} class="field-error" data-testid={`title-${f.key}-problem`}>
                      ⚠ {f.label}: {problem()}; the drawing keeps its default meanwhile
                    </div>
                  </Show>
                </div>
              </>
            );
          }}
        </For>
      </div>
    </details>
  );
}
