import { describe, expect, it } from "vitest";
import { csvField, csvText } from "../../../../src/core/papers/csv.ts";
import { parseCsv } from "../../../support/csvRead.ts";

describe("csv", () => {
  it("quotes only fields that need it, doubling inner quotes (RFC 4180)", () => {
    expect(csvField("D1")).toBe("D1");
    expect(csvField(12)).toBe("12");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
  });

  it("ends every record in CRLF and reads back to the same fields", () => {
    const records = [
      ["a", "b,c", 'q"q'],
      ["", "x\r\ny", "3"],
    ];
    const text = csvText(records);
    expect(text.endsWith("\r\n")).toBe(true);
    expect(parseCsv(text)).toEqual(records);
  });
});
