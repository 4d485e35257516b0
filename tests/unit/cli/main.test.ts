import { describe, expect, it } from "vitest";
import { COMMANDS, main, VERSION } from "../../../src/cli/main.ts";
import { recordingIo } from "../../support/recordingIo.ts";

describe("diodeloom main (in-process)", () => {
  it("loads, for every listed name, the command of that name", async () => {
    expect(COMMANDS.map((c) => c.name)).toEqual(["synth", "compare", "export", "budget", "netlist"]);
    for (const entry of COMMANDS) expect((await entry.load()).name).toBe(entry.name);
  });

  it("lists every command with its summary in --help, and prints the version", async () => {
    const io = recordingIo();
    expect(await main(["--help"], io)).toBe(0);
    const text = io.stdout.join("");
    for (const c of COMMANDS) expect(text).toMatch(new RegExp(`^  ${c.name} +${c.summary.replace(/[()]/g, "\\$&")}$`, "m"));
    const v = recordingIo();
    expect(await main(["--version"], v)).toBe(0);
    expect(v.stdout.join("")).toBe(`${VERSION}\n`);
  });

  it("prints a command's own help with its summary and options", async () => {
    const io = recordingIo();
    expect(await main(["netlist", "--help"], io)).toBe(0);
    const text = io.stdout.join("");
    expect(text).toMatch(/^usage: diodeloom netlist FILE/);
    expect(text).toContain(COMMANDS.find((c) => c.name === "netlist")?.summary);
    expect(text).toMatch(/--time-limit MS/);
  });

  it("names the commands when it does not know one", async () => {
    const io = recordingIo();
    expect(await main(["synthesise", "x.json"], io)).toBe(2);
    expect(io.stderr.join("")).toMatch(/unknown command "synthesise"; commands are synth, compare, export, budget, netlist/);
  });
});
