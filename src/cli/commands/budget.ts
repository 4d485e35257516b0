import { budgetDesign, solveBudget } from "../../core/budget/budget.ts";
import type { Budget, DarkBudget } from "../../core/budget/budgetTypes.ts";
import type { DecodeSpec } from "../../core/spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../../core/matrix/matrix.ts";
import type { DriverKind, Project } from "../../core/project/project.ts";
import { budgetJsonText } from "../../render/budgetJson.ts";
import { warningText } from "../../render/budgetWarningText.ts";
import { budgetDesignNote, shortFigures, shortOfText } from "../../render/targetShortText.ts";
import { logicDrawClause } from "../../render/logicDrawText.ts";
import { forcedBetaText } from "../../render/forcedBetaText.ts";
import { noSourceLineText } from "../../render/counterLineText.ts";
import { darkFigureLines, darkNetworkText } from "../../render/darkBudgetText.ts";
import { currentText, formatOhms, microamps, milliamps, milliwatts, percent, volts } from "../../render/units.ts";
import type { Command } from "../command.ts";
import { budgetDeadline, designArgs, DESIGN_OPTIONS, DESIGN_USAGE } from "../designOptions.ts";
import { DECODER_OPTION, DECODER_USAGE, decoderIo, loadInstrument } from "../loadProject.ts";
import { instrumentBudget, type BudgetedDecoder } from "../../core/budget/instrumentBudget.ts";
import { describeInstrumentTotals, instrumentBudgetJsonText } from "../../render/instrumentBudgetReport.ts";
import { quoteText } from "../../core/project/valueText.ts";
import { EXIT } from "../io.ts";
import { darkMarginLines } from "../darkSizingText.ts";
import { SYNTH_OPTIONS, SYNTH_USAGE, synthesizeForCircuit } from "../synthOptions.ts";

const USAGE = `budget FILE [--json] ${SYNTH_USAGE} ${DESIGN_USAGE} ${DECODER_USAGE}`;

export const budgetCommand: Command = {
  name: "budget",
  usage: USAGE,
  options: {
    json: {
      help: "print the budget as diodeloom/budget@3 JSON (SI units; an instrument: diodeloom/instrument-budget@1, its totals and each decoder's)",
    },
    ...DECODER_OPTION,
    ...SYNTH_OPTIONS,
    ...DESIGN_OPTIONS,
  },
  async run(args, io) {
    const design = designArgs(args, io);
    if (!design) return EXIT.input;
    const loaded = await loadInstrument(args, io, USAGE);
    if (!loaded) return EXIT.input;
    const { instrument, refPrefixes } = loaded;
    const json = args.flags.has("json");
    const budgeted: BudgetedDecoder[] = [];
    let longestMs = 0;
    for (const [i, d] of instrument.decoders.entries()) {
      const dio = instrument.single ? io : decoderIo(io, d.name);
      const done = await synthesizeForCircuit(d.project, args, dio, refPrefixes[i] ?? "");
      if (typeof done === "number") return done;
      longestMs = Math.max(longestMs, done.timeLimitMs);
      const budget = solveBudget(done.project, done.spec, done.matrix, {
        series: design.series,
        trim: design.mode,
        deadlineMs: budgetDeadline(done.timeLimitMs),
        timeLimitMs: done.timeLimitMs,
      });
      if (!budget.ok) {
        dio.err(`${budget.error.message}\n`);
        return EXIT.input;
      }
      budgeted.push({ name: d.name, project: done.project, spec: done.spec, matrix: done.matrix, budget: budget.value });
    }
    const [only] = budgeted;
    if (instrument.single && only) {
      io.out(json ? budgetJsonText(only.budget) : describeBudget(only.project, only.spec, only.matrix, only.budget));
      return EXIT.ok;
    }
    const totals = instrumentBudget(instrument.title, budgeted, budgetDeadline(longestMs));
    if (!totals.ok) {
      io.err(`decoder ${quoteText(totals.error.decoder ?? "")}: ${totals.error.message}\n`);
      return EXIT.input;
    }
    if (json) {
      io.out(
        instrumentBudgetJsonText(
          totals.value,
          budgeted.map((b) => b.budget),
        ),
      );
      return EXIT.ok;
    }
    const count = budgeted.length;
    io.out(`${instrument.title}\nAn instrument of ${count} decoders; each decoder's budget, then the instrument's totals.\n\n`);
    for (const [i, b] of budgeted.entries()) {
      io.out(`== Decoder ${i + 1} of ${count}: ${b.name} ==\n${describeBudget(b.project, b.spec, b.matrix, b.budget)}\n`);
    }
    io.out(
      describeInstrumentTotals(
        totals.value,
        budgeted.map((b) => b.project.counter.states),
      ),
    );
    return EXIT.ok;
  },
};

