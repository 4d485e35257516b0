/**
 * Independent checks of coded decoders, written apart from src/core/logic:
 * - `decoderLights` reads a matrix as a circuit (gates from the diodes that
 *   end on stage lines, everything else OR diodes) and relaxes it to a
 *   fixpoint for one code;
 * - `bruteForceTwoLevel` finds the fewest diodes, then gates, of a two-level
 *   decoder by trying every set of AND gates (every product of two or more
 *   literals written out from the codes, prime or not) within the budget
 *   left, each output then covered as cheaply as possible by a subset DP.
 */
import type { DiodeMatrix } from "../../src/core/matrix/matrix.ts";

/** The outputs a decoder lights for `code` (highest stage leftmost), tied-on ones included. */
export function decoderLights(m: Pick<DiodeMatrix, "lines" | "diodes" | "outputs" | "tiedOn">, code: string): Set<string> {
  const lineHigh = (name: string): boolean | undefined => {
    const match = /^(n?)Q(\d+)$/.exec(name);
    if (!match) return undefined;
    const bit = code[code.length - 1 - Number(match[2])] === "1";
    return match[1] === "" ? bit : !bit;
  };
  const lines = new Set(m.lines);
  const inputs = new Map<string, string[]>();
  const orDiodes: { from: string; to: string }[] = [];
  for (const d of m.diodes) {
    if (lines.has(d.to)) inputs.set(d.from, [...(inputs.get(d.from) ?? []), d.to]);
    else orDiodes.push(d);
  }
  const high = new Set<string>();
  for (const l of m.lines) if (lineHigh(l)) high.add(l);
  for (const [gate, ins] of inputs) if (ins.every((i) => lineHigh(i) === true)) high.add(gate);
  let changed = true;
  while (changed) {
    changed = false;
    for (const d of orDiodes) {
      if (high.has(d.from) && !high.has(d.to)) {
        high.add(d.to);
        changed = true;
      }
    }
  }
  return new Set([...m.outputs.filter((o) => high.has(o)), ...m.tiedOn]);
}

export interface BruteMinimum {
  readonly diodes: number;
  readonly gates: number;
}

/**
 * The two-level minimum by exhaustion, for tiny problems (up to 3 stages).
 *
 * @param codes each used state's code
 * @param lit `lit[k][j]`: state k lights output j; every output is lit in some state and dark in another
 */
export function bruteForceTwoLevel(codes: readonly string[], lit: readonly (readonly boolean[])[]): BruteMinimum {
  const n = codes[0]?.length ?? 0;
  const outputs = lit[0]?.length ?? 0;
  // Every product of literals: per stage 0 (absent), 1 (Q) or 2 (nQ).
  const products: { literals: number; states: number }[] = [];
  for (let p = 1; p < 3 ** n; p++) {
    let literals = 0;
    let states = 0;
    codes.forEach((code, k) => {
      let x = p;
      let ok = true;
      for (let i = 0; i < n; i++) {
        const digit = x % 3;
        x = Math.floor(x / 3);
        const bit = code[n - 1 - i] === "1";
        if ((digit === 1 && !bit) || (digit === 2 && bit)) ok = false;
      }
      if (ok) states |= 1 << k;
    });
    let x = p;
    for (let i = 0; i < n; i++) {
      if (x % 3 !== 0) literals++;
      x = Math.floor(x / 3);
    }
    products.push({ literals, states });
  }
  const onOf = (j: number): number => lit.reduce((a, row, k) => (row[j] ? a | (1 << k) : a), 0);
  const on = Array.from({ length: outputs }, (_, j) => onOf(j));
  const off = on.map((s) => ((1 << codes.length) - 1) & ~s);
  const fits = (states: number, j: number): boolean => (states & off[j]!) === 0 && (states & on[j]!) !== 0;
  const singles = products.filter((p) => p.literals === 1);
  const gates = products.filter((p) => p.literals >= 2 && on.some((_, j) => fits(p.states, j)));

  // Fewest terms covering output j's on-set from the given products (DP over covered subsets).
  const minTerms = (j: number, usable: readonly { states: number }[]): number => {
    const target = on[j]!;
    const terms = usable.filter((p) => fits(p.states, j)).map((p) => p.states & target);
    const best = new Map<number, number>([[0, 0]]);
    let frontier = [0];
    for (let size = 1; frontier.length > 0; size++) {
      const next: number[] = [];
      for (const covered of frontier) {
        for (const t of terms) {
          const c = covered | t;
          if (best.has(c)) continue;
          best.set(c, size);
          if (c === target) return size;
          next.push(c);
        }
      }
      frontier = next;
    }
    return Infinity;
  };

  // A first upper bound: every lit state decoded on its own, by its smallest product, one OR diode per lit cell.
  let upper = 0;
  codes.forEach((_, k) => {
    const cells = lit[k]!.filter(Boolean).length;
    if (cells === 0) return;
    const own = products.filter((p) => p.states === 1 << k).sort((a, b) => a.literals - b.literals)[0]!;
    upper += (own.literals >= 2 ? own.literals : 0) + cells;
  });
  let best: BruteMinimum = { diodes: upper, gates: Infinity };
  const floor = on.reduce((a, _, j) => a + minTerms(j, [...singles, ...gates]), 0);
  const chosen: { literals: number; states: number }[] = [];
  const visit = (from: number, gateDiodes: number): void => {
    if (gateDiodes + floor > best.diodes) return;
    let orDiodes = 0;
    for (let j = 0; j < outputs; j++) orDiodes += minTerms(j, [...singles, ...chosen]);
    const total = { diodes: gateDiodes + orDiodes, gates: chosen.length };
    if (total.diodes < best.diodes || (total.diodes === best.diodes && total.gates < best.gates)) best = total;
    for (let g = from; g < gates.length; g++) {
      chosen.push(gates[g]!);
      visit(g + 1, gateDiodes + gates[g]!.literals);
      chosen.pop();
    }
  };
  visit(0, 0);
  return best;
}
