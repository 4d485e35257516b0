import { describe, expect, it } from "vitest";
import { parseInstrument, serializeInstrument, SINGLE_DECODER_NAME, validateInstrument } from "../../../../src/core/project/instrument.ts";
import { LIMITS } from "../../../../src/core/project/limits.ts";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { EXAMPLES, exampleText } from "../../../support/projects.ts";

/** A single-decoder file written as a one-decoder instrument: its electrical section at the top, the rest inside `decoders`. */
function asInstrument(text: string, name = "only"): { instrumentText: string; title: string } {
  const { schema, title, electrical, ...rest } = JSON.parse(text) as Record<string, unknown>;
  const doc = { schema, title: title ?? "Untitled", ...(electrical !== undefined ? { electrical } : {}), decoders: [{ name, ...rest }] };
  return { instrumentText: JSON.stringify(doc), title: String(title ?? "Untitled") };
}

const seg7 = (name: string, show: readonly string[], extra: Record<string, unknown> = {}) => ({
  name,
  counter: { states: show.length },
  display: { positions: 1 },
  show,
  ...extra,
});

function problemsOf(doc: unknown): readonly { path: string; message: string }[] {
  const r = validateInstrument(doc);
  if (r.ok) throw new Error("expected problems");
  return r.error;
}

describe("parseInstrument: a single-decoder file", () => {
  it.each(EXAMPLES)("gives one decoder named main, the very project parseProject gives (%s)", (name) => {
    const text = exampleText(name);
    const single = parseProject(text);
    const inst = parseInstrument(text);
    expect(single.ok && inst.ok).toBe(true);
    if (!single.ok || !inst.ok) return;
    expect(inst.value.single).toBe(true);
    expect(inst.value.title).toBe(single.value.title);
    expect(inst.value.decoders).toHaveLength(1);
    expect(inst.value.decoders[0]?.name).toBe(SINGLE_DECODER_NAME);
    expect(inst.value.decoders[0]?.project).toEqual(single.value);
  });

  it("reads a format-1 file as before", () => {
    const text = JSON.stringify({
      schema: "diodeloom/project@1",
      counter: { states: 2 },
      display: {},
      show: ["0", "1"],
      electrical: { string: { dies: 4 } },
    });
    const a = parseProject(text);
    const b = parseInstrument(text);
    expect(a.ok && b.ok && b.value.decoders[0]?.project).toEqual(a.ok && a.value);
  });

  it("gives the single-project problems unchanged", () => {
    const text = JSON.stringify({ schema: "diodeloom/project@2", counter: { states: 2 }, display: {}, show: ["0"] });
    const a = parseProject(text);
    const b = parseInstrument(text);
    expect(a.ok).toBe(false);
    expect(b).toEqual(a);
  });
});

describe("parseInstrument: one decoder written inside decoders", () => {
  it.each(EXAMPLES)("gives the same project as the single file, but for the title (%s)", (name) => {
    const text = exampleText(name);
    const single = parseProject(text);
    const { instrumentText, title } = asInstrument(text);
    const inst = parseInstrument(instrumentText);
    expect(inst.ok).toBe(true);
    if (!single.ok || !inst.ok) return;
    expect(inst.value.single).toBe(false);
    const d = inst.value.decoders[0];
    expect(d?.name).toBe("only");
    expect(d?.project.title).toBe(`${title} - only`);
    expect({ ...d?.project, title: single.value.title }).toEqual(single.value);
  });

  it("synthesizes the same verified matrix through either form (turntable-position)", async () => {
    const text = exampleText("turntable-position");
    const single = parseProject(text);
    const inst = parseInstrument(asInstrument(text).instrumentText);
    if (!single.ok || !inst.ok) throw new Error("fixture");
    const p = inst.value.decoders[0]?.project;
    if (!p) throw new Error("no decoder");
    const settings = { ...synthSettings(single.value), timeLimitMs: 20_000 };
    const a = await synthesize(compileSpec(single.value), settings);
    const b = await synthesize(compileSpec(p), { ...synthSettings(p), timeLimitMs: 20_000 });
    expect(b).toEqual(a);
  }, 60_000);
});

