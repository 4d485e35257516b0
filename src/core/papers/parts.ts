/**
 * The parts count of a decoded display: what a builder must buy and fit,
 * one group per distinct part, read off the designators (so the count, the
 * circuit, the BOM and the decks name and value every part alike). Values
 * stay SI here; the BOM and the reports print them.
 */
import type { Designators, DriverParts, PartResistorRole } from "../matrix/designators.ts";

export type PartKind =
  | "diode"
  | "level-shift-diode"
  | "transistor"
  | "emitter-resistor"
  | "series-resistor"
  | "base-resistor"
  | "base-emitter-resistor"
  | "pull-down"
  | "line-pull-up"
  | "tie-on-resistor"
  | "gate-pull-up"
  | "dark-pull-up"
  | "divider-resistor"
  | "display";

export interface PartGroup {
  readonly kind: PartKind;
  /** Designators, in order (`D1`, `D2`, ...). */
  readonly refs: readonly string[];
  /** The lines the parts serve, parallel to refs (the diode's driven line, a gate pull-up's gate, else the output). */
  readonly serves: readonly string[];
  /** Resistance of every part in the group, ohms; null for parts other than resistors. */
  readonly ohms: number | null;
}

/**
 * Groups the parts: matrix diodes; the dark-decoded outputs' level-shift
 * diodes; drivers (none for direct drive); then the resistors role by
 * role, one group per value, lowest first: emitter, series, base,
 * base-emitter, pull-downs (a high-side switch's line pull-ups), tie-on, a coded counter's gate pull-ups, the
 * dark-decoded outputs' pull-ups and dividers; then the segments. Every
 * driven or tied-on output has the parts of its driver kind, a pull-down on
 * its line and a segment; a tied-on output also a tie-on resistor.
 *
 * @example
 * countParts(designators(spec, matrix, project.electrical)).map((g) => g.kind);
 * // ["diode", "transistor", "series-resistor", "base-resistor", "base-emitter-resistor", "pull-down", "display"]
 */
export function countParts(parts: Designators): PartGroup[] {
  const groups: PartGroup[] = [];
  const drivers = parts.drivers;
  if (parts.diodes.length > 0) {
    groups.push({ kind: "diode", refs: parts.diodes.map((d) => d.ref), serves: parts.diodes.map((d) => d.to), ohms: null });
  }
  const shift = parts.darkInputs.flatMap((p) => p.shiftDiodes.map((ref) => ({ ref, output: p.output })));
  if (shift.length > 0) {
    groups.push({ kind: "level-shift-diode", refs: shift.map((x) => x.ref), serves: shift.map((x) => x.output), ohms: null });
  }
  const switched = drivers.filter((d) => d.transistor !== null);
  if (switched.length > 0) {
    groups.push({
      kind: "transistor",
      refs: switched.map((d) => d.transistor as string),
      serves: switched.map((d) => d.output),
      ohms: null,
    });
  }
  const resistors = (role: PartResistorRole, kind: PartKind): void => {
    const byValue = new Map<number, { refs: string[]; serves: string[] }>();
    for (const r of parts.resistors.filter((x) => x.role === role)) {
      const g = byValue.get(r.ohms) ?? { refs: [], serves: [] };
      g.refs.push(r.ref);
      g.serves.push(r.output);
      byValue.set(r.ohms, g);
    }
    for (const [ohms, g] of [...byValue].sort((a, b) => a[0] - b[0])) groups.push({ kind, refs: g.refs, serves: g.serves, ohms });
  };
  resistors("emitter", "emitter-resistor");
  resistors("series", "series-resistor");
  resistors("base", "base-resistor");
  resistors("base-emitter", "base-emitter-resistor");
  resistors("pull-down", "pull-down");
  resistors("line-pull-up", "line-pull-up");
  resistors("tie-on", "tie-on-resistor");
  resistors("gate-pull-up", "gate-pull-up");
  resistors("pull-up", "dark-pull-up");
  resistors("divider", "divider-resistor");
  if (drivers.length > 0) {
    groups.push({ kind: "display", refs: drivers.map((d: DriverParts) => d.display), serves: drivers.map((d) => d.output), ohms: null });
  }
  return groups;
}

/** Compresses designators into ranges: D1, D2, D3, D5 -> "D1-D3, D5". */
export function refRanges(refs: readonly string[]): string {
  const parts: string[] = [];
  let i = 0;
  while (i < refs.length) {
    const m = /^(\d*[A-Z]+)(\d+)$/.exec(refs[i] as string);
    let j = i;
    if (m) {
      while (j + 1 < refs.length) {
        const n = /^(\d*[A-Z]+)(\d+)$/.exec(refs[j + 1] as string);
        if (!n || n[1] !== m[1] || Number(n[2]) !== Number(m[2]) + (j + 1 - i)) break;
        j++;
      }
    }
    parts.push(j > i ? `${refs[i]}-${refs[j]}` : (refs[i] as string));
    i = j + 1;
  }
  return parts.join(", ");
}
