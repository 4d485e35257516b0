/**
 * The synthesis options on the command line: the documented spellings
 * --depth-limit and --policy, the older --max-depth and --depth, and --seed,
 * all checked by the rules of the project file's `synthesis` section.
 */
import { describe, expect, it } from "vitest";
import { main } from "../../../src/cli/main.ts";
import { parseArgs } from "../../../src/cli/args.ts";
import { settingsFromArgs, SYNTH_OPTIONS } from "../../../src/cli/synthOptions.ts";
import { parseProject, validateProject } from "../../../src/core/project/projectSchema.ts";
import { exampleText } from "../../support/projects.ts";
import { recordingIo } from "../../support/recordingIo.ts";

const FILE = "public/examples/die-roller.json";

async function run(...args: string[]): Promise<{ code: number; out: string; err: string }> {
  const io = recordingIo();
  const code = await main(args, io);
  return { code, out: io.stdout.join(""), err: io.stderr.join("") };
}

describe("synthesis options", () => {
  it("--depth-limit and --policy set the depth limit and the policy", async () => {
    const r = await run("synth", FILE, "--fast", "--json", "--depth-limit", "3", "--policy", "mixed");
    expect(r.err).toBe("");
    expect(r.code).toBe(0);
    const m = JSON.parse(r.out) as { depthLimit: number; policy: string };
    expect([m.depthLimit, m.policy]).toEqual([3, "mixed"]);
  });

  it("--max-depth and --depth are still accepted and mean the same", async () => {
    const documented = await run("synth", FILE, "--fast", "--json", "--depth-limit", "1", "--policy", "uniform");
    const older = await run("synth", FILE, "--fast", "--json", "--max-depth", "1", "--depth", "uniform");
    expect(older.code).toBe(0);
    expect(older.out).toBe(documented.out);
  });

  it("refuses a value with the project file's message, under the option as typed", async () => {
    const fileMessage = (synthesis: Record<string, unknown>): string => {
      const r = validateProject({ schema: "diodeloom/project@1", counter: { states: 2 }, display: {}, show: ["0", "1"], synthesis });
      return r.ok ? "" : (r.error[0]?.message ?? "");
    };
    for (const [args, option, synthesis] of [
      [["--depth-limit", "7"], "--depth-limit", { maxDepth: 7 }],
      [["--max-depth", "7"], "--max-depth", { maxDepth: 7 }],
      [["--policy", "deep"], "--policy", { depth: "deep" }],
      [["--depth", "deep"], "--depth", { depth: "deep" }],
      [["--time-limit", "0"], "--time-limit", { timeLimitMs: 0 }],
      [["--seed", "-1"], "--seed", { seed: -1 }],
      [["--seed", "2.5"], "--seed", { seed: 2.5 }],
      [["--time-limit", "abc"], "--time-limit", { timeLimitMs: "abc" }],
    ] as const) {
      const r = await run("synth", FILE, "--fast", ...args);
      expect(r.code, args.join(" ")).toBe(2);
      expect(r.err).toBe(`${option}: ${fileMessage(synthesis)}\n`);
    }
    const bad = await run("synth", FILE, "--depth-limit", "7");
    expect(bad.err).toBe("--depth-limit: got 7; must be a whole number from 1 to 3\n");
  });

  it("every override reaches the settings; the rest come from the project", () => {
    const project = parseProject(exampleText("die-roller"));
    if (!project.ok) throw new Error("the demo project is invalid");
    const parsed = parseArgs(["--seed", "12345", "--time-limit", "1e3", "--fast"], SYNTH_OPTIONS);
    if (!parsed.ok) throw new Error(parsed.message);
    const io = recordingIo();
    expect(settingsFromArgs(project.value, parsed.args, io)).toEqual({
      ...project.value.synthesis,
      mode: "fast",
      seed: 12345,
      timeLimitMs: 1000,
    });
    expect(io.stderr).toEqual([]);
  });

  it("--help names the documented spellings and the older ones as such", async () => {
    const r = await run("synth", "--help");
    expect(r.out).toMatch(/^ {2}--depth-limit K +most diodes on any path, 1-3 \(overrides synthesis\.maxDepth\)$/m);
    expect(r.out).toMatch(/^ {2}--policy NAME +depth policy: mixed \| per-segment \| uniform \(overrides synthesis\.depth\)$/m);
    expect(r.out).toMatch(/^ {2}--seed N +seed of the optimizer's randomised steps, 0-2147483647/m);
    expect(r.out).toMatch(/^ {2}--max-depth K +older spelling of --depth-limit, still accepted$/m);
    expect(r.out).toMatch(/^ {2}--depth NAME +older spelling of --policy, still accepted$/m);
    expect(r.out).toMatch(/^usage: diodeloom synth FILE \[--json\] \[--direct \| --fast\] \[--depth-limit K\] \[--policy NAME\]/m);
  });
});
