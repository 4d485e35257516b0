/**
 * The instrument draft: every decoder of the project as the person is
 * editing it, with the electrical section they share.
 *
 * Each decoder keeps a complete single-decoder draft (draft.ts), whose
 * `electrical` is what that decoder uses (the shared section with its own
 * overrides on top) and whose `title` is the one the core gives its project
 * (`<instrument title> - <name>`, a plain project's own title), so today's
 * panels show and edit the selected decoder unchanged. The file is written
 * by the core's `serializeInstrument` once the instrument validates: a plain
 * project (one decoder, opened or started without `decoders`) keeps the
 * single-decoder form, so old files, share links and autosaves keep their
 * form; an instrument writes the first decoder's electrical values as the
 * shared section and, per decoder, the values it changes.
 *
 * The shared section is what the Electrical panel edits: a value the
 * selected decoder takes from it changes for every decoder that takes it;
 * a value the decoder overrides changes for that decoder alone. Opened from
 * a file, the shared section is the first decoder's values, as the core
 * writes it.
 */
import { serializeInstrument, SINGLE_DECODER_NAME, validateInstrument, type Instrument } from "../../core/project/instrument.ts";
import { LIMITS } from "../../core/project/limits.ts";
import { hasUnsafeText } from "../../core/project/valueText.ts";
import type { ElectricalModel, Project } from "../../core/project/project.ts";
import { PROJECT_SCHEMA } from "../../core/project/project.ts";
import { draftFromProject, draftToJson, type Draft } from "./draft.ts";

export interface DecoderDraft {
  readonly name: string;
  /** The decoder as a complete single-decoder draft: its title (`decoderTitle`), the electrical values it uses. */
  readonly draft: Draft;
}

export interface InstrumentDraft {
  readonly title: string;
  /** The electrical section every decoder starts from. */
  readonly electrical: ElectricalModel;
  /** At least one. */
  readonly decoders: readonly DecoderDraft[];
  /** True for a plain project (one decoder, written without `decoders`); adding a decoder makes it an instrument. */
  readonly single: boolean;
}

/** Longest decoder name, characters. */
export const DECODER_NAME_MAX = LIMITS.decoderNameChars;

/** A decoder's title, as the core titles its project: the instrument's, with the decoder's name when there are several. */
export function decoderTitle(instrumentTitle: string, name: string, single: boolean): string {
  return single ? instrumentTitle : `${instrumentTitle} - ${name}`;
}

/** Every decoder titled after the instrument (`decoderTitle`). */
function retitled(inst: InstrumentDraft): InstrumentDraft {
  const single = inst.single && inst.decoders.length === 1;
  let changed = false;
  const decoders = inst.decoders.map((d) => {
    const title = decoderTitle(inst.title, d.name, single);
    if (d.draft.title === title) return d;
    changed = true;
    return { name: d.name, draft: { ...d.draft, title } };
  });
  return changed ? { ...inst, decoders } : inst;
}

/** A plain project as an instrument draft of one decoder (named as the core names it). */
export function singleDraft(d: Draft): InstrumentDraft {
  return { title: d.title, electrical: d.electrical, decoders: [{ name: SINGLE_DECODER_NAME, draft: d }], single: true };
}

/**
 * The draft of a validated instrument. The shared section takes, value by
 * value, what most decoders use (the first decoder's among equals), so a
 * value one decoder of three overrides shows as that decoder's own, however
 * the file split them: every decoder keeps the values it had.
 */
export function instrumentDraftOf(inst: Instrument): InstrumentDraft {
  const decoders = inst.decoders.map((d) => ({ name: d.name, draft: draftFromProject(d.project) }));
  const first = decoders[0];
  if (!first) throw new RangeError("an instrument has at least one decoder");
  let shared = first.draft.electrical;
  const paths = new Set(decoders.flatMap((d) => changedPaths(first.draft.electrical, d.draft.electrical)));
  for (const path of paths) {
    const counts = new Map<string, { value: unknown; n: number }>();
    for (const d of decoders) {
      const value = valueAt(d.draft.electrical, path);
      const key = JSON.stringify(value) ?? "undefined";
      const c = counts.get(key) ?? { value, n: 0 };
      counts.set(key, { value, n: c.n + 1 });
    }
    // Map keeps the first decoder's value first, so among equals it wins.
    const best = [...counts.values()].reduce((a, b) => (b.n > a.n ? b : a));
    shared = withValue(shared, path, best.value);
  }
  return retitled({ title: inst.title, electrical: shared, decoders, single: inst.single });
}

/** A plain project as an instrument draft. */
export function projectInstrumentDraft(p: Project): InstrumentDraft {
  return singleDraft(draftFromProject(p));
}

