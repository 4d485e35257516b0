/**
 * The project's problems in the words of the screen. The core names each
 * problem by its field path in the file (`show[5]`, `synthesis.maxDepth`),
 * which is what the command line prints; the app says the same thing with
 * the names of its own fields ("State 5's text", "Depth limit") and, where
 * it can see the draft, as a sentence about what the person typed.
 */
import { builtinCell } from "../../core/glyphs/glyphs.ts";
import { LIMITS } from "../../core/project/limits.ts";
import { splitText } from "../../core/project/projectSchema.ts";
import { hasUnsafeText } from "../../core/project/valueText.ts";
import type { Problem } from "../../core/result/result.ts";
import type { Draft } from "./draft.ts";
import { draftSegments, effectiveGlyphs } from "./draftEdits.ts";
import { ELECTRICAL_GROUPS } from "./electricalForm.ts";

/** The app's name for a field, by its path in the file; null when the path is not one of the form's fields. */
const LABELS: readonly (readonly [RegExp, (m: RegExpExecArray) => string])[] = [
  [/^title$/, () => "Title"],
  [/^schema$/, () => "File format"],
  [/^counter\.states$/, () => "States"],
  [/^counter\.code$/, () => "Counter code"],
  [/^counter\.codes(?:\[(\d+)\])?$/, (m) => (m[1] === undefined ? "Counter codes" : `Code of state ${m[1]}`)],
  [/^counter(?:\..*)?$/, () => "Counter"],
  [/^display\.positions$/, () => "Positions"],
  [/^display\.cell$/, () => "Cell"],
  [/^display\.segments\[(\d+)\]$/, (m) => `Segment name ${Number(m[1]) + 1}`],
  [/^display\.segments$/, () => "Segments"],
  [/^display\.figure\.shapes(?:\.([a-z][a-z0-9]*))/, (m) => `Figure of segment "${m[1]}"`],
  [/^display\.figure/, () => "Cell figure"],
  [/^display$/, () => "Display"],
  [/^glyphs(?:\.(.)|\["(.+)"\])$/u, (m) => `Glyph "${m[1] ?? m[2]}"`],
  [/^glyphs$/, () => "Glyphs"],
  [/^show\[(\d+)\]$/, (m) => `State ${m[1]}'s text`],
  [/^show$/, () => "Texts per state"],
  [/^synthesis\.maxDepth$/, () => "Depth limit"],
  [/^synthesis\.depth$/, () => "Depth policy"],
  [/^synthesis\.buses$/, () => "Bus nodes"],
  [/^synthesis\.links$/, () => "Links"],
  [/^synthesis\.timeLimitMs$/, () => "Exact limit"],
  [/^synthesis\.seed$/, () => "Seed"],
  [/^synthesis/, () => "Synthesis"],
  [/^electrical\.(.+)$/, (m) => electricalLabel(m[1] ?? "") ?? `Electrical setting ${humanPath(m[1] ?? "")}`],
  [/^pattern$/, () => "Fill"],
];

/**
 * An electrical field as the Electrical panel names it, `Electrical › Segment
 * › Target current (mA)`; null for a path the panel has no field for.
 */
function electricalLabel(path: string): string | null {
  const dotted = path.replace(/\[(\d+)\]/g, ".$1");
  for (const g of ELECTRICAL_GROUPS) {
    const f = g.fields.find((x) => x.path === dotted);
    if (f) return `Electrical › ${g.title} › ${f.label}${f.unit ? ` (${f.unit})` : ""}`;
    const o = g.overrides?.find((x) => dotted.startsWith(`${x.path}.`));
    if (o) return `Electrical › ${g.title} › ${o.label} › ${dotted.slice(o.path.length + 1)}`;
  }
  return null;
}

/** `driver.emitterResistors.1a` -> `driver › emitter resistors › 1a`. */
function humanPath(path: string): string {
  return path
    .split(".")
    .map((p) => p.replace(/([a-z])([A-Z])/g, (_, a: string, b: string) => `${a} ${b.toLowerCase()}`))
    .join(" › ");
}

/** The app's name for the field a path names. */
export function fieldLabel(path: string): string {
  for (const [re, label] of LABELS) {
    const m = re.exec(path);
    if (m) return label(m);
  }
  return humanPath(path);
}

