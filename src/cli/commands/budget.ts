import { budgetDesign, solveBudget } from "../../core/budget/budget.ts";
import type { Budget } from "../../core/budget/budgetTypes.ts";
import { designNote } from "../../core/budget/emitterDesign.ts";
import type { DecodeSpec } from "../../core/spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../../core/matrix/matrix.ts";
import type { Project } from "../../core/project/project.ts";
import { budgetJsonText } from "../../render/budgetJson.ts";
import { warningText } from "../../render/budgetWarningText.ts";
import { formatOhms, microamps, milliamps, milliwatts, nanoamps, percent, volts } from "../../render/units.ts";
import type { Command } from "../command.ts";
import { DESIGN_OPTIONS, DESIGN_USAGE, loadForDesign } from "../designOptions.ts";
import { EXIT } from "../io.ts";
import { SYNTH_OPTIONS, SYNTH_USAGE } from "../synthOptions.ts";

const USAGE = `budget FILE [--json] ${SYNTH_USAGE} ${DESIGN_USAGE}`;

export const budgetCommand: Command = {
  name: "budget",
  usage: USAGE,
  options: {
    json: { help: "print the budget as diodeloom/budget@2 JSON (SI units)" },
    ...SYNTH_OPTIONS,
    ...DESIGN_OPTIONS,
  },
  async run(args, io) {
    const done = await loadForDesign(args, io, USAGE);
    if (typeof done === "number") return done;
    const { project, spec, matrix, design } = done;
    const budget = solveBudget(project, spec, matrix, { series: design.series, trim: design.mode });
    if (!budget.ok) {
      io.err(`${budget.error.message}\n`);
      return EXIT.input;
    }
    if (args.flags.has("json")) io.out(budgetJsonText(budget.value));
    else io.out(describeBudget(project, spec, matrix, budget.value));
    return EXIT.ok;
  },
};

function table(head: readonly string[], rows: readonly (readonly string[])[]): string[] {
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? "").length)));
  const line = (r: readonly string[]): string =>
    "  " + r.map((c, i) => (i === 0 ? c.padEnd(widths[i] ?? 0) : c.padStart(widths[i] ?? 0))).join("  ");
  return [line(head), ...rows.map(line)];
}

