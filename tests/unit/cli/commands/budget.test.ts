import { describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import { solveBudget } from "../../../../src/core/budget/budget.ts";
import { buildCircuit, LOGIC_NODE } from "../../../../src/core/circuit/circuit.ts";
import { describeBudget } from "../../../../src/cli/commands/budget.ts";
import { recordingIo } from "../../../support/recordingIo.ts";
import { currentText, formatOhms } from "../../../../src/render/units.ts";
import { example, exampleText, ONE_SEVEN_EIGHT_TEXT, showing, showingWith } from "../../../support/projects.ts";
import { directDesign, sharedDieRoller } from "../../../support/budgetFixtures.ts";

const PROJECT = ONE_SEVEN_EIGHT_TEXT;

describe("budget command", () => {
  it("prints the budget JSON and exits 0", async () => {
    const io = recordingIo({ "p.json": PROJECT });
    expect(await main(["budget", "p.json", "--json", "--direct"], io)).toBe(0);
    const b = JSON.parse(io.stdout.join("")) as { schema: string; trim: { series: string; mode: string } };
    expect(b.schema).toBe("diodeloom/budget@3");
    expect(b.trim.series).toBe("E24");
    expect(b.trim.mode).toBe("auto");
  });

  it("gives the budget the project's time limit again: a run out of time says so instead of solving on", async () => {
    // --time-limit 1 leaves the budget one millisecond: far less than the
    // hundreds of circuit solves of a 100-state counter take on any machine.
    const hundred = JSON.stringify({
      schema: "diodeloom/project@2",
      title: "Quiz scoreboard 00-99",
      counter: { states: 100 },
      display: { positions: 2 },
      show: Array.from({ length: 100 }, (_, k) => String(k).padStart(2, "0")),
    });
    const io = recordingIo({ "p.json": hundred });
    const started = Date.now();
    expect(await main(["budget", "p.json", "--direct", "--time-limit", "1"], io)).toBe(2);
    expect(io.stderr.join("")).toMatch(/the budget's time limit ran out during the nominal solve, at state S\d+ of \d+/);
    expect(Date.now() - started).toBeLessThan(60_000);
  });

  it("prints a switch its base current leaves in its active region as not saturated, and a saturated one's forced beta below the lowest beta", async () => {
    // The 12 V panel on low-side switches behind the dark decode's dividers: at the low corner 1a, 1d-1g run
    // with Vce above 1 V and Ic = 100 Ib (tests/reference/switchSaturation.test.ts checks it against ngspice).
    const panel = (seriesOhms: number) =>
      JSON.stringify({
        schema: "diodeloom/project@2",
        title: "Dark panel",
        counter: { states: 3, drive: "complementary" },
        display: {},
        show: ["1", "7", "8"],
        synthesis: { maxDepth: 2, depth: "mixed", decode: "dark", darkInput: "divider", timeLimitMs: 10_000 },
        electrical: {
          preset: "panel-12v-sink",
          driver: { kind: "low-side-switch", baseResistor: 220 },
          segment: { seriesResistor: seriesOhms },
        },
      });
    const active = recordingIo({ "p.json": panel(180) });
    expect(await main(["budget", "p.json", "--trim", "off"], active)).toBe(0);
    const text = active.stdout.join("");
    expect(text).toMatch(/^ {2}1a {6}Q1 +R1 +180 .* 100\.0 \(not saturated\)$/m);
    expect(text).toContain("WARN   switch-unsaturated: switch Q1 (1a) is not saturated at the low corner");
    // 220 Ω: Vce about 0.4 V, the base-collector junction just forward-biased: saturated, its forced beta a hair below 100.
    const soft = recordingIo({ "p.json": panel(220) });
    expect(await main(["budget", "p.json", "--trim", "off"], soft)).toBe(0);
    const softText = soft.stdout.join("");
    expect(softText).toMatch(/^ {2}1a {6}Q1 +R1 +220 .* 99\.9$/m);
    expect(softText).toMatch(/^ {2}low .*forced beta up to 99\.9,/m);
    expect(softText).not.toContain("switch-unsaturated");
  });

  it("uses the E96 series when asked", async () => {
    const io = recordingIo({ "p.json": PROJECT });
    expect(await main(["budget", "p.json", "--json", "--direct", "--series", "E96"], io)).toBe(0);
    expect((JSON.parse(io.stdout.join("")) as { trim: { series: string } }).trim.series).toBe("E96");
  });

  it("takes --trim off and --trim on, and refuses another value", async () => {
    for (const [mode, applied] of [
      ["off", false],
      ["on", true],
    ] as const) {
      const io = recordingIo({ "p.json": PROJECT });
      expect(await main(["budget", "p.json", "--json", "--direct", "--trim", mode], io)).toBe(0);
      const b = JSON.parse(io.stdout.join("")) as { trim: { mode: string; applied: boolean; effect: string } };
      expect(b.trim.mode).toBe(mode);
      expect(b.trim.applied).toBe(applied && b.trim.effect !== "no-change");
    }
    const io = recordingIo({ "p.json": PROJECT });
    expect(await main(["budget", "p.json", "--trim", "maybe"], io)).toBe(2);
    expect(io.stderr.join("")).toBe(`--trim: got "maybe"; must be auto, off or on\n`);
  });

  it("passes project errors through with the file name and exit 2", async () => {
    const bad = JSON.stringify({
      schema: "diodeloom/project@1",
      counter: { states: 2 },
      display: {},
      show: ["0", "1"],
      electrical: { string: { dies: 0 } },
    });
    const io = recordingIo({ "bad.json": bad });
    expect(await main(["budget", "bad.json"], io)).toBe(2);
    expect(io.stderr.join("")).toBe("bad.json: electrical.string.dies: got 0; must be a whole number from 1 to 200\n");
  });

  it("describes a shared design: depths, trim, corners and the cautions first", () => {
    const d = sharedDieRoller();
    const b = solveBudget(d.project, d.spec, d.matrix);
    if (!b.ok) throw new Error(b.error.message);
    const text = describeBudget(d.project, d.spec, d.matrix, b.value);
    const lines = text.split("\n");
    expect(lines[0]).toBe(d.project.title);
    expect(lines.findIndex((l) => l.includes("DANGER hazardous-voltage"))).toBeLessThan(
      lines.findIndex((l) => l.startsWith("Segment current per state")),
    );
    expect(text).toMatch(/^ {2}1tr +2 /m);
    expect(text).toMatch(/^ {2}1c +1 /m);
    expect(text).toContain("Tolerance corners (trimmed design;");
    // The trim is applied (nearer the target at the nominal values) but the corners still leave the window: the note says so.
    expect(b.value.trim.applied).toBe(true);
    expect(b.value.corners.shortOf).toEqual(["below-window", "above-window"]);
    expect(text).toMatch(
      /^ {2}Emitter resistors: the E24 trim is applied \(at the nominal values it takes the farthest segment from 39\.0 % to 5\.6 % off the target\), but it does not bring the segments into the ±20 % window: over the corners they are below the window at the low corner \(.*\); above it at the high corner \(.*\)\. What to change: use closer resistors \(electrical\.tolerance\.resistorPct\)\.$/m,
    );
    // The outputs table names each current-setting resistor (here the emitter resistor) and gives the design's value.
    for (const [o, dr] of Object.entries(b.value.drivers)) {
      expect(text).toMatch(new RegExp(`^  ${o} .* ${dr.currentResistor.ref} +${formatOhms(dr.currentResistor.ohms)} +`, "m"));
    }
  });

  it("says what the target asks of the driver kind: a switch saturated, a sink or follower out of saturation", () => {
    // Common practice, no source: a switch is meant to saturate (its forced beta below the smallest
    // beta), a current sink or emitter follower to stay out of saturation (collector-base headroom).
    const wants: Record<string, string> = {
      "low-side-switch": ", every switch saturated",
      "high-side-switch": ", every switch saturated",
      "current-sink": ", every driver out of saturation (collector-base headroom above 0 V)",
      "emitter-follower": ", every driver out of saturation (collector-base headroom above 0 V)",
    };
    const kinds = new Set<string>();
    for (const d of [
      sharedDieRoller(),
      directDesign("1 7", showing(["1", "7"], 1)),
      directDesign("1 7 switch", showingWith(["1", "7"], { preset: "bench-5v-switch" })),
      directDesign("1 7 sink", showingWith(["1", "7"], { preset: "panel-12v-sink" })),
      directDesign("1 7 follower", showingWith(["1", "7"], { preset: "cathode-5v-follower" })),
    ]) {
      const b = solveBudget(d.project, d.spec, d.matrix);
      if (!b.ok) throw new Error(b.error.message);
      const kind = d.project.electrical.driver.kind;
      kinds.add(kind);
      const line = describeBudget(d.project, d.spec, d.matrix, b.value)
        .split("\n")
        .find((l) => /^ {2}(Meets|Misses) the target: /.test(l));
      expect(line?.endsWith(`under the rating${wants[kind] ?? ""}`), `${kind}: ${line}`).toBe(true);
      expect(line).not.toContain("(a switch saturated)");
    }
    // Both families are covered.
    expect([...kinds].some((k) => k.endsWith("switch"))).toBe(true);
    expect([...kinds].some((k) => !k.endsWith("switch"))).toBe(true);
  });

  it("gives a high-side switch's worst unlit segment at the nominal values and each corner, where, and the ghost limit", async () => {
    const d = directDesign("quiz", example("quiz-scoreboard"));
    const b = solveBudget(d.project, d.spec, d.matrix);
    if (!b.ok) throw new Error(b.error.message);
    const u = b.value.unlit;
    const at = (f: typeof u.nominal, name: string): string => `${currentText(f?.currentA ?? NaN)} (${f?.output} in ${f?.state}) ${name}`;
    const text = describeBudget(d.project, d.spec, d.matrix, b.value);
    expect(text).toContain(
      `\n  unlit segments at most ${at(u.nominal, "nominal")}, ${at(u.low, "low corner")}, ${at(u.high, "high corner")}, against the 100 µA ghost limit\n`,
    );
    // In the JSON too, in SI.
    const io = recordingIo({
      "p.json": JSON.stringify({ ...JSON.parse(exampleText("quiz-scoreboard")), synthesis: { timeLimitMs: 2000 } }),
    });
    expect(await main(["budget", "p.json", "--json", "--direct"], io)).toBe(0);
    const json = JSON.parse(io.stdout.join("")) as { unlit: typeof u };
    expect(json.unlit).toEqual(u);
  });

  it("says where an unlit segment is above the ghost limit, and prints nothing where no output is ever unlit", () => {
    const d = directDesign("quiz", example("quiz-scoreboard"));
    const b = solveBudget(d.project, d.spec, d.matrix);
    if (!b.ok) throw new Error(b.error.message);
    const over = { ...b.value, unlit: { ...b.value.unlit, high: { output: "1a", state: "S3", currentA: 2e-4 } } };
    expect(describeBudget(d.project, d.spec, d.matrix, over)).toContain(
      ", 200 µA (1a in S3) high corner, against the 100 µA ghost limit (ABOVE it: high corner)\n",
    );
    const none = { ...b.value, unlit: { ghostLimitA: 1e-4, nominal: null, low: null, high: null } };
    expect(describeBudget(d.project, d.spec, d.matrix, none)).not.toContain("unlit segments at most");
  });

  it("lists no counter line of a sink-drive counter: it has no active-high line to budget", async () => {
    // Decoded dark onto NPN switches: every diode meets an active-low line nS<k>.
    const text = JSON.stringify({
      schema: "diodeloom/project@2",
      title: "sink",
      counter: { states: 4, drive: "sink" },
      display: { positions: 1, cell: "seg7" },
      show: ["0", "1", "2", "3"],
      synthesis: { decode: "dark", timeLimitMs: 2000 },
      electrical: { preset: "bench-5v-switch" },
    });
    const io = recordingIo({ "p.json": text });
    expect(await main(["budget", "p.json", "--fast"], io)).toBe(0);
    const out = io.stdout.join("");
    expect(out).toContain(
      "\nCounter lines: none sources current (a sink-drive counter has only its active-low lines nS<k>; what each sinks is in the ghost check)\n",
    );
    // No counter-line row (line, sources mA, line V, sag V).
    expect(out).not.toMatch(/^ {2}S\d+ +\d+\.\d+ +\d+\.\d+ +\d+\.\d+$/m);
    expect(out).not.toContain("counter-sag");
    const json = recordingIo({ "p.json": text });
    expect(await main(["budget", "p.json", "--fast", "--json"], json)).toBe(0);
    expect((JSON.parse(json.stdout.join("")) as { counterLines: object }).counterLines).toEqual({});
  });

  it("says once that no active-high line is wired on complementary lines with every output decoded dark, instead of a table of zeros", async () => {
    const project = (decode: string) =>
      JSON.stringify({
        schema: "diodeloom/project@2",
        title: "complementary",
        counter: { states: 4, drive: "complementary" },
        display: { positions: 1, cell: "seg7" },
        show: ["0", "1", "2", "3"],
        synthesis: { decode, timeLimitMs: 2000 },
        electrical: { preset: "bench-5v-switch" },
      });
    const io = recordingIo({ "p.json": project("dark") });
    expect(await main(["budget", "p.json", "--fast"], io)).toBe(0);
    const out = io.stdout.join("");
    const said =
      "\nCounter lines: none sources current (every output is decoded dark: the diodes meet only the active-low lines nS<k>; what each sinks is in the ghost check)\n";
    expect(out.split(said)).toHaveLength(2);
    expect(out).not.toMatch(/^ {2}S\d+ +\d+\.\d+ +\d+\.\d+ +\d+\.\d+$/m);
    expect(out).not.toContain("counter-sag");
    const json = recordingIo({ "p.json": project("dark") });
    expect(await main(["budget", "p.json", "--fast", "--json"], json)).toBe(0);
    expect((JSON.parse(json.stdout.join("")) as { counterLines: object }).counterLines).toEqual({});
    // Decoded lit, the same counter's S lines carry the segments' drive: each is listed, with the sag note.
    const lit = recordingIo({ "p.json": project("lit") });
    expect(await main(["budget", "p.json", "--fast"], lit)).toBe(0);
    const litOut = lit.stdout.join("");
    expect(litOut).not.toContain("none sources current");
    expect(litOut.match(/^ {2}S\d+ +\d+\.\d+ +\d+\.\d+ +\d+\.\d+$/gm)).toHaveLength(4);
    expect(litOut).toContain("counter-sag");
  });

  it("says why a decoder on high-side switches draws nothing from the logic supply, and says nothing where a decoder draws from it", () => {
    const quiz = directDesign("quiz", example("quiz-scoreboard"));
    const b = solveBudget(quiz.project, quiz.spec, quiz.matrix);
    if (!b.ok) throw new Error(b.error.message);
    // The model: no element hangs from the logic supply, so the figure is 0 by construction, not by a fault.
    expect(b.value.logic.maxCurrentA).toBe(0);
    for (let k = 0; k < quiz.matrix.states.length; k++) {
      const c = buildCircuit(quiz.spec, quiz.matrix, quiz.project.electrical, k);
      expect(c.elements.some((e) => e.kind === "vsource" && e.node === LOGIC_NODE)).toBe(false);
    }
    expect(describeBudget(quiz.project, quiz.spec, quiz.matrix, b.value)).toContain(
      "\nLogic supply (counter lines, tie-on): up to 0.00 mA, 0.0 mW at 5 V; nothing drawn: the high-side switches' active-low lines only sink current, " +
        "the switches' base and pull-up currents from the segment supply\n",
    );
    const lit = directDesign("1 7 switch", showingWith(["1", "7"], { preset: "bench-5v-switch" }));
    const l = solveBudget(lit.project, lit.spec, lit.matrix);
    if (!l.ok) throw new Error(l.error.message);
    expect(describeBudget(lit.project, lit.spec, lit.matrix, l.value)).toMatch(
      /\nLogic supply \(counter lines, tie-on\): up to \d+\.\d+ mA, \d+\.\d mW at 5 V\n/,
    );
  });
});
