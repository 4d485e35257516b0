/**
 * Help in place: a small "?" beside a word the app uses. Pointing at it
 * shows the explanation as a tooltip; clicking it (or Enter or Space on it)
 * opens the explanation as a line below, for touch screens and screen
 * readers; Escape, or moving on, closes it. The words come from helpText.ts.
 */
import { createSignal, createUniqueId, Show } from "solid-js";
import { HELP, type HelpTerm } from "../helpText.ts";

export function HelpTip(props: { term: HelpTerm }) {
  const [open, setOpen] = createSignal(false);
  const id = `help-${props.term}-${createUniqueId()}`;
  const entry = () => HELP[props.term];
  return (
    <span class="help-tip">
      <button
        type="button"
        class="help-btn"
        data-testid={`help-${props.term}`}
        aria-label={`What is "${entry().term.toLowerCase()}"?`}
        aria-expanded={open() ? "true" : "false"}
        aria-controls={id}
        title={entry().text}
        onClick={(e) => {
          // Inside a label: the click explains the word and leaves the field alone.
          e.preventDefault();
          setOpen(!open());
        }}
        onBlur={() => setOpen(false)}
        onKeyDown={(e) => {
          if (e.key === "Escape" && open()) {
            e.stopPropagation();
            setOpen(false);
          }
        }}
      >
        ?
      </button>
      <Show when={open()}>
        <span id={id} class="help-line" role="note" data-testid={`help-${props.term}-text`}>
          <strong>{entry().term}:</strong> {entry().text}
        </span>
      </Show>
    </span>
  );
}
