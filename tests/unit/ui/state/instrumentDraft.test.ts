import { describe, expect, it } from "vitest";
import { validateInstrument } from "../../../../src/core/project/instrument.ts";
import { draftFromProject, draftToJson, type Draft } from "../../../../src/ui/state/draft.ts";
import { setStates, setText, setTitle } from "../../../../src/ui/state/draftEdits.ts";
import {
  addDecoder,
  changedPaths,
  decoderNameProblem,
  duplicateDecoder,
  instrumentData,
  instrumentDraftOf,
  instrumentToJson,
  moveDecoder,
  overriddenPaths,
  projectInstrumentDraft,
  putDecoderDraft,
  removeDecoder,
  setInstrumentTitle,
  renameDecoder,
  type InstrumentDraft,
} from "../../../../src/ui/state/instrumentDraft.ts";
import { canRedo, record, redo, startHistory, undo } from "../../../../src/ui/state/undoHistory.ts";
import { newProject } from "../../../../src/ui/state/examples.ts";
import { example } from "../../../support/projects.ts";

const hex = projectInstrumentDraft(example("relay-hex-monitor"));
const zeroToNine = draftFromProject(newProject());
const names = (i: InstrumentDraft) => i.decoders.map((d) => d.name);
/** An edit of decoder `k` as a panel makes it. */
const onDecoder = (i: InstrumentDraft, k: number, change: (d: Draft) => Draft) => putDecoderDraft(i, k, change(i.decoders[k]!.draft));
/** A draft with one electrical value set (dotted path), as the Electrical panel's fields set them. */
function setElectrical(d: Draft, path: string, value: number): Draft {
  const [group, key] = path.split(".") as [string, string | undefined];
  const e = d.electrical as unknown as Record<string, Record<string, unknown>>;
  const electrical = key === undefined ? { ...e, [group]: value } : { ...e, [group]: { ...e[group], [key]: value } };
  return { ...d, electrical: electrical as unknown as Draft["electrical"] };
}
/** The instrument as the core reads the form the app writes. */
function coreRead(i: InstrumentDraft) {
  const r = validateInstrument(JSON.parse(instrumentToJson(i)));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return r.value;
}

