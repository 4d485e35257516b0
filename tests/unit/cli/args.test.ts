import { describe, expect, it } from "vitest";
import { intOption, parseArgs } from "../../../src/cli/args.ts";

const opts = { json: { help: "" }, "max-depth": { value: true, help: "" } };

describe("parseArgs", () => {
  it("separates positionals, flags and values in both spellings", () => {
    const r = parseArgs(["f.json", "--json", "--max-depth", "2"], opts);
    expect(r.ok && [...r.args.positional, ...r.args.flags, r.args.values.get("max-depth")]).toEqual(["f.json", "json", "2"]);
    const s = parseArgs(["--max-depth=3", "f.json"], opts);
    expect(s.ok && s.args.values.get("max-depth")).toBe("3");
  });
  it("names an unknown option and what the command takes", () => {
    const r = parseArgs(["--jsno"], opts);
    expect(!r.ok && r.message).toBe("unknown option --jsno (this command takes --json, --max-depth)");
  });
  it("wants a value where one is due", () => {
    expect(parseArgs(["--max-depth"], opts).ok).toBe(false);
    expect(parseArgs(["--json=1"], opts).ok).toBe(false);
  });
  it("range-checks whole numbers", () => {
    const r = parseArgs(["--max-depth", "4"], opts);
    if (!r.ok) throw new Error();
    expect(intOption(r.args, "max-depth", 1, 3)).toEqual({
      ok: false,
      message: '--max-depth must be a whole number from 1 to 3 (got "4")',
    });
  });
});