type Plain = Readonly<Record<string, unknown>>;
const isPlain = (x: unknown): x is Plain => typeof x === "object" && x !== null && !Array.isArray(x);
const same = (a: unknown, b: unknown): boolean => JSON.stringify(a) === JSON.stringify(b);

/**
 * The dotted paths of the values where `value` differs from `base` (arrays
 * and numbers are values; objects are walked).
 *
 * @example changedPaths({ supply: { voltage: 5, ripplePct: 5 } }, { supply: { voltage: 12, ripplePct: 5 } }); // ["supply.voltage"]
 */
export function changedPaths(base: unknown, value: unknown, prefix = ""): string[] {
  if (isPlain(base) && isPlain(value)) {
    const keys = [...new Set([...Object.keys(base), ...Object.keys(value)])];
    return keys.flatMap((k) => changedPaths(base[k], value[k], prefix === "" ? k : `${prefix}.${k}`));
  }
  return same(base, value) ? [] : [prefix];
}

function valueAt(x: unknown, path: string): unknown {
  return path.split(".").reduce<unknown>((o, k) => (isPlain(o) ? o[k] : undefined), x);
}

function withValue<T>(x: T, path: string, value: unknown): T {
  const [head, ...rest] = path.split(".");
  if (head === undefined || !isPlain(x)) return value as T;
  const next = rest.length === 0 ? value : withValue(x[head], rest.join("."), value);
  const out: Record<string, unknown> = { ...x };
  if (next === undefined) delete out[head];
  else out[head] = next;
  return out as T;
}

/** The electrical values a decoder overrides, as dotted paths (`supply.voltage`); empty when it takes them all from the shared section. */
export function overriddenPaths(inst: InstrumentDraft, index: number): string[] {
  const d = inst.decoders[index];
  return d ? changedPaths(inst.electrical, d.draft.electrical) : [];
}

/** Sets the instrument's title, and so every decoder's. */
export function setInstrumentTitle(inst: InstrumentDraft, title: string): InstrumentDraft {
  return title === inst.title ? inst : retitled({ ...inst, title });
}

/**
 * Puts an edited draft of one decoder back (the panels' edits): a title
 * edited there becomes the instrument's (a plain project's Title field;
 * an instrument's field edits the instrument title itself), an electrical value the decoder took from the
 * shared section changes there and for every decoder that takes it, one it
 * overrides changes for it alone; everything else is the decoder's own.
 */
export function putDecoderDraft(inst: InstrumentDraft, index: number, next: Draft): InstrumentDraft {
  const current = inst.decoders[index];
  if (!current) throw new RangeError(`decoder ${index} is outside 0..${inst.decoders.length - 1}`);
  if (next === current.draft) return inst;
  const before = current.draft.electrical;
  let shared = inst.electrical;
  const ownChanges: string[] = [];
  for (const path of changedPaths(before, next.electrical)) {
    if (same(valueAt(before, path), valueAt(inst.electrical, path))) shared = withValue(shared, path, valueAt(next.electrical, path));
    else ownChanges.push(path);
  }
  const sharedChanges = changedPaths(inst.electrical, shared);
  const decoders = inst.decoders.map((d, i) => {
    let electrical = i === index ? before : d.draft.electrical;
    for (const path of sharedChanges)
      if (same(valueAt(electrical, path), valueAt(inst.electrical, path))) electrical = withValue(electrical, path, valueAt(shared, path));
    if (i === index) {
      for (const path of ownChanges) electrical = withValue(electrical, path, valueAt(next.electrical, path));
      return { name: d.name, draft: { ...next, title: d.draft.title, electrical } };
    }
    if (electrical === d.draft.electrical) return d;
    return { name: d.name, draft: { ...d.draft, electrical } };
  });
  const title = next.title !== current.draft.title ? next.title : inst.title;
  return retitled({ ...inst, title, electrical: shared, decoders });
}

/** Why a decoder name cannot be given to decoder `index`, or null when it can. */
export function decoderNameProblem(inst: InstrumentDraft, index: number, name: string): string | null {
  const n = name.trim();
  if (n === "") return "a decoder needs a name";
  if (n.length > DECODER_NAME_MAX) return `a decoder name has at most ${DECODER_NAME_MAX} characters`;
  if (hasUnsafeText(n)) return "a decoder name cannot hold control or direction characters";
  const other = inst.decoders.findIndex((d, i) => i !== index && d.name.toLowerCase() === n.toLowerCase());
  if (other >= 0) return `decoder ${other + 1} is already called "${inst.decoders[other]?.name}"`;
  return null;
}

/** `base`, or `base 2`, `base 3`... : the first name no decoder has. */
export function freeName(inst: InstrumentDraft, base: string): string {
  const taken = new Set(inst.decoders.map((d) => d.name.toLowerCase()));
  const stem = base.slice(0, DECODER_NAME_MAX - 4);
  if (!taken.has(stem.toLowerCase())) return stem;
  for (let k = 2; ; k++) if (!taken.has(`${stem} ${k}`.toLowerCase())) return `${stem} ${k}`;
}

