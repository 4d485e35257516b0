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
    const design = designFor(project, spec, r.value, { mode: "off", series: "E24" });
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
