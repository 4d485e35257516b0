import { describe, expect, it } from "vitest";
import { helpLines, parseArgs, shownArg } from "../../../src/cli/args.ts";

const opts = {
  json: { help: "" },
  "depth-limit": { value: true, meta: "K", help: "most diodes on any path" },
  "max-depth": { value: true, meta: "K", olderSpellingOf: "depth-limit", help: "" },
};

describe("parseArgs", () => {
  it("separates positionals, flags and values in both spellings", () => {
    const r = parseArgs(["f.json", "--json", "--depth-limit", "2"], opts);
    expect(r.ok && [...r.args.positional, ...r.args.flags, r.args.values.get("depth-limit")]).toEqual(["f.json", "json", "2"]);
    const s = parseArgs(["--depth-limit=3", "f.json"], opts);
    expect(s.ok && s.args.values.get("depth-limit")).toBe("3");
  });
  it("names an unknown option and the documented ones the command takes", () => {
    const r = parseArgs(["--jsno"], opts);
    expect(!r.ok && r.message).toBe("unknown option --jsno (this command takes --json, --depth-limit)");
  });
  it("wants a value where one is due", () => {
    expect(parseArgs(["--depth-limit"], opts).ok).toBe(false);
    expect(parseArgs(["--json=1"], opts).ok).toBe(false);
  });
  it("stores an older spelling under the documented name and remembers how it was typed", () => {
    const r = parseArgs(["--max-depth", "3"], opts);
    expect(r.ok && r.args.values.get("depth-limit")).toBe("3");
    expect(r.ok && r.args.spelling.get("depth-limit")).toBe("--max-depth");
  });
  it("refuses an option given twice, in one spelling or two", () => {
    expect(parseArgs(["--depth-limit", "2", "--depth-limit", "3"], opts)).toEqual({
      ok: false,
      message: "--depth-limit is given twice; give it once",
    });
    expect(parseArgs(["--max-depth", "2", "--depth-limit", "3"], opts)).toEqual({
      ok: false,
      message: "--max-depth and --depth-limit are the same option; give it once",
    });
  });
  it("quotes an unknown option that holds control characters", () => {
    const r = parseArgs(["--x\u001b[2J"], opts);
    expect(!r.ok && r.message).toMatch(/^unknown option "--x\\u001b\[2J"/);
    expect(!r.ok && r.message).not.toContain("\u001b");
  });
});

describe("helpLines", () => {
  it("lists an older spelling as such", () => {
    expect(helpLines(opts)).toEqual([
      "  --json                 ",
      "  --depth-limit K        most diodes on any path",
      "  --max-depth K          older spelling of --depth-limit, still accepted",
    ]);
  });
});

describe("shownArg", () => {
  it("keeps a plain argument as typed and quotes and cuts anything else", () => {
    expect(shownArg("die-roller.json")).toBe("die-roller.json");
    expect(shownArg("a\u0007b")).toBe('"a\\u0007b"');
    expect(shownArg("y".repeat(50))).toBe(`"${"y".repeat(40)}…" (50 characters)`);
  });
});