/**
 * Adds a decoder at the end: the given project's counter, display and texts
 * (the New project's 0-9 for the app), with the shared electrical values.
 * A plain project becomes an instrument.
 */
export function addDecoder(inst: InstrumentDraft, start: Draft): InstrumentDraft {
  if (inst.decoders.length >= LIMITS.decoders.max) return inst;
  const name = freeName(inst, `decoder ${inst.decoders.length + 1}`);
  const draft: Draft = { ...start, electrical: inst.electrical };
  return retitled({ ...inst, single: false, decoders: [...inst.decoders, { name, draft }] });
}

/** True while the instrument has room for another decoder. */
export function canAddDecoder(inst: InstrumentDraft): boolean {
  return inst.decoders.length < LIMITS.decoders.max;
}

/** Renames decoder `index`; a name `decoderNameProblem` refuses leaves the instrument as it is. */
export function renameDecoder(inst: InstrumentDraft, index: number, name: string): InstrumentDraft {
  const d = inst.decoders[index];
  if (!d || decoderNameProblem(inst, index, name) !== null || d.name === name.trim()) return inst;
  return retitled({ ...inst, decoders: inst.decoders.map((x, i) => (i === index ? { ...x, name: name.trim() } : x)) });
}

/** Copies decoder `index` (overrides included) just after it, as `<name> copy`. */
export function duplicateDecoder(inst: InstrumentDraft, index: number): InstrumentDraft {
  const d = inst.decoders[index];
  if (!d) throw new RangeError(`decoder ${index} is outside 0..${inst.decoders.length - 1}`);
  if (!canAddDecoder(inst)) return inst;
  const copy = { name: freeName(inst, `${d.name} copy`), draft: d.draft };
  return retitled({ ...inst, single: false, decoders: [...inst.decoders.slice(0, index + 1), copy, ...inst.decoders.slice(index + 1)] });
}

/** Moves decoder `index` to `to` (both 0-based); out-of-range targets are clamped. */
export function moveDecoder(inst: InstrumentDraft, index: number, to: number): InstrumentDraft {
  const d = inst.decoders[index];
  const target = Math.max(0, Math.min(inst.decoders.length - 1, to));
  if (!d || target === index) return inst;
  const rest = inst.decoders.filter((_, i) => i !== index);
  return { ...inst, decoders: [...rest.slice(0, target), d, ...rest.slice(target)] };
}

/** Removes decoder `index`; the last one stays (an instrument has at least one). */
export function removeDecoder(inst: InstrumentDraft, index: number): InstrumentDraft {
  if (inst.decoders.length <= 1 || !inst.decoders[index]) return inst;
  return retitled({ ...inst, decoders: inst.decoders.filter((_, i) => i !== index) });
}

/** The instrument in the file form (see the file's head), as a plain object. */
export function instrumentData(inst: InstrumentDraft): unknown {
  const only = inst.decoders[0];
  if (inst.single && only && inst.decoders.length === 1) return only.draft;
  return {
    schema: PROJECT_SCHEMA,
    title: inst.title,
    electrical: inst.electrical,
    decoders: inst.decoders.map((d) => {
      const { schema: _s, title: _t, electrical, ...fields } = d.draft;
      // The groups this decoder changes, whole (the core merges them over the shared section).
      const own = electrical as unknown as Plain;
      const shared = inst.electrical as unknown as Plain;
      const groups = Object.keys(own).filter((k) => !same(own[k], shared[k]));
      const overrides = Object.fromEntries(groups.map((k) => [k, own[k]]));
      return { name: d.name, ...fields, ...(groups.length > 0 ? { electrical: overrides } : {}) };
    }),
  };
}

/**
 * The instrument as JSON text, in the one form every file diodeloom writes
 * takes: once it validates, as the core's `serializeInstrument` writes it
 * (a plain project byte for byte as `draftToJson` and the Save button of
 * old wrote it); while it does not (a decoder being fixed), as it stands.
 */
export function instrumentToJson(inst: InstrumentDraft): string {
  const only = inst.decoders[0];
  if (inst.single && only && inst.decoders.length === 1) return draftToJson(only.draft);
  const v = validateInstrument(instrumentData(inst));
  return v.ok ? serializeInstrument(v.value) : JSON.stringify(instrumentData(inst), null, 2) + "\n";
}

/** A plain project as the instrument of one decoder it is (the core's reading of its file). */
export function plainInstrument(p: Project): Instrument {
  const r = validateInstrument(instrumentData(projectInstrumentDraft(p)));
  if (!r.ok) throw new Error(`bug: a valid project is not a valid instrument: ${JSON.stringify(r.error)}`);
  return r.value;
}