function table(head: readonly string[], rows: readonly (readonly string[])[]): string[] {
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? "").length)));
  const line = (r: readonly string[]): string =>
    "  " + r.map((c, i) => (i === 0 ? c.padEnd(widths[i] ?? 0) : c.padStart(widths[i] ?? 0))).join("  ");
  return [line(head), ...rows.map(line)];
}

const KIND_WORDS: Readonly<Record<Budget["kind"], string>> = {
  "current-sink": "NPN constant-current sinks",
  "low-side-switch": "NPN low-side switches",
  "emitter-follower": "NPN emitter followers",
  "high-side-switch": "PNP high-side switches",
  direct: "direct drive from the counter lines",
};

/** A current for a table, in mA (three decimals) at or above 0.1 mA, else in µA. */
function amps(a: number, unit: "mA" | "µA"): string {
  return unit === "mA" ? milliamps(a, 3) : microamps(a);
}

/** The dark-decoded outputs' network and ghost check, every state at every corner. */
function darkLines(project: Project, spec: DecodeSpec, m: VerifiedMatrix, b: Budget, d: DarkBudget, unit: "mA" | "µA"): string[] {
  const L: string[] = [];
  L.push(`Dark-decoded outputs (${d.outputs.length}): ${darkNetworkText(d)}`);
  L.push(`  sizing: ${d.sizing}`);
  const design = budgetDesign(b);
  if (design.network !== null && design.network !== undefined)
    L.push(...darkMarginLines(project, spec, m, design.network, d, design.ohms).map((l) => `  ${l}`));
  L.push(
    ...table(
      ["Output", "Pull-up", d.input === "divider" ? "Divider" : "Level shift", d.input === "divider" ? "Lower" : "Bleed"],
      d.outputs.map((o) => [o.output, o.pullUp, d.input === "divider" ? (o.divider ?? "") : o.shiftDiodes.join(" "), o.bleed]),
    ),
  );
  L.push(
    `Ghost check (every state at the nominal values and both corners; unlit = the largest unlit segment current of a dark-decoded output, ` +
      `lit = the smallest lit one, sink = what the state's active-low line sinks)`,
  );
  const byState = new Map<string, Map<string, DarkBudget["states"][number]>>();
  for (const s of d.states) byState.set(s.state, (byState.get(s.state) ?? new Map()).set(s.corner, s));
  const cell = (s: DarkBudget["states"][number] | undefined): string[] => [
    s?.worstUnlit ? `${microamps(s.worstUnlit.currentA)} ${s.worstUnlit.output}` : "-",
    s?.weakestLit ? `${amps(s.weakestLit.currentA, unit)} ${s.weakestLit.output}` : "-",
    s ? milliamps(s.lineSinkA, 3) : "-",
  ];
  const corners = ["nominal", "low", "high"];
  L.push(
    ...table(
      ["State", ...corners.flatMap((c) => [`${c} unlit µA`, `lit ${unit}`, "sink mA"])],
      [...byState].map(([state, m]) => [state, ...corners.flatMap((c) => cell(m.get(c)))]),
    ),
  );
  L.push(...darkFigureLines(d, unit).map((l) => `  ${l}`));
  return L;
}