/** The readable report of `budget`. */
export function describeBudget(project: Project, spec: DecodeSpec, m: VerifiedMatrix, b: Budget): string {
  const e = project.electrical;
  const L: string[] = [];
  L.push(project.title);
  L.push(
    `DC budget at ${e.temperatureC} °C: supply ${e.supply.volts} V (${e.supply.minVolts}-${e.supply.maxVolts} V), ` +
      `strings of ${e.string.dies} dies, target ${microamps(e.string.targetA)} µA; ${m.method} matrix, ${m.count} diodes, longest path ${m.longestPath}`,
  );
  L.push("");
  if (b.warnings.length > 0) {
    L.push("Warnings");
    for (const w of b.warnings) L.push(`  ${w.level.toUpperCase().padEnd(6)} ${w.code}: ${warningText(w)}`);
    L.push("");
  }
  const outs = Object.keys(b.outputs);
  L.push("String current per state, µA (lit strings; '.' = off)");
  L.push(
    ...table(
      ["State", "Text", "Source µA", "Supply mA", ...outs],
      b.states.map((s) => [
        s.state,
        `"${s.text}"`,
        microamps(s.sourceCurrentA),
        milliamps(s.supplyCurrentA),
        ...outs.map((o) => {
          const x = s.outputs[o];
          return x && x.lit ? microamps(x.stringCurrentA) : ".";
        }),
      ]),
    ),
  );
  L.push("");
  const trimState = b.trim.applied ? "applied" : "not applied";
  L.push(
    `Outputs (spread = how much dimmer the dimmest state is; Re = the design's emitter resistor; trim: ${b.trim.series}, ${trimState}, and the range it gives)`,
  );
  L.push(
    ...table(
      ["Output", "Depth", "Min µA", "Max µA", "Spread %", "Off max nA", "R", "Re", "Trim", "Trim µA"],
      outs.map((o) => {
        const r = b.outputs[o] as Budget["outputs"][string];
        const t = b.trim.outputs[o];
        const dr = b.drivers[o];
        return [
          o,
          r.tiedOn ? "tied" : r.pathLengths.join("+"),
          microamps(r.minA),
          microamps(r.maxA),
          percent(r.spreadPct),
          nanoamps(r.offMaxA),
          dr ? dr.emitterResistor : "",
          dr ? formatOhms(dr.emitterOhms) : "",
          t ? formatOhms(t.ohms) : "",
          t ? `${microamps(t.minA)}-${microamps(t.maxA)}` : "",
        ];
      }),
    ),
  );
  L.push(
    `  Spread over all strings: ${percent(b.spreadPct)} %; with the project's emitter resistors ${percent(b.trim.spreadPctBefore)} %, ` +
      `with the ${b.trim.series} trim ${percent(b.trim.spreadPct)} %`,
  );
  L.push(
    `  Farthest string from the target: ${percent(b.trim.offTargetPctBefore)} % with the project's emitter resistors, ` +
      `${percent(b.trim.offTargetPct)} % with the trim`,
  );
  L.push(`  ${designNote(budgetDesign(b))}`);
  L.push("");
  const diodes = Object.entries(b.diodes);
  if (diodes.length > 0) {
    const [fRef, f] = diodes.reduce((a, c) => (c[1].maxCurrentA > a[1].maxCurrentA ? c : a));
    const [rRef, r] = diodes.reduce((a, c) => (c[1].maxReverseV > a[1].maxReverseV ? c : a));
    L.push(`Diodes (${diodes.length}; every one in --json)`);
    L.push(
      `  largest forward current ${microamps(f.maxCurrentA)} µA in ${fRef} (${f.from} -> ${f.to}); rated ${milliamps(f.ratedCurrentA)} mA`,
    );
    L.push(`  largest reverse voltage ${volts(r.maxReverseV)} V across ${rRef} (${r.from} -> ${r.to}); rated ${volts(r.ratedReverseV)} V`);
    L.push("");
  }
  L.push("Counter lines (when active)");
  L.push(
    ...table(
      ["Line", "Sources µA", "Line V", "Sag V"],
      Object.entries(b.counterLines).map(([l, c]) => [l, microamps(c.sourceCurrentA), volts(c.lineV), volts(c.sagV)]),
    ),
  );
  L.push("");
  L.push(`Drivers (headroom = lowest collector-base voltage of a lit driver at the ${e.supply.minVolts} V supply)`);
  L.push(
    ...table(
      ["Output", "Q", "R", "Re", "Vce max V", "P max mW", "Headroom V"],
      Object.entries(b.drivers).map(([o, d]) => [
        o,
        d.transistor,
        d.emitterResistor,
        formatOhms(d.emitterOhms),
        volts(d.maxVceV),
        milliwatts(d.maxPowerW, 2),
        volts(d.headroomV),
      ]),
    ),
  );
  L.push("");
  L.push(`Supply: up to ${milliamps(b.supply.maxCurrentA)} mA, ${milliwatts(b.supply.maxPowerW)} mW at ${b.supply.volts} V`);
  L.push("");
  const which = b.trim.applied ? "trimmed design" : "design with the project's emitter resistors";
  L.push(`Tolerance corners (${which}; ±${e.tolerance.resistorPct} % resistors, beta ${e.tolerance.betaMin}-${e.tolerance.betaMax})`);
  for (const c of [b.corners.low, b.corners.high]) {
    const k = c.conditions;
    L.push(
      `  ${k.name.padEnd(4)} ${k.supplyV} V, ${k.temperatureC} °C, beta ${k.betaF}: strings ${microamps(c.minCurrentA)}-${microamps(c.maxCurrentA)} µA, ` +
        `headroom ${volts(c.minHeadroomV)} V, driver up to ${milliwatts(c.maxPowerW, 2)} mW`,
    );
  }
  L.push(
    `  ${b.corners.meetsTarget ? "Meets" : "Misses"} the target: every corner within ±${b.corners.windowPct} % of ${microamps(e.string.targetA)} µA, under the rating, no saturation`,
  );
  L.push(`  Temperature: VT = kT/q; silicon Is(T) as SPICE scales it (EG 1.11 eV, XTI 3); LED dies -2 mV/°C at constant current`);
  return L.join("\n") + "\n";
}
