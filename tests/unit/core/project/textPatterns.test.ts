import { describe, expect, it } from "vitest";
import { fillPattern } from "../../../../src/core/project/textPatterns.ts";

function texts(pattern: string, positions: number): string[] {
  const r = fillPattern(pattern, positions);
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return r.value;
}

describe("fillPattern", () => {
  it("counts 0-9 on one position", () => {
    expect(texts("0-9", 1)).toEqual(["0", "1", "2", "3", "4", "5", "6", "7", "8", "9"]);
  });
  it("right-aligns 1-12 with a leading blank", () => {
    const t = texts("1-12 with leading blank", 2);
    expect(t).toHaveLength(12);
    expect(t[0]).toBe(" 1");
    expect(t[8]).toBe(" 9");
    expect(t[9]).toBe("10");
    expect(t[11]).toBe("12");
  });
  it("pads with zeros when the start is written with one", () => {
    const t = texts("00-59", 2);
    expect(t).toHaveLength(60);
    expect(t.slice(0, 2)).toEqual(["00", "01"]);
    expect(t[59]).toBe("59");
  });
  it("pads with zeros on request", () => {
    expect(texts("8-11 with leading zeros", 2)).toEqual(["08", "09", "10", "11"]);
  });
  it("counts in hex with the seven-segment letter forms", () => {
    expect(texts("0-F", 1).join("")).toBe("0123456789AbCdEF");
  });
  it("joins ranges and counts down", () => {
    expect(texts("3-1, 7-8", 1)).toEqual(["3", "2", "1", "7", "8"]);
  });
  it("names the pattern when a number does not fit", () => {
    const r = fillPattern("0-12", 1);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error[0]?.path).toBe("pattern");
      expect(r.error[0]?.message).toMatch(/10 needs 2 positions/);
    }
  });
  it("rejects text that is not a range", () => {
    expect(fillPattern("hello", 1).ok).toBe(false);
    expect(fillPattern("", 1).ok).toBe(false);
    expect(fillPattern("5-5", 1).ok).toBe(false);
  });
  it("honours the words it documents, 'a' or 'an' included, and names any other words instead of taking them", () => {
    expect(texts("1-12 with leading zero", 2)[0]).toBe("01");
    expect(texts("1-12 with a leading blank", 2)[0]).toBe(" 1");
    for (const [pattern, words] of [
      ["1-12 with leading zeros please", '"with leading zeros please"'],
      ["1-12 leading zero", '"leading zero"'],
      ["0-9 in red", '"in red"'],
    ] as const) {
      const r = fillPattern(pattern, 2);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error[0]?.message).toContain(`${words} after`);
      if (!r.ok) expect(r.error[0]?.message).toMatch(/a range may end with "with leading zeros" or "with leading blanks", nothing else$/);
    }
  });
});