describe("the decoder list's edits", () => {
  it("adds, renames, duplicates, reorders and removes decoders, each an undo step that undo and redo walk back and forth", () => {
    let h = startHistory(hex);
    h = record(h, addDecoder(h.present, zeroToNine));
    expect(names(h.present)).toEqual(["main", "decoder 2"]);
    h = record(h, renameDecoder(h.present, 1, "  minutes "));
    expect(names(h.present)).toEqual(["main", "minutes"]);
    h = record(h, duplicateDecoder(h.present, 1));
    expect(names(h.present)).toEqual(["main", "minutes", "minutes copy"]);
    h = record(h, moveDecoder(h.present, 2, 0));
    expect(names(h.present)).toEqual(["minutes copy", "main", "minutes"]);
    h = record(h, removeDecoder(h.present, 1));
    expect(names(h.present)).toEqual(["minutes copy", "minutes"]);
    const steps = [
      ["minutes copy", "main", "minutes"],
      ["main", "minutes", "minutes copy"],
      ["main", "minutes"],
      ["main", "decoder 2"],
      ["main"],
    ];
    for (const expected of steps) {
      h = undo(h);
      expect(names(h.present)).toEqual(expected);
    }
    expect(h.present).toBe(hex);
    for (let k = 0; k < 5; k++) h = redo(h);
    expect(canRedo(h)).toBe(false);
    expect(names(h.present)).toEqual(["minutes copy", "minutes"]);
  });

  it("refuses an empty, over-long or taken name (case aside) and leaves the instrument as it was", () => {
    const two = renameDecoder(addDecoder(hex, zeroToNine), 1, "Hours");
    expect(decoderNameProblem(two, 0, "")).toBe("a decoder needs a name");
    expect(decoderNameProblem(two, 0, "hours")).toBe('decoder 2 is already called "Hours"');
    expect(decoderNameProblem(two, 1, "hours")).toBeNull();
    expect(decoderNameProblem(two, 0, "x".repeat(41))).toMatch(/at most 40/);
    expect(renameDecoder(two, 0, "HOURS")).toBe(two);
    expect(renameDecoder(two, 0, "  ")).toBe(two);
  });

  it("keeps the last decoder, and makes free names for copies of copies", () => {
    expect(removeDecoder(hex, 0)).toBe(hex);
    const three = duplicateDecoder(duplicateDecoder(addDecoder(hex, zeroToNine), 1), 1);
    expect(names(three)).toEqual(["main", "decoder 2", "decoder 2 copy 2", "decoder 2 copy"]);
    expect(moveDecoder(three, 0, -5)).toBe(three);
    expect(names(moveDecoder(three, 0, 99))).toEqual(["decoder 2", "decoder 2 copy 2", "decoder 2 copy", "main"]);
  });

  it("gives a decoder's own edits to it alone, and the title to the instrument", () => {
    let two = addDecoder(hex, zeroToNine);
    two = onDecoder(two, 1, (d) => setText(setStates(d, 6), 5, "5"));
    two = setInstrumentTitle(two, "Bench instrument");
    expect(two.decoders[1]?.draft.show).toEqual(["0", "1", "2", "3", "4", "5"]);
    expect(two.decoders[0]?.draft.show).toEqual(hex.decoders[0]?.draft.show);
    expect(two.title).toBe("Bench instrument");
    // Each decoder's project is titled as the core titles it, and follows a rename.
    expect(two.decoders.map((d) => d.draft.title)).toEqual(["Bench instrument - main", "Bench instrument - decoder 2"]);
    expect(renameDecoder(two, 1, "units").decoders[1]?.draft.title).toBe("Bench instrument - units");
    expect(coreRead(two).decoders.map((d) => d.project.title)).toEqual(two.decoders.map((d) => d.draft.title));
    // A plain project's Title field edits its own title.
    const plain = onDecoder(hex, 0, (d) => setTitle(d, "Hex"));
    expect([plain.title, plain.decoders[0]?.draft.title]).toEqual(["Hex", "Hex"]);
  });
});

