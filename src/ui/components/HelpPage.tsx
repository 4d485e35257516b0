/**
 * The help page: how to start, and every word the app uses explained (the
 * same sentences as the "?" beside each word, from helpText.ts). A modal
 * dialog the toolbar's Help button opens; Escape or Close shuts it.
 */
import { For } from "solid-js";
import { HELP, HELP_ORDER } from "../helpText.ts";

export function HelpPage(props: { ref: (el: HTMLDialogElement) => void }) {
  let dialog: HTMLDialogElement | undefined;
  return (
    <dialog
      class="help-page"
      aria-labelledby="help-h"
      data-testid="help-page"
      ref={(el) => {
        dialog = el;
        props.ref(el);
      }}
    >
      <div class="help-head">
        <h2 id="help-h">Help</h2>
        <button type="button" class="small-btn" onClick={() => dialog?.close()} data-testid="help-close">
          Close
        </button>
      </div>
      <h3>Getting started</h3>
      <ul>
        <li>
          Set the number of states and what each one shows in the Project panel (or type a pattern such as <code>0-9</code> or{" "}
          <code>00-59</code> and press Fill). The result line gives the verified diode count at once; the exact optimizer then looks for a
          smaller matrix and a proof.
        </li>
        <li>
          <strong>New</strong> starts a new project or opens a shipped example, the demo among them; the project you had stays under{" "}
          <strong>Recent</strong>, and Undo steps back, also after a reload.
        </li>
        <li>
          A clock or a timer has several counters: <strong>Add decoder</strong> in the Decoders panel adds one, and clicking a decoder opens
          it in the other panels. They share the Electrical panel's values; the summary adds up every decoder's parts and supply, and Save,
          the autosave, Undo and Share link take all of them.
        </li>
        <li>
          Click a segment in the Glyphs panel to change a character's shape; the Comparison panel tries the usual variants of 6, 7 and 9 and
          adopts the one you pick.
        </li>
        <li>
          The Drawing panel's <strong>Title block</strong> takes the drawing number, revision, date and drawn by; Export and Print take them
          and the paper you choose.
        </li>
      </ul>
      <h3>Words</h3>
      <dl class="glossary">
        <For each={HELP_ORDER}>
          {(k) => (
            <>
              <dt id={`glossary-${k}`}>{HELP[k].term}</dt>
              <dd>{HELP[k].text}</dd>
            </>
          )}
        </For>
      </dl>
    </dialog>
  );
}
