import { describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import { recordingIo } from "../../../support/recordingIo.ts";
import { describeMatrix } from "../../../../src/cli/commands/synth.ts";
import { designFor } from "../../../../src/cli/designOptions.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { example } from "../../../support/projects.ts";

describe("diodeloom synth (in-process)", () => {
  it("prints the matrix JSON with from = anode on a counter line", async () => {
    const io = recordingIo();
    expect(await main(["synth", "public/examples/die-roller.json", "--json", "--direct"], io)).toBe(0);
    const m = JSON.parse(io.stdout.join(""));
    expect(m.count).toBe(21);
    expect(m.diodes.every((d: { from: string }) => /^S\d+$/.test(d.from))).toBe(true);
    expect(m.lowerBound).toBeNull();
    expect(m.optimal).toBe(false);
    expect(m.longestPath).toBe(1);
  });
  it("says so when the time limit, not the work budget, ended the run", async () => {
    const project = example("die-roller");
    const spec = compileSpec(project);
    const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.deadlineHit).toBe(false);
    const design = designFor(project, spec, r.value, { mode: "off", series: "E24" }, project.synthesis.timeLimitMs);
    expect(describeMatrix(project, spec, r.value, design)).not.toMatch(/time limit ran out/);
    expect(describeMatrix(project, spec, { ...r.value, deadlineHit: true }, design)).toMatch(
      /time limit ran out .*another run may give a different matrix/,
    );
  });
  it("rejects bad option values with exit 2", async () => {
    for (const args of [
      ["--max-depth", "0"],
      ["--depth", "deep"],
      ["--time-limit", "-1"],
      ["--direct", "--fast"],
    ]) {
      const io = recordingIo();
      expect(await main(["synth", "public/examples/die-roller.json", ...args], io)).toBe(2);
      expect(io.stderr.join("")).toMatch(/--/);
    }
  });
  it("wants exactly one file", async () => {
    const io = recordingIo();
    expect(await main(["synth"], io)).toBe(2);
    expect(io.stderr.join("")).toMatch(/^usage: diodeloom synth FILE/);
  });
  it("names an unknown command", async () => {
    const io = recordingIo();
    expect(await main(["synthesise"], io)).toBe(2);
    expect(io.stderr.join("")).toMatch(/unknown command "synthesise"/);
  });
});

describe("diodeloom synth with dark-decoded outputs", () => {
  const file = {
    schema: "diodeloom/project@2",
    title: "Dark",
    counter: { states: 6, drive: "complementary" },
    display: {},
    show: ["0", "1", "2", "3", "4", "5"],
    synthesis: { depth: "mixed" },
  };
  it("takes --decode and --dark-input, lists the lines both ways, each output's decode, the input network and the ghost check", async () => {
    const io = recordingIo({ "p.json": JSON.stringify(file) });
    expect(await main(["synth", "p.json", "--decode", "dark"], io)).toBe(0);
    const text = io.stdout.join("");
    expect(text).toMatch(/^nS1 +"1" +D\d+>1[a-g]/m);
    expect(text).toMatch(/^1a +dark +S0 S2 S3 S5$/m);
    expect(text).toContain(
      "Input network of the 7 dark-decoded outputs: 7 pull-ups to the logic supply and 14 level-shift diodes (2 per output).",
    );
    expect(text).toMatch(/Ghost check .* pull-ups [\d.]+k \(E24\)/);
    // The parts list counts the pull-ups and the level-shift diodes after the matrix diodes.
    expect(text).toMatch(/^ +14 +small-signal silicon +D14-D27$/m);
    expect(text).toMatch(/worst unlit segment [\d.]+ µA \(1[a-g] in S\d, (nominal|low|high)\) against the 100\.0 µA ghost limit/);
    expect(text).toContain("Totals: 13 matrix diodes + 14 level-shift = 27");
    // Which limit stops a smaller pull-up, and the room left at every limit.
    expect(text).toMatch(
      /^ {2}sizing: (a smaller pull-up breaks the (ghost limit|active-low line's rating) \(|every limit holds at the smallest)/m,
    );
    expect(text).toMatch(/^ {2}margins: -?[\d.]+ % below the ghost limit, -?[\d.]+ % below the active-low line's rating, lit window/m);
    const json = recordingIo({ "p.json": JSON.stringify(file) });
    expect(await main(["synth", "p.json", "--decode", "either", "--dark-input", "divider", "--json"], json)).toBe(0);
    const m = JSON.parse(json.stdout.join(""));
    expect(m.count).toBe(12);
    expect(m.inputNetwork.diodes).toBe(0);
    // A dark-side diode is named from its driving end, the active-low line or its bus.
    expect(m.diodes.some((d: { from: string }) => /^nS\d+$/.test(d.from))).toBe(true);
  });
  it("refuses --decode dark on a source-drive counter; budget takes a dark-decoded project", async () => {
    const source = recordingIo({ "p.json": JSON.stringify({ ...file, counter: { states: 6 } }) });
    expect(await main(["synth", "p.json", "--decode", "dark"], source)).toBe(2);
    expect(source.stderr.join("")).toContain('set counter.drive to "complementary"');
    const budget = recordingIo({ "p.json": JSON.stringify({ ...file, synthesis: { decode: "dark" } }) });
    expect(await main(["budget", "p.json", "--fast"], budget)).toBe(0);
    const text = budget.stdout.join("");
    expect(text).toMatch(/^Dark-decoded outputs \(7\): pull-ups [\d.]+k from the logic supply, 2 level-shift diodes each/m);
    expect(text).toMatch(/^ +worst unlit [\d.]+ µA \(1[a-g] in S\d, (nominal|low|high corner)\) against the 100\.0 µA ghost limit$/m);
    expect(text).toMatch(/^ {2}sizing: /m);
    expect(text).toMatch(/^ {2}margins: /m);
  });
});
