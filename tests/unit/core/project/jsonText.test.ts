import { describe, expect, it } from "vitest";
import { lineColumn, readJson } from "../../../../src/core/project/jsonText.ts";

const opts = { maxNesting: 32, forbiddenKeys: new Set(["__proto__", "constructor", "prototype"]) };

function refusal(text: string, o = opts): { path: string; message: string } {
  const r = readJson(text, o);
  if (r.ok) throw new Error("expected a refusal");
  return r.error;
}

describe("readJson", () => {
  it("reads JSON as JSON.parse does", () => {
    const text = '{"a": [1, -2.5e3, "x\\u00e9\\n", true, false, null], "b": {}}';
    const r = readJson(text, opts);
    expect(r.ok && r.value.value).toStrictEqual(JSON.parse(text));
  });

  it("names a key given twice, with both places", () => {
    expect(refusal('{"counter": {"states": "bad",\n  "states": 4}}')).toEqual({
      path: "counter.states",
      message: "appears twice in one object (at line 1, column 14 and again at line 2, column 3); keep one of them",
    });
    expect(refusal('{"schema": "x", "schema": "y"}').path).toBe("schema");
    // The same key in two different objects is fine.
    expect(readJson('[{"a": 1}, {"a": 2}]', opts).ok).toBe(true);
  });

  it("refuses __proto__, constructor and prototype anywhere, naming the path", () => {
    expect(refusal('{"a": {"__proto__": {"x": 1}}}')).toEqual({
      path: "a.__proto__",
      message: 'the key "__proto__" is not allowed anywhere in a project (line 1, column 8); remove it',
    });
    // Without the option such a key is plain data, never the prototype.
    const r = readJson('{"__proto__": {"polluted": true}}', { maxNesting: 4 });
    expect(r.ok && Object.getPrototypeOf(r.value.value)).toBe(Object.prototype);
    expect(r.ok && Object.keys(r.value.value as object)).toEqual(["__proto__"]);
  });

  it("refuses nesting past the limit with a message, not a stack overflow", () => {
    const deep = '{"title": ' + "[".repeat(3000) + "]".repeat(3000) + "}";
    expect(refusal(deep)).toEqual({
      path: "",
      message: "arrays and objects nest deeper than 32 levels at line 1, column 42, inside title[0][0]…; a project needs far fewer",
    });
    expect(readJson("[".repeat(32) + "]".repeat(32), opts).ok).toBe(true);
    expect(readJson("[".repeat(33) + "]".repeat(33), opts).ok).toBe(false);
  });

  it("says where the syntax breaks and what was expected", () => {
    expect(refusal('{"a": 1,\n "b" 2}').message).toBe(
      'not valid JSON: expected ":" after the key at line 2, column 6, found "2}"; check for a missing comma, quote or bracket',
    );
    expect(refusal("{\"a\": 'x'}").message).toMatch(/^not valid JSON: expected a value .* at line 1, column 7, found "'x'}"/);
    expect(refusal('{"a": NaN}').message).toMatch(/expected a value/);
    expect(refusal('{"a": 1} x').message).toMatch(/expected the end of the file after the top-level value at line 1, column 10/);
    expect(refusal('"tab\there"').message).toMatch(/raw control character/);
    expect(refusal("").message).toBe("the file is empty; a project is a JSON object, {...}");
    expect(refusal('{"a": "\u001b[2J').message).not.toContain("\u001b");
  });

  it("reports the path of the value or key at a given offset", () => {
    const text = '{"title": "Lap timer", "show": ["0", "1"]}';
    const at = (needle: string): string | undefined => {
      const r = readJson(text, { maxNesting: 8, locate: text.indexOf(needle) });
      return r.ok ? r.value.pathAtLocate : "refused";
    };
    expect(at("timer")).toBe("title");
    expect(at('"1"')).toBe("show[1]");
    expect(at("show")).toBe("show");
    expect(at(":")).toBeUndefined();
  });
});

describe("lineColumn", () => {
  it("counts from 1", () => {
    expect(lineColumn("ab\ncd", 0)).toEqual({ line: 1, column: 1 });
    expect(lineColumn("ab\ncd", 4)).toEqual({ line: 2, column: 2 });
  });
});
