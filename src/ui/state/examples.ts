/**
 * What the New menu offers: a new project, and every example shipped in
 * `public/examples/`. Opening one replaces the project on screen like an
 * opened file does (undoable, and the person's own project stays under
 * Recent), so the demo is always one click away.
 */
import { validateProject } from "../../core/project/projectSchema.ts";
import { parseInstrument, type Instrument } from "../../core/project/instrument.ts";
import type { Project } from "../../core/project/project.ts";
import type { Problem, Result } from "../../core/result/result.ts";

export interface ShippedExample {
  /** File name under `public/examples/`. */
  readonly file: string;
  /** What the menu says: what it is and what it shows. */
  readonly label: string;
}

/** Every example the app ships, the demo first; a unit test holds it to the folder's contents. */
export const EXAMPLES: readonly ShippedExample[] = [
  { file: "relay-hex-monitor.json", label: "Relay computer hex monitor (the demo): 0-F on one digit" },
  { file: "turntable-position.json", label: "Turntable position: stations 1-12 on two digits" },
  { file: "die-roller.json", label: "Die roller: a seven-pip die face" },
  { file: "antenna-rotator.json", label: "Antenna rotator: eight compass arrows" },
  { file: "quiz-scoreboard.json", label: "Quiz scoreboard: rounds 1-9 and F from active-low lines, PNP high-side switches" },
  { file: "wall-clock.json", label: "Wall clock (an instrument): hours, minute tens and minute units" },
];

/** The demo the app starts with when the browser holds no project. */
export const DEMO_EXAMPLE: ShippedExample = EXAMPLES[0]!;

/** The title a new project gets. */
export const NEW_PROJECT_TITLE = "New project";

/**
 * A new project: a ten-state ring counter showing 0 to 9 on one
 * seven-segment digit, every other setting at its default (the 5 V
 * switch preset), the smallest useful start.
 */
export function newProject(): Project {
  const r = validateProject({
    schema: "diodeloom/project@2",
    title: NEW_PROJECT_TITLE,
    counter: { states: 10 },
    display: { positions: 1, cell: "seg7" },
    show: ["0", "1", "2", "3", "4", "5", "6", "7", "8", "9"],
  });
  if (!r.ok) throw new Error(`bug: the new project is invalid: ${JSON.stringify(r.error)}`);
  return r.value;
}

/** The address of a shipped example under the app's base address. */
export function exampleUrl(base: string, example: ShippedExample): string {
  return `${base}examples/${example.file}`;
}

/** Fetches and checks a shipped example; a failure says which file and why. */
export async function loadExample(base: string, example: ShippedExample): Promise<Result<Instrument, readonly Problem[]>> {
  let text: string;
  try {
    const response = await fetch(exampleUrl(base, example));
    if (!response.ok) return { ok: false, error: [{ path: "", message: `the server answered ${response.status} for ${example.file}` }] };
    text = await response.text();
  } catch (e) {
    return {
      ok: false,
      error: [{ path: "", message: `${example.file} could not be fetched: ${e instanceof Error ? e.message : String(e)}` }],
    };
  }
  return parseInstrument(text);
}