/** Paths a message may mention, as the screen names them (longest first, so `display.positions` wins over `display`). */
const MENTIONS: readonly (readonly [RegExp, string])[] = [
  [/\bset display\.cell to "custom"/g, "choose the custom Cell"],
  [/\bcounter\.states\b/g, "States"],
  [/\bdisplay\.positions\b/g, "Positions"],
  [/\bdisplay\.segments\b/g, "Segments"],
  [/\bdisplay\.cell\b/g, "Cell"],
  [/\bset display\.cell to "custom"/g, "choose the custom Cell"],
  [/\bunder glyphs, e\.g\. "glyphs": \{.*\}$/g, "in Glyphs with Add character"],
];

/**
 * A problem as one sentence for the screen.
 *
 * @example
 * problemSentence({ path: "show[5]", message: 'got "123", which fills 3 position(s) but display.positions is 2; pad with spaces for blanks' }, draft);
 * // 'State 5\'s text "123" has 3 characters; this display has 2 positions: shorten it, or add positions'
 * problemSentence({ path: "synthesis.maxDepth", message: "got 7; must be a whole number from 1 to 3" });
 * // "Depth limit: got 7; must be a whole number from 1 to 3"
 */
export function problemSentence(p: Problem, draft?: Draft): string {
  const state = /^show\[(\d+)\]$/.exec(p.path);
  if (state && draft) {
    const said = stateSentence(Number(state[1]), draft);
    if (said) return said;
  }
  if (p.path === "show" && draft) {
    return `There are ${draft.show.length} texts for ${draft.counter.states} states: give each state one text (Fill makes them all at once)`;
  }
  if (p.path === "synthesis.timeLimitMs") {
    const { min, max } = LIMITS.timeLimitMs;
    const got = /^got (-?[\d.e+-]+);/.exec(p.message);
    return `Exact limit: ${got ? `got ${Number(got[1]) / 1000} s; ` : ""}must be from ${min / 1000} to ${max / 1000} seconds`;
  }
  let message = p.message;
  for (const [re, words] of MENTIONS) message = message.replace(re, words);
  return p.path === "" ? message : `${fieldLabel(p.path)}: ${message}`;
}

/** What is wrong with one state's text, said from what was typed; undefined when the draft shows nothing wrong with it. */
function stateSentence(k: number, d: Draft): string | undefined {
  const text = d.show[k];
  if (text === undefined) return undefined;
  const quoted = JSON.stringify(text);
  if (hasUnsafeText(text)) return `State ${k}'s text holds control characters, which no display shows: remove them`;
  const cell = d.display.cell === "custom" ? { kind: "custom" as const, segments: draftSegments(d) } : builtinCell(d.display.cell);
  const positions = splitText(text, cell);
  const want = d.display.positions;
  if (positions.length !== want) {
    const n = positions.length;
    const counted =
      n === [...text].length ? `has ${n} ${n === 1 ? "character" : "characters"}` : `fills ${n} ${n === 1 ? "position" : "positions"}`;
    const fix = n > want ? "shorten it, or add positions" : "pad it with spaces for blanks, or take positions away";
    return `State ${k}'s text ${quoted} ${counted}; this display has ${want} ${want === 1 ? "position" : "positions"}: ${fix}`;
  }
  const table = effectiveGlyphs(d);
  const missing = [...new Set(positions.map((p) => p.char).filter((c) => !(c in table)))];
  if (missing.length > 0) {
    const names = missing.map((c) => JSON.stringify(c)).join(", ");
    return `State ${k}'s text ${quoted} shows ${names}, which ${missing.length === 1 ? "has" : "have"} no shape yet: add ${missing.length === 1 ? "it" : "them"} in Glyphs with Add character`;
  }
  return undefined;
}

/**
 * The problems of an opened file: the same sentences, each with the field's
 * path in the file after it, so it can be found there.
 *
 * @example
 * fileProblemLine({ path: "counter.states", message: "got 1; must be a whole number from 2 to 256" });
 * // "States (counter.states in the file): got 1; must be a whole number from 2 to 256"
 */
export function fileProblemLine(p: Problem): string {
  if (p.path === "") return p.message;
  const sentence = problemSentence(p);
  const label = fieldLabel(p.path);
  const where = `${label} (${p.path} in the file)`;
  return sentence.startsWith(`${label}: `) ? `${where}: ${sentence.slice(label.length + 2)}` : `${sentence} (${p.path} in the file)`;
}
