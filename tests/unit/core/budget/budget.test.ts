import { describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../../../src/core/budget/budget.ts";
import { BUDGET_SCHEMA, type Budget, type BudgetOptions } from "../../../../src/core/budget/budgetTypes.ts";
import { E24, E96 } from "../../../../src/core/budget/eSeries.ts";
import { directDesign, handBuilt, sharedDieRoller, type Design } from "../../../support/budgetFixtures.ts";
import { example, exampleFormat1, showing, showingWith } from "../../../support/projects.ts";

function budgetOf(d: Design, options: BudgetOptions = {}): Budget {
  const b = solveBudget(d.project, d.spec, d.matrix, options);
  if (!b.ok) throw new Error(b.error.message);
  return b.value;
}

const isPreferred = (ohms: number, table: readonly number[]): boolean => {
  const digits = table === E24 ? 2 : 3;
  const sig = Number((ohms / 10 ** (Math.floor(Math.log10(ohms)) - digits + 1)).toFixed(6));
  return table.includes(sig);
};

describe("solveBudget", () => {
  const shared = sharedDieRoller();
  const b = budgetOf(shared);

  it("has the budget@3 shape in SI units, each unit in its field's name, with finite numbers only (null only where a kind has no such figure)", () => {
    expect(b.schema).toBe(BUDGET_SCHEMA);
    expect(b.states.map((s) => s.state)).toEqual(shared.spec.states);
    const s0 = b.states[0];
    expect(Object.keys(s0?.outputs ?? {}).sort()).toEqual([...shared.spec.outputs].sort());
    expect(s0?.outputs["1c"]?.lit).toBe(true);
    expect(s0?.outputs["1c"]?.segmentA).toBeGreaterThan(50e-6);
    expect(s0?.outputs["1c"]?.segmentA).toBeLessThan(300e-6);
    expect(s0?.outputs["1tl"]?.segmentA).toBeLessThan(1e-9);
    expect(s0?.outputs["1c"]?.inputV).toBeGreaterThan(1.5);
    expect(s0?.outputs["1c"]?.driver?.icA).toBeCloseTo(s0?.outputs["1c"]?.segmentA ?? 0, 9);
    const text = JSON.stringify(b);
    expect(text).not.toMatch(/NaN|Infinity/);
    // A sink has no forced beta and no saturation verdict; its headroom is a number. Every output decoded lit: no dark section
    // (and the corner-target warning names no dark input network).
    const nulls = [...text.matchAll(/"(\w+)":null/g)].map((m) => m[1]);
    expect(new Set(nulls)).toEqual(
      new Set(
        ["forcedBeta", "saturated", "maxForcedBeta", "unappliedTrim", "offMaxState", "dark", "darkInput"].filter((k) => nulls.includes(k)),
      ),
    );
    expect(b.dark).toBeNull();
    expect(Object.values(b.drivers).every((d) => typeof d.headroomV === "number")).toBe(true);
    expect(Object.keys(JSON.parse(text) as object)).toEqual(
      expect.arrayContaining([
        "kind",
        "states",
        "outputs",
        "diodes",
        "supply",
        "logic",
        "warnings",
        "trim",
        "corners",
        "drivers",
        "counterLines",
      ]),
    );
    expect(b.kind).toBe("current-sink");
  });

  it("shows the dimming of a second diode drop, and the trim taking it out", () => {
    // The project's own emitter resistors (the trim off): the depth-2 output runs dimmer.
    const own = budgetOf(shared, { trim: "off" });
    const depth1 = own.outputs["1c"];
    const depth2 = own.outputs["1tr"];
    expect(depth1?.pathLengths).toEqual([1]);
    expect(depth2?.pathLengths).toEqual([2]);
    expect(depth2?.maxA ?? 1).toBeLessThan((depth1?.minA ?? 0) * 0.8);
    expect(b.trim.spreadPct).toBeLessThan(b.trim.spreadPctBefore / 2);
    // A depth-2 output needs a smaller emitter resistor for the same current.
    expect(b.trim.outputs["1tr"]?.ohms ?? 0).toBeLessThan(b.trim.outputs["1c"]?.ohms ?? 0);
    expect(b.trim.role).toBe("emitter");
    for (const t of Object.values(b.trim.outputs)) {
      expect(isPreferred(t.ohms, E24)).toBe(true);
      expect(Math.abs((t.minA + t.maxA) / 2 - b.targetA)).toBeLessThan(b.targetA * 0.06);
    }
    const e96 = budgetOf(shared, { series: "E96" });
    for (const t of Object.values(e96.trim.outputs)) {
      expect(isPreferred(t.ohms, E96)).toBe(true);
      expect(Math.abs((t.minA + t.maxA) / 2 - b.targetA)).toBeLessThan(b.targetA * 0.02);
    }
  });

  it("stops at its deadline with a time-limit failure naming the solve and the state, and is unchanged by one far away", () => {
    const past = solveBudget(shared.project, shared.spec, shared.matrix, { deadlineMs: Date.now() - 1 });
    expect(past.ok).toBe(false);
    if (past.ok) return;
    expect(past.error.kind).toBe("time-limit");
    expect(past.error.during).toBe("nominal");
    expect(past.error.state).toBe("S0");
    expect(past.error.message).toMatch(/time limit ran out during the nominal solve, at state S0 of 6/);
    const far = solveBudget(shared.project, shared.spec, shared.matrix, { deadlineMs: Date.now() + 3_600_000 });
    const none = solveBudget(shared.project, shared.spec, shared.matrix);
    expect(far).toEqual(none);
  });

  it("per output: min, max and spread over the states that light it", () => {
    for (const [o, r] of Object.entries(b.outputs)) {
      const lit = b.states.map((s) => s.outputs[o]).filter((x) => x?.lit);
      expect(r.minA).toBe(Math.min(...lit.map((x) => x?.segmentA as number)));
      expect(r.maxA).toBe(Math.max(...lit.map((x) => x?.segmentA as number)));
      expect(r.spreadPct).toBeCloseTo((100 * (r.maxA - r.minA)) / r.maxA, 9);
    }
  });

  it("per diode, counter line and supply: the worst case over the states", () => {
    const d1 = b.diodes["D1"];
    expect(d1?.from).toBe("S0");
    expect(d1?.maxCurrentA).toBeGreaterThan(10e-6);
    expect(d1?.maxReverseV).toBeGreaterThan(1.5);
    expect(d1?.ratedCurrentA).toBe(0.1);
    for (const [line, c] of Object.entries(b.counterLines)) {
      expect(c.sagV).toBeCloseTo(2.4 - c.lineV, 12);
      expect(c.sourceCurrentA).toBeCloseTo(c.sagV / 1000, 12);
      expect(c.ratedA).toBe(0.0004);
      expect(b.states.find((s) => s.state === line)?.sourceCurrentA).toBe(c.sourceCurrentA);
    }
    const most = Math.max(...b.states.map((s) => Object.values(s.outputs).reduce((a, o) => a + o.segmentA, 0)));
    expect(b.supply.maxCurrentA).toBeCloseTo(most, 12);
    expect(b.supply.maxPowerW).toBeCloseTo(most * 100, 10);
    // Format 1 has no tied-on output here: the logic supply gives only the active line.
    expect(b.logic.maxCurrentA).toBeCloseTo(Math.max(...b.states.map((s) => s.sourceCurrentA)), 12);
  });

  it("per driver: Vce, dissipation and headroom at the lowest supply", () => {
    for (const d of Object.values(b.drivers)) {
      expect(d.maxVceV).toBeGreaterThan(30);
      expect(d.maxPowerW).toBeGreaterThan(1e-3);
      expect(d.maxPowerW).toBeLessThan(0.5);
      expect(d.headroomV).toBeGreaterThan(20);
      expect(d.headroomV).toBeLessThan(90 - 50);
      expect(d.maxCollectorA).toBeGreaterThan(100e-6);
      expect([d.forcedBeta, d.saturated]).toEqual([null, null]);
      expect(d.resistors[0]).toEqual(d.currentResistor);
    }
  });

  it("carries the hazardous-voltage and mains cautions above 60 V, and not below", () => {
    expect(b.warnings.filter((w) => w.level === "danger").map((w) => w.code)).toEqual(["hazardous-voltage", "mains-supply"]);
    const low = showing(["1", "7"], 1, { electrical: { string: { dies: 12 }, supply: { volts: 48, minVolts: 45, maxVolts: 50 } } });
    const lb = budgetOf(directDesign("48 V", low));
    expect(lb.warnings.some((w) => w.level === "danger")).toBe(false);
  });

  it("warns of a driver that saturates at the lowest supply", () => {
    const p = showing(["1", "7"], 1, { electrical: { supply: { volts: 56, minVolts: 54, maxVolts: 58 } } });
    const w = budgetOf(directDesign("tight", p)).warnings;
    expect(w.some((x) => x.code === "driver-saturation")).toBe(true);
  });

  it("warns of a diode over its rating", () => {
    const p = showing(["1", "7", "8"], 1, { electrical: { diode: { maxForwardA: 1e-6, maxReverseV: 1 } } });
    const codes = budgetOf(directDesign("weak diode", p)).warnings.map((x) => x.code);
    expect(codes).toContain("diode-current");
    expect(codes).toContain("diode-reverse");
  });

  it("meets its target when nothing varies, and says so over the corners", () => {
    const fixed = showing(["1", "7"], 1, {
      electrical: {
        supply: { volts: 100, minVolts: 100, maxVolts: 100 },
        tolerance: { resistorPct: 0, betaMin: 150, betaMax: 150, temperatureC: [27, 27] },
      },
    });
    const fb = budgetOf(directDesign("fixed", fixed));
    expect(fb.corners.meetsTarget).toBe(true);
    expect(fb.corners.low.minCurrentA).toBeCloseTo(Math.min(...Object.values(fb.trim.outputs).map((t) => t.minA)), 12);
    expect(b.corners.low.minCurrentA).toBeLessThan(b.corners.high.minCurrentA);
    expect(b.corners.low.conditions.temperatureC).toBe(0);
  });

  it("stays finite with nothing to drive, and with every output tied on", () => {
    for (const texts of [
      [" ", " "],
      ["8", "8"],
    ]) {
      const eb = budgetOf(directDesign(texts.join(), showing(texts)));
      expect(JSON.stringify(eb)).not.toMatch(/NaN|Infinity/);
      expect(Object.keys(eb.diodes)).toEqual([]);
    }
    expect(Object.keys(budgetOf(directDesign("8", showing(["8", "8"]))).outputs)).toHaveLength(7);
  });

  it("handles every example's direct matrix, all by Newton from the builder's guess, as format 1 and with its own preset", () => {
    for (const name of ["relay-hex-monitor", "turntable-position", "die-roller"]) {
      for (const project of [exampleFormat1(name), example(name)]) {
        const eb = budgetOf(directDesign(name, project));
        expect(
          eb.states.every((s) => s.solver.method === "newton"),
          `${name} ${project.electrical.driver.kind}`,
        ).toBe(true);
      }
    }
  });

  it("describes one design: with the trim applied every figure is the trimmed design's, and budgetDesign gives its values", () => {
    expect(b.trim.applied).toBe(true);
    expect(b.design).toBe("trimmed");
    for (const [o, d] of Object.entries(b.drivers)) {
      expect(d.currentResistor.ohms).toBe(b.trim.outputs[o]?.ohms);
      expect([b.outputs[o]?.minA, b.outputs[o]?.maxA]).toEqual([b.trim.outputs[o]?.minA, b.trim.outputs[o]?.maxA]);
    }
    expect(b.spreadPct).toBe(b.trim.spreadPct);
    expect(Object.fromEntries(budgetDesign(b).ohms)).toEqual(
      Object.fromEntries(Object.entries(b.trim.outputs).map(([o, t]) => [o, t.ohms])),
    );
    const own = budgetOf(shared, { trim: "off" });
    expect(own.design).toBe("project");
    expect(Object.values(own.drivers).every((d) => d.currentResistor.ohms === 10_000)).toBe(true);
    expect(own.spreadPct).toBe(own.trim.spreadPctBefore);
    expect(own.corners.low.minCurrentA).toBeLessThan(b.corners.low.minCurrentA);
  });

  it("warns of the design it describes: the project's dim segments only where the trim is not applied, and why", () => {
    const own = budgetOf(shared, { trim: "off" });
    const dim = own.warnings.filter((w) => w.code === "dim-segment");
    expect(dim.map((w) => w.code === "dim-segment" && w.output).sort()).toEqual(["1bl", "1br", "1mr", "1tr"]);
    for (const w of dim) if (w.code === "dim-segment") expect(w.unappliedTrim?.why).toBe("turned-off");
    const spread = own.warnings.find((w) => w.code === "brightness-spread");
    expect(spread).toMatchObject({ spreadPct: own.trim.spreadPctBefore, trim: "turned-off", otherSpreadPct: own.trim.spreadPct });
    // With the trim applied, the design's strings all sit inside the window.
    expect(b.warnings.filter((w) => w.code === "dim-segment")).toEqual([]);
  });

  it("never applies by default a trim that widens the spread, and says so (hex monitor as format 1, direct)", () => {
    const hex = directDesign("hex monitor", exampleFormat1("relay-hex-monitor"));
    const auto = budgetOf(hex);
    expect(auto.trim.effect).toBe("widens-spread");
    expect(auto.trim.spreadPct).toBeGreaterThan(auto.trim.spreadPctBefore);
    expect(auto.trim.applied).toBe(false);
    expect(Object.values(auto.drivers).every((d) => d.currentResistor.ohms === 10_000)).toBe(true);
    const forced = budgetOf(hex, { trim: "on" });
    expect(forced.trim.applied).toBe(true);
    for (const [o, d] of Object.entries(forced.drivers)) expect(d.currentResistor.ohms).toBe(forced.trim.outputs[o]?.ohms);
    expect(forced.spreadPct).toBeGreaterThan(auto.spreadPct);
  });

  it("warns of every unlit segment above the ghost limit, naming the state and the current", () => {
    // Idle lines that only come down to 3 V, and a weak pull-down, leave an unlit follower's base high enough to glow.
    const p = showingWith(["1", "7"], { preset: "cathode-5v-follower", counterOutput: { low: 3 }, pullDown: 10_000_000 });
    const gb = budgetOf(directDesign("ghost", p));
    const ghosts = gb.warnings.filter((w) => w.code === "ghost-segment");
    expect(ghosts.length).toBeGreaterThan(0);
    for (const w of ghosts) {
      if (w.code !== "ghost-segment") continue;
      const s = gb.states.find((x) => x.state === w.state);
      expect(s?.outputs[w.output]?.lit).toBe(false);
      expect(s?.outputs[w.output]?.segmentA).toBe(w.currentA);
      expect(w.currentA).toBeGreaterThan(w.limitA);
      expect(w.limitA).toBeCloseTo(0.01 * 0.01, 12);
    }
    expect(
      budgetOf(directDesign("clean", showingWith(["1", "7"], { preset: "cathode-5v-follower" }))).warnings.some(
        (w) => w.code === "ghost-segment",
      ),
    ).toBe(false);
  });

  it("warns of a counter line asked for more than it may source, naming the line, the state and the current", () => {
    const p = showingWith(["1", "8"], { counterOutput: { maxCurrentA: 0.002 } });
    const lb = budgetOf(directDesign("weak line", p));
    const w = lb.warnings.filter((x) => x.code === "line-current");
    expect(w.map((x) => x.code === "line-current" && x.line)).toEqual(["S1"]);
    expect(w[0]).toMatchObject({ state: "S1", ratedA: 0.002, currentA: lb.counterLines["S1"]?.sourceCurrentA });
  });

  it("judges a switch at its weakest corner: saturated below the lowest beta, and says so when it is not", () => {
    const sat = budgetOf(directDesign("switch", showingWith(["1", "8"], { preset: "bench-5v-switch" })));
    for (const d of Object.values(sat.drivers)) {
      expect(d.saturated).toBe(true);
      expect(d.forcedBeta).toBeGreaterThan(5);
      expect(d.forcedBeta).toBeLessThan(100);
      expect(d.headroomV).toBeNull();
    }
    expect(sat.corners.low.maxForcedBeta).toBe(Math.max(...Object.values(sat.drivers).map((d) => d.forcedBeta ?? 0)));
    // 180 kΩ against the 47 kΩ base-emitter resistor: too little base current for 10 mA at the lowest beta.
    const weak = budgetOf(directDesign("weak switch", showingWith(["1", "8", " "], { driver: { baseResistor: 180_000 } })), {
      trim: "off",
    });
    const w = weak.warnings.filter((x) => x.code === "switch-unsaturated");
    expect(w.length).toBe(Object.keys(weak.drivers).length);
    for (const x of w) if (x.code === "switch-unsaturated") expect(x.forcedBeta).toBeGreaterThanOrEqual(x.betaMin);
    expect(weak.corners.meetsTarget).toBe(false);
    // 470 kΩ against 47 kΩ holds the base below turn-on: the switch is off, not weakly on.
    const off = budgetOf(directDesign("off switch", showingWith(["1", "8", " "], { driver: { baseResistor: 470_000 } })), { trim: "off" });
    expect(Object.values(off.drivers).every((d) => d.saturated === false && d.forcedBeta === null)).toBe(true);
  });

  it("names the cause of brightness that depends on the state: the line's sag, and the diode depth", () => {
    // A follower on a weak line: its segments dim as more of them share the active line.
    const sag = budgetOf(
      directDesign("sag", showingWith(["1", "8", " "], { preset: "cathode-5v-follower", counterOutput: { resistance: 1500 } })),
      { trim: "off" },
    );
    const w = sag.warnings.find((x) => x.code === "state-spread" && x.output === "1b");
    expect(w).toMatchObject({ code: "state-spread", minState: "S1", maxState: "S0", causes: ["line-sag"], litMin: 7, litMax: 2 });
    if (w?.code === "state-spread") expect(w.sagDeltaV).toBeGreaterThan(0.1);
    expect(sag.outputs["1b"]?.spreadPct).toBeGreaterThan(10);
    // The die roller with a bus, as a follower on a stiff line: 1tr is reached through two diodes in every state,
    // 1c through one; a link 1tl -> 1br puts 1br one diode deeper than 1tl.
    // "1", "7", blank on a stiff line: 1b and 1c are driven straight from S0 but through a bus from S1, one diode deeper.
    const p = showingWith(["1", "7", " "], { preset: "cathode-5v-follower", counterOutput: { resistance: 10 } });
    const edges = [
      { from: "S0", to: "1b" },
      { from: "S0", to: "1c" },
      { from: "S1", to: "X" },
      { from: "X", to: "1b" },
      { from: "X", to: "1c" },
      { from: "S1", to: "1a" },
    ];
    const deep = budgetOf(handBuilt("depth", p, edges, 2, "mixed"), { trim: "off" });
    expect(deep.outputs["1b"]?.pathLengths).toEqual([1, 2]);
    const d = deep.warnings.find((x) => x.code === "state-spread" && x.output === "1b");
    expect(d).toMatchObject({ code: "state-spread", minState: "S1", maxState: "S0", depthMin: 2, depthMax: 1 });
    if (d?.code === "state-spread") expect(d.causes[0]).toBe("diode-depth");
  });
});