/** The report of `budget`. */
export function describeBudget(project: Project, spec: DecodeSpec, m: VerifiedMatrix, b: Budget): string {
  const e = project.electrical;
  const unit: "mA" | "µA" = e.segment.targetA >= 1e-4 ? "mA" : "µA";
  const L: string[] = [];
  L.push(project.title);
  const supply =
    b.kind === "direct"
      ? `counter lines at ${e.counterOutput.high} V`
      : `supply ${e.supply.volts} V (${e.supply.minVolts}-${e.supply.maxVolts} V)`;
  L.push(
    `DC budget at ${e.temperatureC} °C: ${KIND_WORDS[b.kind]}, ${supply}, segments of ${e.segment.leds} LED${e.segment.leds === 1 ? "" : "s"}, ` +
      `target ${amps(e.segment.targetA, unit)} ${unit}${e.preset !== null ? ` (preset ${e.preset})` : ""}; ${m.method} matrix, ${m.count} diodes, longest path ${m.longestPath}`,
  );
  L.push("");
  if (b.warnings.length > 0) {
    L.push("Warnings");
    for (const w of b.warnings) L.push(`  ${w.level.toUpperCase().padEnd(6)} ${w.code}: ${warningText(w)}`);
    L.push("");
  }
  const outs = Object.keys(b.outputs);
  L.push(`Segment current per state, ${unit} (lit segments; '.' = unlit, below the ghost limit; '!' = unlit above it)`);
  const ghostA = e.ghostFraction * e.segment.targetA;
  // A high-side switch's counter lines are active-low: the state's line sinks rather than sources.
  const highSide = b.kind === "high-side-switch";
  L.push(
    ...table(
      ["State", "Text", highSide ? "Sink mA" : "Source mA", "Supply mA", ...outs],
      b.states.map((s, k) => [
        s.state,
        `"${s.text}"`,
        milliamps(highSide ? (b.counterLines[`nS${k}`]?.sinkCurrentA ?? 0) : s.sourceCurrentA, 3),
        milliamps(s.supplyCurrentA),
        ...outs.map((o) => {
          const x = s.outputs[o];
          if (!x) return "";
          return x.lit ? amps(x.segmentA, unit) : x.segmentA > ghostA ? "!" : ".";
        }),
      ]),
    ),
  );
  L.push("");
  const role = b.trim.role === "emitter" ? "emitter resistor" : "series resistor";
  const trimState = b.trim.applied ? (b.corners.meetsTarget ? "applied" : "applied, yet the corners miss the target") : "not applied";
  L.push(
    `Outputs (spread = how much dimmer the dimmest state is; R = the design's ${role}; trim: ${b.trim.series}, ${trimState}, and the range it gives)`,
  );
  L.push(
    ...table(
      ["Output", "Depth", `Min ${unit}`, `Max ${unit}`, "Spread %", "Off max µA", "R", "Value", "Trim", `Trim ${unit}`],
      outs.map((o) => {
        const r = b.outputs[o] as Budget["outputs"][string];
        const t = b.trim.outputs[o];
        const dr = b.drivers[o];
        return [
          o,
          r.tiedOn ? "tied" : r.pathLengths.join("+"),
          amps(r.minA, unit),
          amps(r.maxA, unit),
          percent(r.spreadPct),
          microamps(r.offMaxA, 3),
          dr ? dr.currentResistor.ref : "",
          dr ? formatOhms(dr.currentResistor.ohms) : "",
          t ? formatOhms(t.ohms) : "",
          t ? `${amps(t.minA, unit)}-${amps(t.maxA, unit)}` : "",
        ];
      }),
    ),
  );
  L.push(
    `  Spread over all segments: ${percent(b.spreadPct)} %; with the project's resistors ${percent(b.trim.spreadPctBefore)} %, ` +
      `with the values the rule judged ${percent(b.trim.spreadPct)} %`,
  );
  L.push(
    `  Farthest segment from the target: ${percent(b.trim.offTargetPctBefore)} % with the project's resistors, ` +
      `${percent(b.trim.offTargetPct)} % with the trim; outside the ±${b.corners.windowPct} % window by ${percent(b.trim.windowDistancePctBefore)} % and ${percent(b.trim.windowDistancePct)} %`,
  );
  L.push(`  ${budgetDesignNote(b)}`);
  L.push("");
  const diodes = Object.entries(b.diodes);
  if (diodes.length > 0) {
    const [fRef, f] = diodes.reduce((a, c) => (c[1].maxCurrentA > a[1].maxCurrentA ? c : a));
    const [rRef, r] = diodes.reduce((a, c) => (c[1].maxReverseV > a[1].maxReverseV ? c : a));
    L.push(`Diodes (${diodes.length}; every one in --json)`);
    L.push(
      `  largest forward current ${milliamps(f.maxCurrentA, 3)} mA in ${fRef} (${f.from} -> ${f.to}); rated ${milliamps(f.ratedCurrentA)} mA`,
    );
    L.push(`  largest reverse voltage ${volts(r.maxReverseV)} V across ${rRef} (${r.from} -> ${r.to}); rated ${volts(r.ratedReverseV)} V`);
    L.push("");
  }
  const coded = spec.counter.kind !== "one-hot";
  const noSourceLine = noSourceLineText(b, project.counter.drive);
  if (highSide) {
    L.push(
      `Active-low lines (each low in its own state, sinking every lit segment's base current and line pull-up; each may sink ${milliamps(e.lowLine.maxCurrentA)} mA)`,
    );
    L.push(
      ...table(
        ["Line", "Sinks mA", "State"],
        Object.entries(b.counterLines).map(([l, c]) => [l, milliamps(c.sinkCurrentA, 3), c.sinkState ?? ""]),
      ),
    );
  } else if (noSourceLine !== null) {
    L.push(noSourceLine);
  } else {
    L.push(
      coded
        ? `Stage lines (each may source or sink ${milliamps(e.counterOutput.maxCurrentA)} mA; sources = most while high, sinks = most while low)`
        : `Counter lines (when active; each may source ${milliamps(e.counterOutput.maxCurrentA)} mA)`,
    );
    L.push(
      ...table(
        coded ? ["Line", "Sources mA", "Line V", "Sag V", "Sinks mA", "In"] : ["Line", "Sources mA", "Line V", "Sag V"],
        Object.entries(b.counterLines).map(([l, c]) => [
          l,
          milliamps(c.sourceCurrentA, 3),
          volts(c.lineV),
          volts(c.sagV),
          ...(coded ? [milliamps(c.sinkCurrentA, 3), c.sinkState ?? ""] : []),
        ]),
      ),
    );
  }
  L.push("");
  const gates = Object.entries(b.gates);
  if (gates.length > 0) {
    L.push(`AND gates (low = highest node voltage while an input is low; high = lowest while every input is high)`);
    L.push(
      ...table(
        ["Gate", "Inputs", "Pull-up", "Value", "Low max V", "High min V", "Pull-up max mA"],
        gates.map(([g, x]) => [
          g,
          x.inputs.join("·"),
          x.pullUp.ref,
          formatOhms(x.pullUp.ohms),
          x.lowMaxV === null ? "-" : volts(x.lowMaxV),
          x.highMinV === null ? "-" : volts(x.highMinV),
          milliamps(x.maxPullUpA, 3),
        ]),
      ),
    );
    L.push("");
  }
  if (b.dark !== null) L.push(...darkLines(project, spec, m, b, b.dark, unit), "");
  if (b.kind !== "direct") {
    const isSwitch = b.kind === "low-side-switch" || b.kind === "high-side-switch";
    const figure = isSwitch
      ? `forced beta = largest Ic/Ib of a lit switch at the low corner, saturated below beta ${e.tolerance.betaMin}`
      : `headroom = lowest collector-base voltage of a lit driver at the ${e.supply.minVolts} V supply`;
    L.push(`Drivers (${figure})`);
    L.push(
      ...table(
        ["Output", "Q", "R", "Value", "Vce max V", "Ic max mA", "P max mW", isSwitch ? "Forced beta" : "Headroom V"],
        Object.entries(b.drivers).map(([o, d]) => [
          o,
          d.transistor ?? "",
          d.currentResistor.ref,
          formatOhms(d.currentResistor.ohms),
          volts(d.maxVceV),
          milliamps(d.maxCollectorA),
          milliwatts(d.maxPowerW, 2),
          d.forcedBeta !== null
            ? `${forcedBetaText(d.forcedBeta, d.saturated === true)}${d.saturated ? "" : " (not saturated)"}`
            : d.headroomV !== null
              ? volts(d.headroomV)
              : "",
        ]),
      ),
    );
    L.push("");
  }
  const logicClause = logicDrawClause(b.kind, b.logic.maxCurrentA);
  if (b.kind !== "direct")
    L.push(`Segment supply: up to ${milliamps(b.supply.maxCurrentA)} mA, ${milliwatts(b.supply.maxPowerW)} mW at ${b.supply.volts} V`);
  L.push(
    `Logic supply (counter lines, tie-on${Object.keys(b.gates).length > 0 ? ", gate pull-ups" : ""}): up to ${milliamps(b.logic.maxCurrentA)} mA, ${milliwatts(b.logic.maxPowerW)} mW at ${b.logic.volts} V` +
      (logicClause === null ? "" : `; ${logicClause}`),
  );
  L.push("");
  const which = b.trim.applied ? "trimmed design" : "design with the project's resistors";
  L.push(`Tolerance corners (${which}; ±${e.tolerance.resistorPct} % resistors, beta ${e.tolerance.betaMin}-${e.tolerance.betaMax})`);
  // The drivers' verdicts are the low corner's: there, every switch saturated means the largest forced beta is below the lowest beta.
  const everySaturated = Object.values(b.drivers).every((d) => d.saturated === true);
  for (const c of [b.corners.low, b.corners.high]) {
    const k = c.conditions;
    const driverFigure =
      c.maxForcedBeta !== null
        ? `, forced beta up to ${forcedBetaText(c.maxForcedBeta, k.name === "low" && everySaturated)}`
        : c.minHeadroomV !== null
          ? `, headroom ${volts(c.minHeadroomV)} V`
          : "";
    L.push(
      `  ${k.name.padEnd(4)} ${k.supplyV} V, ${k.temperatureC} °C, beta ${k.betaF}: segments ${amps(c.minCurrentA, unit)}-${amps(c.maxCurrentA, unit)} ${unit}` +
        `${driverFigure}, driver up to ${milliwatts(c.maxPowerW, 2)} mW`,
    );
  }
  L.push(...unlitLines(b));
  L.push(
    `  ${b.corners.meetsTarget ? "Meets" : "Misses"} the target: every corner within ±${b.corners.windowPct} % of ${amps(e.segment.targetA, unit)} ${unit}, under the rating${driverRule(e.driver.kind)}`,
  );
  if (!b.corners.meetsTarget) L.push(`  Missed: ${shortOfText(b.corners.shortOf, shortFigures(b))}`);
  L.push(`  Temperature: VT = kT/q; silicon Is(T) as SPICE scales it (EG 1.11 eV, XTI 3); LEDs -2 mV/°C at constant current`);
  return L.join("\n") + "\n";
}

