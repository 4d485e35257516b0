import { describe, expect, it } from "vitest";
import { describeValue, fieldPath, hasUnsafeText, quoteText } from "../../../../src/core/project/valueText.ts";

describe("quoteText", () => {
  it("escapes like JSON, and also C1 controls, DEL and the bidirectional controls", () => {
    expect(quoteText('say "hi"\\')).toBe('"say \\"hi\\"\\\\"');
    expect(quoteText("\u001b]0;title\u0007\u001b[2J")).toBe('"\\u001b]0;title\\u0007\\u001b[2J"');
    expect(quoteText("a\u009bb\u007f")).toBe('"a\\u009bb\\u007f"');
    expect(quoteText("abc\u202edef")).toBe('"abc\\u202edef"');
    expect(quoteText("line\nnext\ttab")).toBe('"line\\nnext\\ttab"');
    expect(quoteText("\ud800x")).toBe('"\\ud800x"');
    expect(quoteText("µA 😀 Ω")).toBe('"µA 😀 Ω"');
  });

  it("cuts a long text to an excerpt that says how long the whole is", () => {
    expect(quoteText("x".repeat(1_000_000))).toBe(`"${"x".repeat(40)}…" (1000000 characters)`);
    expect(quoteText("😀".repeat(50), 3)).toBe('"😀😀😀…" (50 characters)');
  });

  it("leaves nothing a terminal would act on", () => {
    const all = Array.from({ length: 0xa0 }, (_, i) => String.fromCharCode(i)).join("");
    expect(quoteText(all, 1000)).not.toMatch(/[\u0000-\u001f\u007f-\u009f]/);
    expect(hasUnsafeText(all)).toBe(true);
    expect(hasUnsafeText("plain text, Ω")).toBe(false);
  });
});

describe("describeValue", () => {
  it("names numbers and literals as written, text quoted, and containers by kind and size", () => {
    expect(describeValue(7)).toBe("7");
    expect(describeValue(5e-324)).toBe("5e-324");
    expect(describeValue(Number.NaN)).toBe("NaN");
    expect(describeValue(true)).toBe("true");
    expect(describeValue(null)).toBe("null");
    expect(describeValue(undefined)).toBe("nothing");
    expect(describeValue("bad")).toBe('"bad"');
    expect(describeValue(["bc"])).toBe("an array of 1 item");
    expect(describeValue([])).toBe("an array of 0 items");
    expect(describeValue({})).toBe("an empty object");
    expect(describeValue({ a: 1, b: 2, c: 3, d: 4 })).toBe('an object with the keys "a", "b", "c", …');
  });
});

describe("fieldPath", () => {
  it("joins keys with dots and puts indices and unusual keys in brackets", () => {
    expect(fieldPath(["show", 1])).toBe("show[1]");
    expect(fieldPath(["electrical", "driver", "emitterResistors", "1a"])).toBe("electrical.driver.emitterResistors.1a");
    expect(fieldPath(["glyphs", "7"])).toBe("glyphs.7");
    expect(fieldPath(["glyphs", "."])).toBe('glyphs["."]');
    expect(fieldPath(["\u001b[2J"])).toBe('["\\u001b[2J"]');
    expect(fieldPath([])).toBe("");
  });
});
