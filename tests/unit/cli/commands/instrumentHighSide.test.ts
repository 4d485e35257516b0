/**
 * An instrument whose decoders use two driver kinds: a quiz desk with its
 * round (1-9 and F) on a sink-drive ring through PNP high-side switches (the
 * decoder's own preset, `bench-5v-high-side`) and its team number on a
 * source-drive ring through NPN low-side switches (the shared section).
 * synth, budget and export each work on it and give each decoder as its own
 * file gives it; the combinations a high-side switch cannot take are
 * refused with the decoder's path and the reason.
 */
import { describe, expect, it } from "vitest";
import { main } from "../../../../src/cli/main.ts";
import { recordingIo } from "../../../support/recordingIo.ts";

const ROUND = {
  counter: { states: 10, drive: "sink" },
  display: { positions: 1 },
  show: ["1", "2", "3", "4", "5", "6", "7", "8", "9", "F"],
  synthesis: { timeLimitMs: 5000 },
};
const TEAM = { counter: { states: 4 }, display: { positions: 1 }, show: ["1", "2", "3", "4"], synthesis: { timeLimitMs: 5000 } };
const HIGH_SIDE = { preset: "bench-5v-high-side" };
const SHARED = { preset: "bench-5v-switch" };

const desk = (round: Record<string, unknown>): string =>
  JSON.stringify({
    schema: "diodeloom/project@2",
    title: "Quiz desk",
    electrical: SHARED,
    decoders: [
      { name: "round", ...ROUND, ...round },
      { name: "team", ...TEAM },
    ],
  });
const single = (title: string, d: Record<string, unknown>, electrical: Record<string, unknown>): string =>
  JSON.stringify({ schema: "diodeloom/project@2", title, ...d, electrical });

const FILES = {
  "desk.json": desk({ electrical: HIGH_SIDE }),
  "round.json": single("Quiz desk - round", ROUND, HIGH_SIDE),
  "team.json": single("Quiz desk - team", TEAM, SHARED),
  // The round's decoder takes the high-side kind alone, keeping the shared section's 3.3 kΩ base resistors.
  "kind.json": desk({ electrical: { driver: { kind: "high-side-switch" } } }),
  "refused.json": JSON.stringify({
    schema: "diodeloom/project@2",
    title: "Quiz desk",
    electrical: HIGH_SIDE,
    decoders: [
      { name: "round", ...ROUND },
      { name: "team", ...TEAM },
      { name: "bcd", counter: { states: 4, code: "binary" }, display: { positions: 1 }, show: ["1", "2", "3", "4"] },
    ],
  }),
};

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  const io = recordingIo(FILES);
  const code = await main(args, io);
  return { code, out: io.stdout.join(""), err: io.stderr.join("") };
}

/** A JSON value with every designator's decoder number taken off (`1D3` -> `D3`, `1Q1` -> `Q1`). */
function unprefixed(value: unknown, prefix: string): unknown {
  const text = JSON.stringify(value).replace(new RegExp(`"${prefix}(D|R|Q|DS)(\\d+)`, "g"), '"$1$2');
  return JSON.parse(text) as unknown;
}

