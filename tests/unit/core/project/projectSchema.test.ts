import { describe, expect, it } from "vitest";
import { parseProject, splitText } from "../../../../src/core/project/projectSchema.ts";
import { builtinCell } from "../../../../src/core/glyphs/glyphs.ts";
import type { Problem } from "../../../../src/core/result/result.ts";
import { EXAMPLES, exampleText } from "../../../support/projects.ts";

const base = {
  schema: "diodeloom/project@1",
  title: "Quiz scoreboard",
  counter: { states: 3, drive: "source" },
  display: { positions: 1, cell: "seg7" },
  show: ["0", "1", "2"],
};

function problems(doc: unknown): Problem[] {
  const r = parseProject(typeof doc === "string" ? doc : JSON.stringify(doc));
  if (r.ok) throw new Error("expected the project to be rejected");
  return [...r.error];
}

function firstPath(doc: unknown): string {
  return problems(doc)[0]?.path ?? "<none>";
}

describe("parseProject accepts", () => {
  it.each(EXAMPLES)("the demo project %s", (name) => {
    const r = parseProject(exampleText(name));
    expect(r.ok).toBe(true);
  });

  it("the form given in the format's definition, filling every default", () => {
    const r = parseProject(
      JSON.stringify({
        ...base,
        counter: { states: 16, drive: "source" },
        glyphs: { b: "cdefg" },
        show: ["0", "1", "2", "3", "4", "5", "6", "7", "8", "9", "A", "b", "C", "d", "E", "F"],
        synthesis: { maxDepth: 2, depth: "per-segment", buses: true, links: true, timeLimitMs: 20000 },
      }),
    );
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.synthesis).toEqual({
      depthLimit: 2,
      policy: "per-segment",
      buses: true,
      links: true,
      timeLimitMs: 20000,
      seed: 1,
      decode: "lit",
      darkInput: "level-shift",
    });
    expect(r.value.electrical.supply.volts).toBe(100);
    expect(r.value.electrical.driver.emitterResistors).toEqual({});
    expect(r.value.glyphs["b"]).toEqual(["c", "d", "e", "f", "g"]);
    expect(Object.isFrozen(r.value.display.cell.segments)).toBe(true);
  });

  it("glyph overrides given as arrays, kept in the cell's segment order", () => {
    const r = parseProject(JSON.stringify({ ...base, glyphs: { "7": ["f", "c", "b", "a"] } }));
    expect(r.ok && r.value.glyphs["7"]).toEqual(["a", "b", "c", "f"]);
    expect(r.ok && r.value.glyphOverrides).toEqual({ "7": ["a", "b", "c", "f"] });
  });

  it("decimal points on a seg7dp cell as part of the position before", () => {
    const r = parseProject(JSON.stringify({ ...base, display: { positions: 2, cell: "seg7dp" }, show: ["0.5", "1.0", "2.5"] }));
    expect(r.ok).toBe(true);
    expect(splitText("3.5", builtinCell("seg7dp"))).toEqual([
      { char: "3", dp: true },
      { char: "5", dp: false },
    ]);
  });
});

describe("parseProject rejects, naming the field", () => {
  it("text that is not JSON", () => {
    const [p] = problems("{ schema: nope ");
    expect(p?.message).toMatch(/not valid JSON/);
  });
  it("a wrong schema", () => expect(firstPath({ ...base, schema: "other/project@9" })).toBe("schema"));
  it("a missing schema", () => expect(problems({ title: "x" })[0]?.message).toMatch(/diodeloom\/project@2/));
  it("an unknown top-level key", () => {
    const [p] = problems({ ...base, colour: "red" });
    expect(p?.path).toBe("colour");
    expect(p?.message).toMatch(/unknown key.*remove it.*allowed here/);
  });
  it("an unknown nested key", () => expect(firstPath({ ...base, counter: { states: 3, phases: 2 } })).toBe("counter.phases"));
  it.each([1, 257, 2.5, -3])("counter.states = %s", (n) => expect(firstPath({ ...base, counter: { states: n } })).toBe("counter.states"));
  it("show with the wrong number of texts", () => {
    const [p] = problems({ ...base, show: ["0", "1"] });
    expect(p?.path).toBe("show");
    expect(p?.message).toMatch(/2 texts but counter.states is 3/);
  });
  it("a text of the wrong length", () => {
    const [p] = problems({ ...base, show: ["0", "12", "2"] });
    expect(p?.path).toBe("show[1]");
    expect(p?.message).toMatch(/pad with spaces/);
  });
  it("a character with no glyph", () => {
    const [p] = problems({ ...base, show: ["0", "K", "2"] });
    expect(p?.path).toBe("show[1]");
    expect(p?.message).toMatch(/no glyph for "K"; add it under glyphs/);
  });
  it("an unknown segment name", () => {
    const [p] = problems({ ...base, glyphs: { "1": "bcx" } });
    expect(p?.path).toBe("glyphs.1");
    expect(p?.message).toMatch(/unknown segment "x"/);
  });
  it("an unknown segment in a custom cell", () => {
    const doc = {
      ...base,
      display: { positions: 1, cell: "custom", segments: ["tl", "c"] },
      glyphs: { "0": ["tl"], "1": ["c"], "2": ["br"] },
    };
    expect(firstPath(doc)).toBe("glyphs.2");
  });
  it("a custom cell without segments", () =>
    expect(firstPath({ ...base, display: { positions: 1, cell: "custom" } })).toBe("display.segments"));
  it("a negative number", () => expect(firstPath({ ...base, synthesis: { timeLimitMs: -5 } })).toBe("synthesis.timeLimitMs"));
  it("a non-finite number (1e999 parses as Infinity)", () =>
    expect(firstPath(`{"schema":"diodeloom/project@1","counter":{"states":1e999},"display":{},"show":[]}`)).toBe("counter.states"));
  it("positions outside 1-8", () => expect(firstPath({ ...base, display: { positions: 9 } })).toBe("display.positions"));
  it("maxDepth outside 1-3", () => expect(firstPath({ ...base, synthesis: { maxDepth: 4 } })).toBe("synthesis.maxDepth"));
  it("an unknown depth policy", () => {
    const [p] = problems({ ...base, synthesis: { depth: "deep" } });
    expect(p?.path).toBe("synthesis.depth");
    expect(p?.message).toMatch(/"mixed", "per-segment", "uniform"/);
  });
  it.each(["__proto__", "constructor", "prototype"])("the key %s anywhere", (key) => {
    const text = `{"schema":"diodeloom/project@1","counter":{"states":2,"${key}":{"x":1}},"display":{},"show":["0","1"]}`;
    expect(problems(text)[0]?.message).toMatch(new RegExp(`"${key}" is not allowed`));
  });
  it("a file over 1 MiB", () => {
    const big = JSON.stringify({ ...base, title: "x".repeat(10), pad: " ".repeat(1024 * 1024) });
    expect(problems(big)[0]?.message).toMatch(/larger than 1 MiB/);
  });
  it("a sink drive (not in format version 1)", () =>
    expect(firstPath({ ...base, counter: { states: 3, drive: "sink" } })).toBe("counter.drive"));
});
