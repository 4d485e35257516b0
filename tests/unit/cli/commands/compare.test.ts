import { describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import { recordingIo } from "../../../support/recordingIo.ts";

describe("diodeloom compare (in-process)", () => {
  it("prints diodeloom/compare@1 rows, best first, for every variant combination", async () => {
    const io = recordingIo();
    expect(await main(["compare", "public/examples/relay-hex-monitor.json", "--json", "--fast"], io)).toBe(0);
    const doc = JSON.parse(io.stdout.join(""));
    expect(doc.schema).toBe("diodeloom/compare@1");
    expect(doc.rows).toHaveLength(8); // 6, 7 and 9 each in two styles
    for (const r of doc.rows) expect(Object.keys(r.glyphs).sort()).toEqual(["6", "7", "9"]);
    const counts = doc.rows.map((r: { count: number }) => r.count);
    expect(counts).toEqual([...counts].sort((a, b) => a - b));
    expect(new Set(doc.rows.map((r: { glyphs: object }) => JSON.stringify(r.glyphs))).size).toBe(8);
  });
  it("draws the chosen glyphs in the readable report", async () => {
    const io = recordingIo();
    expect(await main(["compare", "public/examples/relay-hex-monitor.json", "--fast"], io)).toBe(0);
    const text = io.stdout.join("");
    expect(text).toMatch(/#1 {2}\d+ diodes/);
    expect(text).toContain("6=acdefg");
    expect(text).toContain("|_|"); // the bottom of a 6 or the middle of a 9
  });
  it("says so when nothing varies (a custom cell)", async () => {
    const io = recordingIo();
    expect(await main(["compare", "public/examples/die-roller.json", "--json", "--fast"], io)).toBe(0);
    const doc = JSON.parse(io.stdout.join(""));
    expect(doc.rows).toHaveLength(1);
    expect(doc.rows[0].glyphs).toEqual({});
    const io2 = recordingIo();
    expect(await main(["compare", "public/examples/die-roller.json", "--fast"], io2)).toBe(0);
    expect(io2.stdout.join("")).toMatch(/nothing to compare/);
  });
  it("exact rows carry bounds that never exceed their counts", async () => {
    const small = { schema: "diodeloom/project@1", counter: { states: 4 }, display: {}, show: ["6", "7", "9", "1"] };
    const io = recordingIo({ "small.json": JSON.stringify(small) });
    expect(await main(["compare", "small.json", "--json"], io)).toBe(0);
    const doc = JSON.parse(io.stdout.join(""));
    for (const r of doc.rows) {
      expect(r.lowerBound).not.toBeNull();
      expect(r.lowerBound).toBeLessThanOrEqual(r.count);
      expect(r.optimal).toBe(r.lowerBound === r.count);
    }
    expect(doc.rows.some((r: { optimal: boolean }) => r.optimal)).toBe(true);
  }, 60_000);
  it("rejects a bad file with exit 2", async () => {
    const io = recordingIo({ "bad.json": "{}" });
    expect(await main(["compare", "bad.json"], io)).toBe(2);
  });
});

describe("diodeloom compare --polarity", () => {
  it("adds lit, dark and either rows per glyph style, with diodes, level shift, resistors and bound", async () => {
    const file = { schema: "diodeloom/project@2", counter: { states: 4 }, display: {}, show: ["1", "7", "4", "0"] };
    const io = recordingIo({ "p.json": JSON.stringify(file) });
    expect(await main(["compare", "p.json", "--polarity", "--fast"], io)).toBe(0);
    const text = io.stdout.join("");
    expect(text).toContain("Decode polarity on complementary counter lines (S<k> and nS<k>)");
    // 7 in two styles, three polarities each.
    expect(text.match(/^ {2}7=\S+ +(lit|dark|either) +\d+ +\d+ +\d+ +\d+ +\d+ {2}heuristic; no bound$/gm)).toHaveLength(6);
    const json = recordingIo({ "p.json": JSON.stringify(file) });
    expect(await main(["compare", "p.json", "--polarity", "--json", "--fast"], json)).toBe(0);
    const doc = JSON.parse(json.stdout.join(""));
    expect(doc.polarity.map((r: { decode: string }) => r.decode)).toEqual(["lit", "dark", "either", "lit", "dark", "either"]);
  });
});
