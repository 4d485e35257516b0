/**
 * The independent verifier: proves a matrix against its decode spec.
 *
 * It trusts nothing the synthesizer says. With one counter line high and the
 * rest low, current flows only anode to cathode, so the lines a state lights
 * are exactly those reachable from it along diodes. The verifier walks that
 * graph from every state and checks: exactly the intended outputs are
 * reached, the graph has no cycle, no path is longer than the depth limit,
 * and the depth policy holds.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DiodeMatrix, VerifiedMatrix } from "./matrix.ts";
import type { DepthPolicy } from "../project/project.ts";
import { fail, ok, type Result } from "../result/result.ts";
import { depthFindings, diodeOrder } from "./diodePaths.ts";
import { verifyLogic } from "../logic/verifyLogic.ts";
import { verifyPolarity } from "./verifyPolarity.ts";

export interface VerifyLimits {
  readonly depthLimit: number;
  readonly policy: DepthPolicy;
}

/**
 * Verifies a matrix. On failure the error lists every violation found (up
 * to 50), each a sentence naming the states, lines or diodes involved. A
 * coded counter's decoder goes to the logic verifier (logic/verifyLogic.ts),
 * which simulates its gates for every used code.
 */
export function verifyMatrix(spec: DecodeSpec, m: DiodeMatrix, limits: VerifyLimits): Result<VerifiedMatrix, string[]> {
  if (spec.counter.kind !== "one-hot") return verifyLogic(spec, m, limits);
  // Dark-decoded outputs, or a counter with active-low lines: both directions are walked.
  if (spec.polarity.decode !== "lit" || spec.polarity.inverting || m.decode !== undefined || m.inputNetwork !== undefined)
    return verifyPolarity(spec, m, limits);
  const errors: string[] = [];
  const states = new Set(spec.states);
  const outputs = new Set(spec.outputs);
  const buses = new Set(m.buses);
  const say = (msg: string): void => {
    if (errors.length < 50) errors.push(msg);
  };

  if (m.states.join() !== spec.states.join()) say("the matrix's state lines differ from the spec's");
  if (m.lines.join() !== spec.lines.join()) say("the matrix's counter lines differ from the lines the counter offers");
  if (m.gates.length > 0) say(`a one-hot counter's matrix has no gates, but this one has ${m.gates.length}`);
  if (m.codes.length > 0) say("a one-hot counter's states have no codes");
  if (m.outputs.join() !== spec.outputs.join()) say("the matrix's output lines differ from the spec's");
  if ([...m.tiedOn].sort().join() !== [...spec.tiedOn].sort().join()) say("the tied-on outputs differ from the spec's");
  for (const b of m.buses) if (states.has(b) || outputs.has(b)) say(`bus ${b} reuses the name of a line`);
  if (m.count !== m.diodes.length) say(`count ${m.count} differs from the ${m.diodes.length} diodes listed`);

  const out = new Map<string, string[]>();
  const indeg = new Map<string, number>();
  const seen = new Set<string>();
  const refs = new Set<string>();
  for (const d of m.diodes) {
    if (refs.has(d.ref)) say(`reference ${d.ref} is used twice`);
    refs.add(d.ref);
    const known = (n: string): boolean => states.has(n) || outputs.has(n) || buses.has(n);
    if (!known(d.from)) say(`${d.ref} starts at unknown line ${d.from}`);
    if (!known(d.to)) say(`${d.ref} ends at unknown line ${d.to}`);
    if (states.has(d.to)) say(`${d.ref} drives counter line ${d.to}`);
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

  // An order in which every diode runs forward; a leftover node means a loop.
  const nodes = [...spec.states, ...m.buses, ...spec.outputs];
  const ordered = diodeOrder(nodes, out, indeg);
  if (!ordered.ok) return fail([ordered.error]);
  const order = ordered.value;

  const depth = depthFindings(spec.states, order, out, spec.outputs, limits);
  depth.findings.forEach(say);

  // Exactness: per state, the reachable outputs equal the lit ones.
  spec.states.forEach((s, k) => {
    const reached = new Set<string>();
    const stack = [s];
    while (stack.length > 0) {
      const n = stack.pop() as string;
      for (const t of out.get(n) ?? []) {
        if (!reached.has(t)) {
          reached.add(t);
          stack.push(t);
        }
      }
    }
    const row = spec.lit[k] ?? [];
    const missing = spec.outputs.filter((o, j) => row[j] && !reached.has(o));
    const extra = spec.outputs.filter((o, j) => !row[j] && reached.has(o));
    if (missing.length > 0) say(`state ${s} ("${spec.texts[k]}") does not light ${missing.join(", ")}`);
    if (extra.length > 0) say(`state ${s} ("${spec.texts[k]}") also lights ${extra.join(", ")} through a sneak path`);
  });

  if (m.longestPath !== depth.longest) say(`longestPath ${m.longestPath} differs from the longest path ${depth.longest}`);
  if (m.lowerBound !== null && m.lowerBound > m.count) say(`lower bound ${m.lowerBound} exceeds the count ${m.count}`);
  if (m.optimal && m.lowerBound !== m.count) say("marked optimal but the lower bound does not equal the count");
  return errors.length > 0 ? fail(errors) : ok({ ...m, verified: true as const });
}
