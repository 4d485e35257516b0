import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseInstrument } from "../../../../src/core/project/instrument.ts";
import { DEMO_EXAMPLE, EXAMPLES, exampleUrl, newProject, NEW_PROJECT_TITLE } from "../../../../src/ui/state/examples.ts";

const FOLDER = new URL("../../../../public/examples/", import.meta.url);

describe("the New menu's examples", () => {
  it("lists every example shipped in public/examples, once, and nothing else", () => {
    const shipped = readdirSync(FOLDER)
      .filter((f) => f.endsWith(".json"))
      .sort();
    expect(EXAMPLES.map((e) => e.file).sort()).toEqual(shipped);
  });

  it("offers only examples that open: each file validates", () => {
    for (const e of EXAMPLES) {
      // The app opens every file as an instrument (a single-decoder file is one of one decoder).
      const r = parseInstrument(readFileSync(new URL(e.file, FOLDER), "utf8"));
      expect(r.ok, e.file).toBe(true);
    }
  });

  it("starts the app on the relay hex monitor, the demo the README names", () => {
    expect(DEMO_EXAMPLE.file).toBe("relay-hex-monitor.json");
    expect(exampleUrl("/", DEMO_EXAMPLE)).toBe("/examples/relay-hex-monitor.json");
    expect(exampleUrl("/app/", DEMO_EXAMPLE)).toBe("/app/examples/relay-hex-monitor.json");
  });

  it("makes a new project that validates: ten states showing 0 to 9 on one seven-segment digit", () => {
    const p = newProject();
    expect(p.title).toBe(NEW_PROJECT_TITLE);
    expect(p.counter.states).toBe(10);
    expect(p.display.positions).toBe(1);
    expect(p.display.cell.kind).toBe("seg7");
    expect(p.show).toEqual(["0", "1", "2", "3", "4", "5", "6", "7", "8", "9"]);
  });
});