describe("the shared electrical section", () => {
  const two = addDecoder(hex, zeroToNine);
  const supply = (i: InstrumentDraft, k: number) => i.decoders[k]?.draft.electrical.supply.volts;
  const v0 = supply(two, 0) as number;
  /** The two decoders from a file where decoder 2 overrides the supply voltage (the panels edit the shared section). */
  function withOwnSupply(volts: number): InstrumentDraft {
    const data = instrumentData(two) as { decoders: Record<string, unknown>[]; electrical: { supply: object } };
    const decoders = [data.decoders[0], { ...data.decoders[1], electrical: { supply: { ...data.electrical.supply, volts } } }];
    const r = validateInstrument({ ...data, decoders });
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    return instrumentDraftOf(r.value);
  }

  it("edits the shared section from any decoder's panel: a decoder without overrides changes it for all", () => {
    const next = putDecoderDraft(two, 1, setElectrical(two.decoders[1]!.draft, "supply.volts", v0 + 0.05));
    expect([supply(next, 0), supply(next, 1), next.electrical.supply.volts]).toEqual([v0 + 0.05, v0 + 0.05, v0 + 0.05]);
    expect(overriddenPaths(next, 1)).toEqual([]);
  });

  it("changes a shared value for every decoder that takes it, and an overridden one for its decoder alone", () => {
    const own = withOwnSupply(v0 + 0.2);
    expect(overriddenPaths(own, 1)).toEqual(["supply.volts"]);
    expect(overriddenPaths(own, 0)).toEqual([]);
    // The panel on decoder 1 edits the shared supply: decoder 2 keeps its own.
    const shared = putDecoderDraft(own, 0, setElectrical(own.decoders[0]!.draft, "supply.volts", v0 + 0.1));
    expect([supply(shared, 0), supply(shared, 1), shared.electrical.supply.volts]).toEqual([v0 + 0.1, v0 + 0.2, v0 + 0.1]);
    // The panel on decoder 2 edits its own value: the shared one stays.
    const again = putDecoderDraft(shared, 1, setElectrical(shared.decoders[1]!.draft, "supply.volts", v0 + 0.15));
    expect([supply(again, 0), supply(again, 1), again.electrical.supply.volts]).toEqual([v0 + 0.1, v0 + 0.15, v0 + 0.1]);
    // A shared value decoder 2 does not override still reaches it from decoder 1's panel.
    const pd = putDecoderDraft(again, 0, setElectrical(again.decoders[0]!.draft, "pullDown", 47_000));
    expect(pd.decoders.map((d) => d.draft.electrical.pullDown)).toEqual([47_000, 47_000]);
  });

  it("writes the shared section once and a decoder's overridden groups beside it, and the core reads every decoder's values back", () => {
    const own = withOwnSupply(v0 + 0.2);
    const data = instrumentData(own) as { decoders: Record<string, unknown>[] };
    expect(data.decoders[0]).not.toHaveProperty("electrical");
    expect(Object.keys(data.decoders[1]?.electrical as object)).toEqual(["supply"]);
    const read = coreRead(own);
    expect(read.single).toBe(false);
    expect(read.decoders.map((d) => d.project.electrical.supply.volts)).toEqual([v0, v0 + 0.2]);
    // Opened again, the draft is the same, and so is the file it writes.
    expect(instrumentToJson(instrumentDraftOf(read))).toBe(instrumentToJson(own));
  });

  it("shares what most decoders use: one decoder of three overriding a value shows as its own, however the file split them", () => {
    const three = addDecoder(two, zeroToNine);
    const data = instrumentData(three) as { decoders: Record<string, unknown>[]; electrical: { supply: object } };
    // The file shares decoder 1's supply, and the other two override it alike (as serializeInstrument writes it).
    const other = { supply: { ...data.electrical.supply, volts: v0 + 0.2 } };
    const decoders = [data.decoders[0], { ...data.decoders[1], electrical: other }, { ...data.decoders[2], electrical: other }];
    const r = validateInstrument({ ...data, decoders });
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    const back = instrumentDraftOf(r.value);
    expect(back.electrical.supply.volts).toBe(v0 + 0.2);
    expect([0, 1, 2].map((k) => overriddenPaths(back, k))).toEqual([["supply.volts"], [], []]);
    expect([0, 1, 2].map((k) => supply(back, k))).toEqual([v0, v0 + 0.2, v0 + 0.2]);
  });

  it("names the changed values by path", () => {
    expect(changedPaths({ a: { b: 1, c: [1, 2] }, d: 3 }, { a: { b: 1, c: [1, 3] }, d: 4 })).toEqual(["a.c", "d"]);
  });
});

describe("the file form", () => {
  it("writes a plain project in the single-decoder form, byte for byte as before instruments", () => {
    expect(instrumentToJson(hex)).toBe(draftToJson(draftFromProject(example("relay-hex-monitor"))));
    const read = coreRead(hex);
    expect(read.single).toBe(true);
    expect(read.decoders[0]?.project).toEqual(example("relay-hex-monitor"));
  });

  it("writes an instrument with its decoders in order, each with its own counter, texts and synthesis", () => {
    const two = renameDecoder(addDecoder(hex, zeroToNine), 1, "units");
    const read = coreRead(two);
    expect(read.decoders.map((d) => [d.name, d.project.counter.states, d.project.show.join("")])).toEqual([
      ["main", 16, "0123456789AbCdEF"],
      ["units", 10, "0123456789"],
    ]);
  });
});
