/**
 * The independent verifier of a decoder with dark-decoded outputs.
 *
 * With the counter in state k, `S<k>` is the one high active-high line and
 * `nS<k>` the one low active-low line. Current from `S<k>` flows anode to
 * cathode, so the nodes it raises are those reached from it along the
 * diodes' `from -> to`; a low `nS<k>` pulls down, cathode to anode, the
 * nodes reached from it the same way (a matrix always names a diode from its
 * driving end). The verifier walks both from every state and checks:
 * a lit-decoded output is raised exactly in the states that light it, a
 * dark-decoded one pulled down exactly in the states that leave it dark
 * (with a high-side switch, on while its node is low, a lit-decoded output
 * is pulled down exactly in the states that light it: `outputSide`),
 * neither side reaches the other's outputs, no diode joins the two sides,
 * the graph has no loop, every path keeps the depth limit and policy, and
 * the input networks and the bound agree with the decode.
 */
import { outputSide, type DecodeSpec, type LineSide, type OutputPolarity } from "../spec/decodeSpec.ts";
import type { DiodeMatrix, VerifiedMatrix } from "./matrix.ts";
import { matrixObjective } from "./matrix.ts";
import { fail, ok, type Result } from "../result/result.ts";
import { depthFindings, diodeOrder } from "./diodePaths.ts";
import type { VerifyLimits } from "./verify.ts";

/**
 * Verifies a one-hot counter's decoder whose outputs may be decoded lit or
 * dark. On failure the error lists every violation found (up to 50).
 */