/**
 * The worst unlit segment at the nominal values and each corner, against the
 * ghost limit: `unlit at most 4.15 pA (1d in S1) nominal, ...`; nothing when
 * no output is ever unlit.
 */
function unlitLines(b: Budget): string[] {
  const u = b.unlit;
  const cases = [
    ["nominal", u.nominal],
    ["low corner", u.low],
    ["high corner", u.high],
  ] as const;
  if (cases.every(([, f]) => f === null)) return [];
  const said = cases.map(([name, f]) => (f === null ? `none ${name}` : `${currentText(f.currentA)} (${f.output} in ${f.state}) ${name}`));
  const over = cases.filter(([, f]) => f !== null && f.currentA > u.ghostLimitA).map(([name]) => name);
  return [
    `  unlit segments at most ${said.join(", ")}, against the ${currentText(u.ghostLimitA)} ghost limit` +
      (over.length > 0 ? ` (ABOVE it: ${over.join(", ")})` : ""),
  ];
}

/** What the target asks of the driver kind, after the window and the rating (budget.ts `meetsTarget`). */
function driverRule(kind: DriverKind): string {
  switch (kind) {
    case "low-side-switch":
    case "high-side-switch":
      return ", every switch saturated";
    case "current-sink":
    case "emitter-follower":
      return ", every driver out of saturation (collector-base headroom above 0 V)";
    case "direct":
      return "";
  }
}
