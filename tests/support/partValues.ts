/**
 * Reads each paper's resistor values back by designator, so that a test can
 * check that every paper gives one designator one value: the parts list of
 * `synth`, the BOM (CSV), a SPICE deck, and the budget JSON.
 */
import { parseCsv } from "./csvRead.ts";

/** Expands "D1-D3, D5" back into designators. */
export function expandRefs(ranges: string): string[] {
  if (ranges === "") return [];
  return ranges.split(", ").flatMap((part) => {
    const [a, b] = part.split("-");
    if (b === undefined) return [a!];
    const [, prefix, lo] = /^([A-Z]+)(\d+)$/.exec(a!)!;
    const hi = Number(/^[A-Z]+(\d+)$/.exec(b)![1]);
    return Array.from({ length: hi - Number(lo) + 1 }, (_, i) => `${prefix}${Number(lo) + i}`);
  });
}

/** Value of every designator in the parts list `synth` prints ("     7  10k                    R1-R7"). */
export function synthPartValues(report: string): Map<string, string> {
  const lines = report.split("\n");
  const start = lines.indexOf("Parts");
  if (start < 0) throw new Error("no Parts section in the synth report");
  const out = new Map<string, string>();
  for (const line of lines.slice(start + 1)) {
    const m = /^ {2}\s*(\d+) {2}(.{22}) (\S.*)$/.exec(line);
    if (!m) break;
    for (const ref of expandRefs(m[3]!)) out.set(ref, m[2]!.trim());
  }
  return out;
}

/** Value of every designator on a BOM. */
export function bomValues(csv: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const [, refs, value] of parseCsv(csv).slice(1)) for (const ref of expandRefs(refs ?? "")) out.set(ref, value ?? "");
  return out;
}

/** Ohms of every resistor element of a SPICE deck, by name ("R1 e1a 0 10000"). */
export function deckResistors(deck: string): Map<string, number> {
  return new Map([...deck.matchAll(/^(R\d+) \S+ \S+ (\S+)$/gm)].map((m) => [m[1] as string, Number(m[2])]));
}

/** The current-setting resistor (emitter or series) of every driver in a budget JSON, by designator. */
export function budgetEmitters(json: { drivers: Record<string, { currentResistor: { ref: string; ohms: number } }> }): Map<string, number> {
  return new Map(Object.values(json.drivers).map((d) => [d.currentResistor.ref, d.currentResistor.ohms]));
}