export function verifyPolarity(spec: DecodeSpec, m: DiodeMatrix, limits: VerifyLimits): Result<VerifiedMatrix, string[]> {
  const errors: string[] = [];
  const say = (msg: string): void => {
    if (errors.length < 50) errors.push(msg);
  };
  const high = new Set(spec.polarity.activeHigh);
  const low = new Set(spec.polarity.activeLow);
  const outputs = new Set(spec.outputs);
  const buses = new Set(m.buses);

  if (m.states.join() !== spec.states.join()) say("the matrix's states differ from the spec's");
  if (m.lines.join() !== spec.lines.join()) say("the matrix's counter lines differ from the lines the counter offers");
  if (m.gates.length > 0 || m.codes.length > 0) say("a one-hot counter's decoder has no gates and no codes");
  if (m.outputs.join() !== spec.outputs.join()) say("the matrix's output lines differ from the spec's");
  if ([...m.tiedOn].sort().join() !== [...spec.tiedOn].sort().join()) say("the tied-on outputs differ from the spec's");
  if (m.count !== m.diodes.length) say(`count ${m.count} differs from the ${m.diodes.length} diodes listed`);
  for (const b of m.buses) if (high.has(b) || low.has(b) || outputs.has(b)) say(`bus ${b} reuses the name of a line`);

  // Each output's polarity, and whether the spec allows it.
  const decodeOf = new Map<string, OutputPolarity>();
  spec.outputs.forEach((o, j) => {
    const d = m.decode?.[o] ?? "lit";
    decodeOf.set(o, d);
    if (!(spec.polarity.allowed[j] ?? []).includes(d))
      say(`output ${o} is decoded ${d}, which "decode": "${spec.polarity.decode}" does not allow`);
  });
  for (const o of Object.keys(m.decode ?? {})) if (!outputs.has(o)) say(`the decode names ${o}, which is not a driven output`);

  const out = new Map<string, string[]>();
  const indeg = new Map<string, number>();
  const seen = new Set<string>();
  const refs = new Set<string>();
  const known = (x: string): boolean => high.has(x) || low.has(x) || outputs.has(x) || buses.has(x);
  for (const d of m.diodes) {
    if (refs.has(d.ref)) say(`reference ${d.ref} is used twice`);
    refs.add(d.ref);
    if (!known(d.from)) say(`${d.ref} starts at unknown line ${d.from}`);
    if (!known(d.to)) say(`${d.ref} ends at unknown line ${d.to}`);
    if (high.has(d.to) || low.has(d.to)) say(`${d.ref} drives counter line ${d.to}`);
    if (d.from === d.to) say(`${d.ref} joins ${d.from} to itself`);
    const key = `${d.from}>${d.to}`;
    if (seen.has(key)) say(`${d.ref} duplicates another diode from ${d.from} to ${d.to}`);
    seen.add(key);
    out.set(d.from, [...(out.get(d.from) ?? []), d.to]);
    indeg.set(d.to, (indeg.get(d.to) ?? 0) + 1);
  }
  for (const b of m.buses) {
    if (!indeg.get(b)) say(`bus ${b} is driven by no diode`);
    if (!out.get(b)?.length) say(`bus ${b} drives nothing`);
  }
  for (const t of spec.tiedOn) if (indeg.get(t) || out.get(t)?.length) say(`tied-on output ${t} has diodes`);
  if (errors.length > 0) return fail(errors);

  // Sides: a line's by its level, an output's by its decode and the driver, a bus's from its neighbours.
  const inverting = spec.polarity.inverting;
  const sideOf = (o: string): LineSide => outputSide(decodeOf.get(o) ?? "lit", inverting);
  // Named as the decode names them where the driver is on while its node is high, else by the lines.
  const sideWord = (x: LineSide): string => (inverting ? (x === "high" ? "active-high" : "active-low") : x === "high" ? "lit" : "dark");
  const side = new Map<string, LineSide>();
  for (const l of high) side.set(l, "high");
  for (const l of low) side.set(l, "low");
  for (const o of decodeOf.keys()) side.set(o, sideOf(o));
  for (let round = 0; round <= m.buses.length; round++) {
    let changed = false;
    for (const d of m.diodes) {
      const a = side.get(d.from);
      const b = side.get(d.to);
      if (a !== undefined && b === undefined && buses.has(d.to)) side.set(d.to, a);
      else if (b !== undefined && a === undefined && buses.has(d.from)) side.set(d.from, b);
      else continue;
      changed = true;
    }
    if (!changed) break;
  }
  for (const d of m.diodes) {
    const a = side.get(d.from);
    const b = side.get(d.to);
    if (a !== undefined && b !== undefined && a !== b)
      say(
        `${d.ref} joins the ${sideWord(a)} side (${d.from}) to the ${sideWord(b)} side (${d.to}); the two sides share no diode, bus or link`,
      );
  }

  // An order in which every diode runs forward; a leftover node means a loop.
  const nodes = [...spec.lines, ...m.buses, ...spec.outputs];
  const ordered = diodeOrder(nodes, out, indeg);
  if (!ordered.ok) return fail([ordered.error]);
  const order = ordered.value;

  const depth = depthFindings(spec.lines, order, out, spec.outputs, limits);
  depth.findings.forEach(say);

  // Exactness, both directions.
  const reach = (from: string): Set<string> => {
    const reached = new Set<string>();
    const stack = [from];
    while (stack.length > 0) {
      const x = stack.pop() as string;
      for (const t of out.get(x) ?? []) {
        if (!reached.has(t)) {
          reached.add(t);
          stack.push(t);
        }
      }
    }
    return reached;
  };
  const polarity = (o: string): OutputPolarity => decodeOf.get(o) ?? "lit";
  /** True when output j of state row `row` has a cell of the output's polarity (the cells its diodes decode). */
  const decoded = (row: readonly boolean[], o: string, j: number): boolean => (polarity(o) === "lit" ? row[j] === true : row[j] !== true);
  const across = (r: ReadonlySet<string>, x: LineSide): string[] => spec.outputs.filter((o) => sideOf(o) !== x && r.has(o));
  spec.states.forEach((s, k) => {
    const row = spec.lit[k] ?? [];
    const text = spec.texts[k];
    const hi = spec.polarity.activeHigh[k];
    if (hi !== undefined) {
      const r = reach(hi);
      const mine = spec.outputs.map((o, j) => [o, j] as const).filter(([o]) => sideOf(o) === "high");
      const missing = mine.filter(([o, j]) => decoded(row, o, j) && !r.has(o)).map(([o]) => o);
      const extra = mine.filter(([o, j]) => !decoded(row, o, j) && r.has(o)).map(([o]) => o);
      const other = across(r, "high");
      if (missing.length > 0) say(`state ${s} ("${text}") does not raise ${missing.join(", ")} from ${hi}`);
      if (extra.length > 0) say(`state ${s} ("${text}") also raises ${extra.join(", ")} from ${hi} through a sneak path`);
      if (other.length > 0) say(`${hi} reaches the ${inverting ? "active-low side's" : "dark-decoded"} ${other.join(", ")}`);
    }
    const lo = spec.polarity.activeLow[k];
    if (lo !== undefined) {
      const r = reach(lo);
      const mine = spec.outputs.map((o, j) => [o, j] as const).filter(([o]) => sideOf(o) === "low");
      const missing = mine.filter(([o, j]) => decoded(row, o, j) && !r.has(o)).map(([o]) => o);
      const extra = mine.filter(([o, j]) => !decoded(row, o, j) && r.has(o)).map(([o]) => o);
      const other = across(r, "low");
      // Pulled down, a non-inverting driver's output is dark and a high-side switch's lit.
      const [pulled, left] = inverting ? ["light", "stay dark"] : ["stay dark", "light"];
      if (missing.length > 0) say(`state ${s} ("${text}") does not pull ${missing.join(", ")} down to ${lo}, so they would ${left}`);
      if (extra.length > 0)
        say(`state ${s} ("${text}") also pulls ${extra.join(", ")} down to ${lo} through a sneak path, so they would ${pulled}`);
      if (other.length > 0) say(`${lo} reaches the ${inverting ? "active-high side's" : "lit-decoded"} ${other.join(", ")}`);
    }
  });

  // The input networks follow the decode (a high-side switch's node has none: its own resistors pull it up).
  const dark = inverting ? 0 : spec.outputs.filter((o) => polarity(o) === "dark").length;
  const net = m.inputNetwork;
  if (dark > 0) {
    const per = spec.polarity.inputDiodes;
    if (per === null) say("no number of level-shift diodes keeps a pulled-down output dark, yet outputs are decoded dark");
    if (net === undefined) say(`${dark} outputs are decoded dark but the matrix lists no input network`);
    else {
      if (net.kind !== spec.polarity.darkInput) say(`the input network is ${net.kind}, the project asks for ${spec.polarity.darkInput}`);
      if (net.outputs !== dark) say(`the input network serves ${net.outputs} outputs, ${dark} are decoded dark`);
      if (per !== null && net.diodes !== per * dark)
        say(`the input network has ${net.diodes} diodes, ${dark} dark outputs need ${per * dark}`);
      if (net.resistors !== spec.polarity.inputResistors * dark)
        say(`the input network has ${net.resistors} resistors, ${dark} dark outputs need ${spec.polarity.inputResistors * dark}`);
    }
  } else if (net !== undefined && (net.diodes > 0 || net.resistors > 0 || net.outputs > 0))
    say("no output is decoded dark, yet the matrix lists an input network");

  if (m.longestPath !== depth.longest) say(`longestPath ${m.longestPath} differs from the longest path ${depth.longest}`);
  const objective = matrixObjective(m);
  if (m.lowerBound !== null && m.lowerBound > objective) say(`lower bound ${m.lowerBound} exceeds the diodes counted, ${objective}`);
  if (m.optimal && m.lowerBound !== objective) say("marked optimal but the lower bound does not equal the diodes counted");
  return errors.length > 0 ? fail(errors) : ok({ ...m, verified: true as const });
}
