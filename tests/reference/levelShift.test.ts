/**
 * Source: ngspice, and diode-transistor logic for the principle (both in docs/sources.md).
 *
 * The level-shift arithmetic of a dark-decoded output (src/core/spec/levelShift.ts)
 * against ngspice (the open reference simulator; docs/sources.md "DC
 * operating point"). The principle, a pulled-down node sitting a forward
 * drop per diode above the line's low level and level-shift diodes in
 * series with the base taking that back off, is diode-transistor logic's
 * (docs/sources.md "Drivers and levels", "Diode-transistor logic").
 *
 * Two decks per design, built here from the project's own values:
 * - the pulled-down node: the busiest line (its low level behind its
 *   resistance, every pull-up of that state on it) and one output's
 *   pull-up current through `depth` matrix diodes: the node's voltage;
 * - the driver's input: that node voltage through k level-shift diodes, the
 *   base resistor, the base bleed and the NPN: its collector current.
 * Both agree with the arithmetic within 0.5 % (collector currents from
 * 10 nA to 1 A; outside that range both sides of the ghost limit agree), and the number of shift
 * diodes chosen is the least that ngspice also finds within the ghost limit.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { ELECTRICAL_PRESETS } from "../../src/core/project/electricalPresets.ts";
import type { ElectricalModel } from "../../src/core/project/project.ts";
import { levelShift } from "../../src/core/spec/levelShift.ts";

const dir = mkdtempSync(join(tmpdir(), "diodeloom-shift-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function ngspice(lines: readonly string[], probes: readonly string[], name: string): Map<string, number> {
  const deck = [
    `* ${name}`,
    ...lines,
    ".options reltol=1e-6 vntol=1e-9 abstol=1e-15 temp=27 tnom=27",
    // Batch mode wants one analysis line besides the control block.
    ".op",
    ".control",
    "op",
    `print ${probes.join(" ")}`,
    ".endc",
    ".end",
    "",
  ].join("\n");
  const path = join(dir, `${name}.cir`);
  writeFileSync(path, deck);
  const out = execFileSync("ngspice", ["-b", path], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
  const values = new Map<string, number>();
  for (const m of out.matchAll(/^\s*(\S+) = (\S+)\s*$/gm)) values.set((m[1] as string).toLowerCase(), Number(m[2]));
  return values;
}

function close(a: number, b: number, what: string): void {
  expect(Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b)), `${what}: diodeloom ${a}, ngspice ${b}`).toBeLessThanOrEqual(0.005);
}

const cases: readonly { name: string; e: ElectricalModel; depth: number; pulled: number }[] = [
  { name: "bench-5v-switch", e: ELECTRICAL_PRESETS["bench-5v-switch"], depth: 2, pulled: 5 },
  { name: "bench-5v-switch depth 1", e: ELECTRICAL_PRESETS["bench-5v-switch"], depth: 1, pulled: 5 },
  { name: "panel-12v-sink", e: ELECTRICAL_PRESETS["panel-12v-sink"], depth: 2, pulled: 6 },
  { name: "cathode-5v-follower", e: ELECTRICAL_PRESETS["cathode-5v-follower"], depth: 2, pulled: 4 },
];

describe("level-shift arithmetic against ngspice", () => {
  for (const c of cases) {
    it(`${c.name}: the pulled-down node, and the collector current behind each number of shift diodes`, () => {
      const { e, depth, pulled } = c;
      const shift = levelShift(e, depth, pulled);
      const d = e.diode;
      const model = `.model dm D(IS=${d.is} N=${d.n} RS=${d.rs})`;
      // The node: the pull-up current through `depth` diodes into the line, which also carries the other pull-ups.
      const node = [
        model,
        `Vlow low 0 DC ${e.lowLine.low}`,
        `Rline line low ${e.lowLine.resistance}`,
        `Iothers 0 line DC ${shift.pullUpA * (pulled - 1)}`,
        `Ipu 0 n0 DC ${shift.pullUpA}`,
        ...Array.from({ length: depth }, (_, i) => `Dm${i} n${i} ${i + 1 === depth ? "line" : `n${i + 1}`} dm`),
      ];
      const nodeV = ngspice(node, ["v(n0)", "v(line)"], `${c.name}-node`.replace(/\W+/g, "-"));
      close(shift.nodeLowV, nodeV.get("v(n0)") as number, "node low");
      close(shift.lineLowV, nodeV.get("v(line)") as number, "line low");

      const dr = e.driver;
      const isSwitch = dr.kind === "low-side-switch";
      const bleed = isSwitch && dr.baseEmitterResistor !== null ? dr.baseEmitterResistor : e.pullDown;
      const series = isSwitch || dr.kind === "emitter-follower" ? dr.baseResistor : 0;
      const emitter = dr.kind === "current-sink" ? dr.emitterResistor : 0;
      let firstEnough: number | null = null;
      for (const step of shift.steps) {
        const k = step.diodes;
        const chain = Array.from({ length: k }, (_, i) => `Ds${i} s${i} s${i + 1} dm`);
        const input = [
          model,
          `.model qn NPN(IS=${dr.is} BF=${dr.betaF} BR=${dr.betaR})`,
          `Vnode s0 0 DC ${shift.nodeLowV}`,
          ...chain,
          series > 0 ? `Rb s${k} b ${series}` : `Rb s${k} b 1e-3`,
          `Rbleed b 0 ${bleed}`,
          "Vcc cc 0 DC 5",
          "Vic cc c DC 0",
          emitter > 0 ? `Re e 0 ${emitter}` : "Re e 0 1e-3",
          "Q1 c b e qn",
        ];
        const got = ngspice(input, ["i(vic)"], `${c.name}-shift-${k}`.replace(/\W+/g, "-"));
        const ic = got.get("i(vic)") as number;
        // Below 10 nA ngspice's junction leakage (GMIN across the reverse-biased collector junction, some pA) shows;
        // above 1 A the transistor is hard on in both and only the 1 mΩ stand-in for a missing base resistor limits it.
        const what = `collector current behind ${k} shift diodes`;
        if (Math.max(ic, step.collectorA) < 1e-8) expect(Math.max(ic, step.collectorA), what).toBeLessThan(shift.ghostA);
        else if (Math.min(ic, step.collectorA) > 1) expect(Math.min(ic, step.collectorA), what).toBeGreaterThan(shift.ghostA);
        else close(step.collectorA, ic, what);
        if (firstEnough === null && ic <= shift.ghostA) firstEnough = k;
      }
      expect(shift.diodes).toBe(firstEnough);
    });
  }

  it("needs more shift diodes for a deeper path: each matrix diode adds a forward drop", () => {
    const e = ELECTRICAL_PRESETS["bench-5v-switch"];
    const one = levelShift(e, 1, 5);
    const two = levelShift(e, 2, 5);
    expect(two.nodeLowV - one.nodeLowV).toBeGreaterThan(0.5);
    expect(two.diodes ?? 99).toBeGreaterThanOrEqual(one.diodes ?? 99);
  });
});