describe("an instrument with a high-side switch decoder", () => {
  it("synth: the round is decoded onto its active-low lines, as its own file, under decoder number 1", async () => {
    const r = await run(["synth", "desk.json", "--json"]);
    expect(r.code, r.err).toBe(0);
    const doc = JSON.parse(r.out);
    const own = JSON.parse((await run(["synth", "round.json", "--json"])).out);
    const { refPrefix, ...round } = doc.decoders.round;
    expect(refPrefix).toBe("1");
    expect(unprefixed(round, "1")).toEqual(own);
    // Every path of the round starts on an nS line (the diode's cathode, the matrix's `from`), none on an S line.
    const diodes = round.diodes as { from: string; to: string }[];
    expect(diodes.length).toBeGreaterThan(0);
    expect(diodes.some((d) => /^nS\d$/.test(d.from))).toBe(true);
    expect(diodes.every((d) => !/^S\d$/.test(d.from) && !/^S\d$/.test(d.to))).toBe(true);
    expect((doc.decoders.team.diodes as { from: string }[]).some((d) => /^S\d$/.test(d.from))).toBe(true);
  }, 60_000);

  it("budget: each decoder's budget as its own file, the round's supply is its segments and its line's sink, and the totals add up", async () => {
    const r = await run(["budget", "desk.json", "--json"]);
    expect(r.code, r.err).toBe(0);
    const doc = JSON.parse(r.out);
    expect(doc.bound).toBe("per-case-sum");
    const round = doc.decoders.round;
    const own = JSON.parse((await run(["budget", "round.json", "--json"])).out);
    const team = JSON.parse((await run(["budget", "team.json", "--json"])).out);
    expect(round.kind).toBe("high-side-switch");
    expect(doc.decoders.team.kind).toBe("low-side-switch");
    expect(unprefixed(round, "1")).toEqual({ ...own, title: round.title });
    expect(round.drivers["1a"].transistor).toBe("1Q1");
    // Kirchhoff's current law at the segment supply, state by state: what it gives is what the segments carry
    // and what the state's active-low line sinks (the switches' bases and line pull-ups), but for what the line
    // also takes from the idle ones through the reverse-biased matrix diodes: at most a saturation current each
    // (the preset's 4 nA), as the supply's 5 V over lines idling at 5 V drives nothing into them.
    const leakA = Object.keys(round.diodes).length * 4e-9;
    expect(leakA).toBeGreaterThan(0);
    for (const [k, s] of (round.states as { supplyCurrentA: number; outputs: Record<string, { segmentA: number }> }[]).entries()) {
      const segments = Object.values(s.outputs).reduce((a, o) => a + o.segmentA, 0);
      const sunk = round.counterLines[`nS${k}`].sinkCurrentA as number;
      expect(s.supplyCurrentA, `S${k}`).toBeGreaterThan(0.015);
      expect(Math.abs(s.supplyCurrentA - segments - sunk), `S${k}`).toBeLessThan(leakA);
    }
    // The totals: each case's sum of the decoders' worst states, the round's draw being its own budget's.
    expect(doc.draws.nominal.round.segmentA).toEqual(round.states.map((s: { supplyCurrentA: number }) => s.supplyCurrentA));
    expect(doc.totals.cases.nominal.segmentA).toBeCloseTo(own.supply.maxCurrentA + team.supply.maxCurrentA, 12);
    for (const c of ["nominal", "low", "high"]) {
      const worst = (name: string, key: string) => Math.max(...(doc.draws[c][name][key] as number[]));
      expect(doc.totals.cases[c].segmentA, c).toBeCloseTo(worst("round", "segmentA") + worst("team", "segmentA"), 12);
    }
    // The worst unlit segment of each corner, per decoder, far under the ghost limit.
    for (const c of ["nominal", "low", "high"]) expect(round.unlit[c].currentA, c).toBeLessThan(round.unlit.ghostLimitA);
  }, 60_000);

  it("budget text: the round's section is a high-side switch's, then the totals", async () => {
    const r = await run(["budget", "desk.json"]);
    expect(r.code, r.err).toBe(0);
    const round = r.out.slice(r.out.indexOf("== Decoder 1 of 2: round =="), r.out.indexOf("== Decoder 2 of 2: team =="));
    expect(round).toContain(": PNP high-side switches, supply 5 V (4.75-5.25 V)");
    expect(round).toMatch(/^Active-low lines \(each low in its own state/m);
    expect(round).toMatch(/^ {2}unlit segments at most [\d.]+ pA \(1\w in S\d\) nominal, /m);
    expect(r.out).toMatch(/^ {2}Segment supply current +\d+\.\d+ mA {2}\(high corner; round S\d, team S\d\)$/m);
  }, 60_000);

  it("budget: an active-low line over its rating is said to sink the switches' bases, and the fix is the base resistor", async () => {
    // 3.3 kΩ base resistors (the shared low-side preset's) draw about 1 mA a base: "8" asks nS7 for more than 5 mA.
    const r = await run(["budget", "kind.json", "--json"]);
    expect(r.code, r.err).toBe(0);
    const round = JSON.parse(r.out).decoders.round;
    const sinks = (round.warnings as { code: string; line: string; from: string; message: string; currentA: number }[]).filter(
      (w) => w.code === "line-sink",
    );
    expect(sinks.map((w) => w.line)).toContain("nS7");
    for (const w of sinks) {
      expect(w.from).toBe("switch-bases");
      expect(w.currentA).toBe(round.counterLines[w.line].sinkCurrentA);
      expect(w.message).toMatch(
        /^active-low line nS\d sinks [\d.]+ mA in S\d from the bases and line pull-ups of the high-side switches it turns on, /,
      );
      expect(w.message).toContain("a larger driver.baseResistor lowers it");
      expect(w.message).not.toContain("gate");
    }
  }, 60_000);

  it("export: one set of papers, the round's parts a PNP's, its decks with the PNP model", async () => {
    const io = recordingIo(FILES);
    expect(await main(["export", "desk.json", "--out", "papers"], io), io.stderr.join("")).toBe(0);
    const file = (name: string): string => String(io.written.get(`papers/${name}`) ?? "");
    const bom = file("bom.csv");
    expect(bom).toMatch(/^7,1Q1-1Q7,PNP,"segment driver \(high-side switch\)/m);
    expect(bom).toMatch(/^7,2Q1-2Q7,NPN,"segment driver \(low-side switch\)/m);
    expect(bom).toMatch(/^7,1R22-1R28,100k,"output line pull-up to the segment supply/m);
    for (let k = 0; k < 10; k++) {
      const deck = file(`1-round/spice/S${k}.cir`);
      expect(deck).toMatch(/^\.model QHSW PNP /m);
      expect(deck).toMatch(/^Q1Q1 /m);
      // Its own line low, every other one idle at the line's high level.
      expect(deck).toMatch(new RegExp(`^VnS${k} ns${k}_v 0 DC 0\\.1$`, "m"));
    }
    expect(file("2-team/spice/S0.cir")).not.toContain("PNP");
    // The sheet's notes keep their words together with no-break spaces.
    expect(file("1-round/driver.svg")).toMatch(/PNP\shigh-side\sswitch\sover\sa\scommon-cathode\sdisplay/);
    const wiring = file("wiring.csv");
    expect(wiring).toMatch(/^Decoder 1: round,/m);
    expect(wiring).toMatch(/^\d+,1D\d+,\w+,nS\d,/m);
    expect(JSON.parse(file("budget.json")).decoders.round.kind).toBe("high-side-switch");
  }, 60_000);

  it("refuses what a high-side switch cannot take, naming each decoder and the reason", async () => {
    for (const command of ["synth", "budget", "export"]) {
      const r = await run([command, "refused.json", ...(command === "export" ? ["--out", "papers"] : [])]);
      expect(r.code, command).toBe(2);
      expect(r.err).toContain(
        'decoders[1].counter.drive: got "source" with "electrical.driver.kind": "high-side-switch"; a high-side switch turns on when its node is pulled low',
      );
      expect(r.err).toContain('set counter.drive to "sink" or "complementary"');
      expect(r.err).toContain('(the shared section, as decoder "bcd" uses it)');
      expect(r.err).not.toContain("decoders[0]");
    }
  });
});