describe("parseInstrument: the shared electrical section and its overrides", () => {
  const doc = {
    schema: "diodeloom/project@2",
    title: "Scoreboard",
    electrical: { preset: "panel-12v-sink", pullDown: 47_000, segment: { targetA: 0.012, seriesResistors: { "1a": 330 } } },
    decoders: [
      seg7("home", ["0", "1", "2"]),
      seg7("guest", ["0", "1", "2"], { electrical: { segment: { targetA: 0.008, seriesResistors: { "1b": 390 } }, temperatureC: 35 } }),
    ],
  };

  it("merges each decoder's electrical over the shared one, key by key", () => {
    const r = validateInstrument(doc);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const [home, guest] = r.value.decoders.map((d) => d.project.electrical);
    expect(home?.preset).toBe("panel-12v-sink");
    expect(guest?.preset).toBe("panel-12v-sink");
    expect(home?.pullDown).toBe(47_000);
    expect(guest?.pullDown).toBe(47_000);
    expect(home?.segment.targetA).toBe(0.012);
    expect(guest?.segment.targetA).toBe(0.008);
    // The rest of `segment` stays the shared section's (the preset's here).
    expect(guest?.segment.leds).toBe(home?.segment.leds);
    // A per-output map given replaces the shared one whole: its keys are one decoder's output names.
    expect(home?.segment.seriesResistors).toEqual({ "1a": 330 });
    expect(guest?.segment.seriesResistors).toEqual({ "1b": 390 });
    expect(guest?.temperatureC).toBe(35);
    expect(home?.temperatureC).not.toBe(35);
  });

  it("means what the same decoder means as a single file with the merged section", () => {
    const r = validateInstrument(doc);
    const single = parseProject(
      JSON.stringify({
        schema: "diodeloom/project@2",
        title: "Scoreboard - guest",
        counter: { states: 3 },
        display: { positions: 1 },
        show: ["0", "1", "2"],
        electrical: {
          preset: "panel-12v-sink",
          pullDown: 47_000,
          segment: { targetA: 0.008, seriesResistors: { "1b": 390 } },
          temperatureC: 35,
        },
      }),
    );
    expect(r.ok && single.ok).toBe(true);
    if (r.ok && single.ok) expect(r.value.decoders[1]?.project).toEqual(single.value);
  });

  it("titles each decoder's project by the instrument and the name, and freezes it", () => {
    const r = validateInstrument(doc);
    if (!r.ok) throw new Error("fixture");
    expect(r.value.decoders.map((d) => d.project.title)).toEqual(["Scoreboard - home", "Scoreboard - guest"]);
    expect(Object.isFrozen(r.value.decoders[0]?.project)).toBe(true);
    expect(Object.isFrozen(r.value.decoders)).toBe(true);
  });

  it("round-trips through serializeInstrument, the shared section written once", () => {
    const r = validateInstrument(doc);
    if (!r.ok) throw new Error("fixture");
    const text = serializeInstrument(r.value);
    const again = parseInstrument(text);
    expect(again.ok).toBe(true);
    if (!again.ok) return;
    expect(again.value).toEqual(r.value);
    expect(serializeInstrument(again.value)).toBe(text);
    const written = JSON.parse(text);
    expect(written.decoders[0].electrical).toBeUndefined();
    expect(written.decoders[1].electrical).toEqual({ temperatureC: 35, segment: { seriesResistors: { "1b": 390 }, targetA: 0.008 } });
  });

  it("writes a single-decoder file as serializeProject does", () => {
    const r = parseInstrument(exampleText("die-roller"));
    if (!r.ok) throw new Error("fixture");
    const text = serializeInstrument(r.value);
    expect(JSON.parse(text).decoders).toBeUndefined();
    const again = parseInstrument(text);
    expect(again.ok && again.value.decoders[0]?.project).toEqual(r.value.decoders[0]?.project);
  });
});

