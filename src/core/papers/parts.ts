/**
 * The parts count of a decoded display: what a builder must buy and fit.
 *
 * One group per distinct part, with its designators. The BOM export adds
 * trimmed resistor values when a budget has been worked out.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import type { Project } from "../project/project.ts";

export type PartKind = "diode" | "transistor" | "emitter-resistor" | "pull-down" | "tie-on-resistor" | "display";

export interface PartGroup {
  readonly kind: PartKind;
  /** Designators, in order (`D1`, `D2`, ...). */
  readonly refs: readonly string[];
  /** Value as printed on a BOM, e.g. `10k`. */
  readonly value: string;
  readonly description: string;
  /** The lines the parts serve, parallel to refs where it applies (output names). */
  readonly serves: readonly string[];
}

/** Formats a resistance in ohms the way a BOM prints it: 470, 4k7 -> "4.7k", 10k, 1M. */
export function formatOhms(ohms: number): string {
  const fmt = (x: number): string => String(Number(x.toPrecision(3)));
  if (ohms >= 1e6) return `${fmt(ohms / 1e6)}M`;
  if (ohms >= 1e3) return `${fmt(ohms / 1e3)}k`;
  return fmt(ohms);
}

/** Formats a current in amperes as milliamperes without binary noise: 0.00014 -> "0.14". */
export function formatMilliamps(amperes: number): string {
  return String(Number((amperes * 1000).toPrecision(6)));
}

/**
 * Counts the parts. Every driven or tied-on output has an NPN driver with an
 * emitter resistor, a display string and a pull-down on its base;
 * a tied-on output's base is held up by a resistor equal to a counter line's
 * source resistance, so it sits where a lit segment sits.
 *
 * @param emitterOhms optional per-output emitter resistor values (a trim)
 */
export function countParts(
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  emitterOhms?: ReadonlyMap<string, number>,
): PartGroup[] {
  const e = project.electrical;
  const driven = [...matrix.outputs, ...matrix.tiedOn];
  const ordered = spec.allOutputs.filter((o) => driven.includes(o));
  const groups: PartGroup[] = [];
  if (matrix.diodes.length > 0) {
    groups.push({
      kind: "diode",
      refs: matrix.diodes.map((d) => d.ref),
      value: "small-signal silicon",
      description: `matrix diode, ≥${e.diode.maxReverseV} V reverse, ≥${formatMilliamps(e.diode.maxForwardA)} mA forward`,
      serves: matrix.diodes.map((d) => d.to),
    });
  }
  const q = ordered.map((_, i) => `Q${i + 1}`);
  if (q.length > 0) {
    groups.push({
      kind: "transistor",
      refs: q,
      value: "NPN",
      description: `segment driver, Vce(max) ≥ ${e.driver.maxVceV} V, ≥ ${e.driver.maxPowerW} W`,
      serves: ordered,
    });
  }
  // Emitter resistors: one group per distinct value.
  const valueOf = (o: string): number => emitterOhms?.get(o) ?? e.driver.emitterResistors[o] ?? e.driver.emitterResistor;
  const byValue = new Map<number, string[]>();
  ordered.forEach((o) => byValue.set(valueOf(o), [...(byValue.get(valueOf(o)) ?? []), o]));
  let r = 0;
  const rOf = new Map<string, string>();
  for (const o of ordered) rOf.set(o, `R${++r}`);
  for (const [ohms, outs] of [...byValue].sort((a, b) => a[0] - b[0])) {
    groups.push({
      kind: "emitter-resistor",
      refs: outs.map((o) => rOf.get(o) as string),
      value: formatOhms(ohms),
      description: `emitter resistor, ${project.electrical.tolerance.resistorPct} %`,
      serves: outs,
    });
  }
  // Designators: pull-downs of driven outputs, then tie-on resistors, then the
  // pull-downs of tied-on outputs (the circuit builder numbers them alike).
  const pullDownRefs = matrix.outputs.map(() => `R${++r}`);
  const tieRefs = matrix.tiedOn.map(() => `R${++r}`);
  const tiedPullDownRefs = matrix.tiedOn.map(() => `R${++r}`);
  if (ordered.length > 0) {
    groups.push({
      kind: "pull-down",
      refs: [...pullDownRefs, ...tiedPullDownRefs],
      value: formatOhms(e.pullDown),
      description: "driver base pull-down",
      serves: [...matrix.outputs, ...matrix.tiedOn],
    });
  }
  if (matrix.tiedOn.length > 0) {
    groups.push({
      kind: "tie-on-resistor",
      refs: tieRefs,
      value: formatOhms(e.counterOutput.resistance),
      description: "base bias for an always-lit segment, from the counter's high level",
      serves: matrix.tiedOn,
    });
  }
  if (ordered.length > 0) {
    groups.push({
      kind: "display",
      refs: ordered.map((_, i) => `DS${i + 1}`),
      value: `${e.string.dies}-die string`,
      description: `segment LED string, ${e.string.dies} dies in series, ${formatMilliamps(e.string.targetA)} mA`,
      serves: ordered,
    });
  }
  return groups;
}

/** Compresses designators into ranges: D1, D2, D3, D5 -> "D1-D3, D5". */
export function refRanges(refs: readonly string[]): string {
  const parts: string[] = [];
  let i = 0;
  while (i < refs.length) {
    const m = /^([A-Z]+)(\d+)$/.exec(refs[i] as string);
    let j = i;
    if (m) {
      while (j + 1 < refs.length) {
        const n = /^([A-Z]+)(\d+)$/.exec(refs[j + 1] as string);
        if (!n || n[1] !== m[1] || Number(n[2]) !== Number(m[2]) + (j + 1 - i)) break;
        j++;
      }
    }
    parts.push(j > i ? `${refs[i]}-${refs[j]}` : (refs[i] as string));
    i = j + 1;
  }
  return parts.join(", ");
}
