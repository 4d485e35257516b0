import { solveBudget, type Budget } from "../../core/budget/budget.ts";
import type { DecodeSpec } from "../../core/spec/decodeSpec.ts";
import type { ESeriesName } from "../../core/budget/eSeries.ts";
import type { VerifiedMatrix } from "../../core/matrix/matrix.ts";
import { formatOhms } from "../../core/papers/parts.ts";
import type { Project } from "../../core/project/project.ts";
import type { Command } from "../command.ts";
import { EXIT } from "../io.ts";
import { loadAndSynthesize, SYNTH_OPTIONS, SYNTH_USAGE } from "../synthOptions.ts";

const USAGE = `budget FILE [--json] [--series E24|E96] ${SYNTH_USAGE}`;

export const budgetCommand: Command = {
  name: "budget",
  usage: USAGE,
  options: {
    json: { help: "print the budget as diodeloom/budget@1 JSON (SI units)" },
    series: { value: true, meta: "E24|E96", help: "preferred values for the emitter-resistor trim (default E24)" },
    ...SYNTH_OPTIONS,
  },
  async run(args, io) {
    const series = args.values.get("series") ?? "E24";
    if (series !== "E24" && series !== "E96") {
      io.err(`--series must be E24 or E96 (got "${series}")\n`);
      return EXIT.input;
    }
    const done = await loadAndSynthesize(args, io, USAGE);
    if (typeof done === "number") return done;
    const { project, spec, matrix } = done;
    const budget = solveBudget(project, spec, matrix, { series: series as ESeriesName });
    if (!budget.ok) {
      io.err(`${budget.error.message}\n`);
      return EXIT.input;
    }
    if (args.flags.has("json")) io.out(JSON.stringify(budget.value, null, 2) + "\n");
    else io.out(describeBudget(project, spec, matrix, budget.value));
    return EXIT.ok;
  },
};

const uA = (a: number): string => (a * 1e6).toFixed(1);
const mA = (a: number): string => (a * 1e3).toFixed(2);
const V = (v: number): string => v.toFixed(2);

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
      `strings of ${e.string.dies} dies, target ${uA(e.string.targetA)} µA; ${m.method} matrix, ${m.count} diodes, longest path ${m.longestPath}`,
  );
  L.push("");
  if (b.warnings.length > 0) {
    L.push("Warnings");
    for (const w of b.warnings) L.push(`  ${w.level.toUpperCase().padEnd(6)} ${w.code}: ${w.message}`);
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
        uA(s.sourceCurrent),
        mA(s.supplyCurrent),
        ...outs.map((o) => {
          const x = s.outputs[o];
          return x && x.lit ? uA(x.stringCurrent) : ".";
        }),
      ]),
    ),
  );
  L.push("");
  L.push(`Outputs (spread = how much dimmer the dimmest state is; trim: ${b.trim.series} emitter resistor and the range it gives)`);
  L.push(
    ...table(
      ["Output", "Depth", "Min µA", "Max µA", "Spread %", "Off max nA", "Re", "Trim", "Trimmed µA"],
      outs.map((o) => {
        const r = b.outputs[o] as Budget["outputs"][string];
        const t = b.trim.outputs[o];
        const dr = b.drivers[o];
        return [
          o,
          r.tiedOn ? "tied" : r.depths.join("+"),
          uA(r.min),
          uA(r.max),
          r.spreadPct.toFixed(1),
          (r.offMax * 1e9).toFixed(2),
          dr ? formatOhms(dr.emitterOhms) : "",
          t ? formatOhms(t.ohms) : "",
          t ? `${uA(t.min)}-${uA(t.max)}` : "",
        ];
      }),
    ),
  );
  L.push(`  Spread over all strings: ${b.spreadPct.toFixed(1)} %; after the trim ${b.trim.spreadPct.toFixed(1)} %`);
  L.push("");
  const diodes = Object.entries(b.diodes);
  if (diodes.length > 0) {
    const [fRef, f] = diodes.reduce((a, c) => (c[1].maxCurrent > a[1].maxCurrent ? c : a));
    const [rRef, r] = diodes.reduce((a, c) => (c[1].maxReverse > a[1].maxReverse ? c : a));
    L.push(`Diodes (${diodes.length}; every one in --json)`);
    L.push(`  largest forward current ${uA(f.maxCurrent)} µA in ${fRef} (${f.from} -> ${f.to}); rated ${mA(f.ratedCurrent)} mA`);
    L.push(`  largest reverse voltage ${V(r.maxReverse)} V across ${rRef} (${r.from} -> ${r.to}); rated ${V(r.ratedReverse)} V`);
    L.push("");
  }
  L.push("Counter lines (when active)");
  L.push(
    ...table(
      ["Line", "Sources µA", "Line V", "Sag V"],
      Object.entries(b.counterLines).map(([l, c]) => [l, uA(c.sourceCurrent), V(c.lineVoltage), V(c.sag)]),
    ),
  );
  L.push("");
  L.push(`Drivers (headroom = lowest collector-base voltage of a lit driver at the ${e.supply.minVolts} V supply)`);
  L.push(
    ...table(
      ["Output", "Q", "Re", "Vce max V", "P max mW", "Headroom V"],
      Object.entries(b.drivers).map(([o, d]) => [
        o,
        d.transistor,
        formatOhms(d.emitterOhms),
        V(d.maxVce),
        (d.maxPower * 1e3).toFixed(2),
        V(d.headroom),
      ]),
    ),
  );
  L.push("");
  L.push(`Supply: up to ${mA(b.supply.maxCurrent)} mA, ${(b.supply.maxPower * 1e3).toFixed(1)} mW at ${b.supply.volts} V`);
  L.push("");
  L.push(`Tolerance corners (trimmed design; ±${e.tolerance.resistorPct} % resistors, beta ${e.tolerance.betaMin}-${e.tolerance.betaMax})`);
  for (const c of [b.corners.low, b.corners.high]) {
    const k = c.conditions;
    L.push(
      `  ${k.name.padEnd(4)} ${k.supplyV} V, ${k.temperatureC} °C, beta ${k.betaF}: strings ${uA(c.minCurrent)}-${uA(c.maxCurrent)} µA, ` +
        `headroom ${V(c.minHeadroom)} V, driver up to ${(c.maxPower * 1e3).toFixed(2)} mW`,
    );
  }
  L.push(
    `  ${b.corners.meetsTarget ? "Meets" : "Misses"} the target: every corner within ±${b.corners.windowPct} % of ${uA(e.string.targetA)} µA, under the rating, no saturation`,
  );
  L.push(`  Temperature: VT = kT/q; silicon Is(T) as SPICE scales it (EG 1.11 eV, XTI 3); LED dies -2 mV/°C at constant current`);
  return L.join("\n") + "\n";
}