describe("validateInstrument: problems", () => {
  const base = { schema: "diodeloom/project@2", title: "T" };

  it("names a decoder's bad text with the decoder's index", () => {
    const problems = problemsOf({
      ...base,
      decoders: [seg7("a", ["0", "1"]), seg7("b", ["0", "1"]), seg7("c", ["0", "1", "2", "3", "?"])],
    });
    expect(problems).toHaveLength(1);
    expect(problems[0]?.path).toBe("decoders[2].show[4]");
    expect(problems[0]?.message).toMatch(/no glyph for "\?"/);
  });

  it("names a missing counter inside the decoder", () => {
    const { counter: _c, ...noCounter } = seg7("a", ["0", "1"]);
    expect(problemsOf({ ...base, decoders: [noCounter] })[0]?.path).toBe("decoders[0].counter");
  });

  it("puts a bad override at the decoder's path and a bad shared value at the shared path, once", () => {
    const own = problemsOf({ ...base, decoders: [seg7("a", ["0", "1"], { electrical: { pullDown: -1 } })] });
    expect(own.map((p) => p.path)).toEqual(["decoders[0].electrical.pullDown"]);
    const shared = problemsOf({ ...base, electrical: { pullDown: -1 }, decoders: [seg7("a", ["0", "1"]), seg7("b", ["0", "1"])] });
    expect(shared.map((p) => p.path)).toEqual(["electrical.pullDown"]);
    expect(shared[0]?.message).toMatch(/the shared section, as decoder "a" uses it/);
  });

  it("refuses duplicate names, letter case aside", () => {
    const problems = problemsOf({ ...base, decoders: [seg7("Hours", ["0", "1"]), seg7("hours", ["0", "1"])] });
    expect(problems).toEqual([{ path: "decoders[1].name", message: expect.stringMatching(/also the name of decoders\[0\]/) }]);
  });

  it.each([
    [undefined, /missing; add "name"/],
    ["", /needs a letter or digit/],
    ["   ", /needs a letter or digit/],
    [" x", /without spaces at its ends/],
    ["a\u0007b", /control/],
    ["x".repeat(LIMITS.decoderNameChars + 1), /at most 40/],
    [7, /must be a string/],
  ])("refuses the name %j", (name, message) => {
    const d = name === undefined ? { counter: { states: 2 }, display: {}, show: ["0", "1"] } : { ...seg7("x", ["0", "1"]), name };
    const problems = problemsOf({ ...base, decoders: [d] });
    expect(problems[0]?.path).toBe("decoders[0].name");
    expect(problems[0]?.message).toMatch(message);
  });

  it("limits the number of decoders", () => {
    expect(problemsOf({ ...base, decoders: [] })[0]).toEqual({ path: "decoders", message: "got 0 decoders; an instrument has 1 to 16" });
    const many = Array.from({ length: LIMITS.decoders.max + 1 }, (_, i) => seg7(`d${i}`, ["0", "1"]));
    expect(problemsOf({ ...base, decoders: many })[0]?.message).toMatch(/got 17 decoders/);
    expect(validateInstrument({ ...base, decoders: many.slice(0, LIMITS.decoders.max) }).ok).toBe(true);
  });

  it("asks for format 2 and says where the single-decoder keys go", () => {
    expect(problemsOf({ ...base, schema: "diodeloom/project@1", decoders: [seg7("a", ["0", "1"])] })[0]?.path).toBe("schema");
    const moved = problemsOf({ ...base, counter: { states: 2 }, decoders: [seg7("a", ["0", "1"])] });
    expect(moved[0]).toEqual({ path: "counter", message: expect.stringMatching(/inside each decoder/) });
    const titled = problemsOf({ ...base, decoders: [{ ...seg7("a", ["0", "1"]), title: "x" }] });
    expect(titled[0]?.path).toBe("decoders[0].title");
    expect(problemsOf({ ...base, decoders: {} })[0]?.path).toBe("decoders");
    expect(problemsOf({ ...base, decoders: [5] })[0]?.path).toBe("decoders[0]");
    expect(problemsOf({ ...base, electrical: [], decoders: [seg7("a", ["0", "1"])] })[0]?.path).toBe("electrical");
    expect(problemsOf({ ...base, decoders: [seg7("a", ["0", "1"], { electrical: 3 })] })[0]?.path).toBe("decoders[0].electrical");
  });

  it("parseProject refuses a decoders file and points to the instrument reader", () => {
    const r = parseProject(JSON.stringify({ ...base, decoders: [seg7("a", ["0", "1"])] }));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error[0]).toEqual({ path: "decoders", message: expect.stringMatching(/instrument/) });
  });

  it("keeps a key named __proto__ as data in the merge, never as a prototype", () => {
    const over = JSON.parse('{"__proto__": {"polluted": 1}}');
    const problems = problemsOf({ ...base, decoders: [seg7("a", ["0", "1"], { electrical: over })] });
    expect(problems[0]?.path).toMatch(/^decoders\[0\]\.electrical/);
    expect(({} as Record<string, unknown>)["polluted"]).toBeUndefined();
  });
});

describe("docs/project-format.md", () => {
  it("gives an instrument example that reads as two decoders with the override applied", async () => {
    const { readFileSync } = await import("node:fs");
    const doc = readFileSync(new URL("../../../../docs/project-format.md", import.meta.url), "utf8");
    const section = doc.slice(doc.indexOf("## An instrument"));
    const json = /```json\n([\s\S]*?)```/.exec(section)?.[1] ?? "";
    const r = parseInstrument(json);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.decoders.map((d) => d.name)).toEqual(["seconds", "tens"]);
    expect(r.value.decoders.map((d) => d.project.electrical.segment.targetA)).toEqual([0.008, 0.006]);
    const { min, max } = LIMITS.decoders;
    expect(doc).toContain(`| \`decoders\` of an instrument | ${min}-${max} |`);
    expect(doc).toContain(`| a decoder's \`name\` | 1-${LIMITS.decoderNameChars} characters |`);
  });
});
