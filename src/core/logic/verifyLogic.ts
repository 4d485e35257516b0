/**
 * The independent verifier of a coded counter's decoder. It trusts nothing
 * the minimiser says and shares none of its code: it reads the gates and
 * diodes, checks the structure, and simulates the logic for every code the
 * counter uses.
 *
 * The model (ideal diodes, docs/sources.md "Two-level diode logic"): a stage
 * line is high when its stage is (`Q<i>`) or is not (`nQ<i>`) set in the
 * code; a gate's node is high exactly when all its input lines are high (its
 * diodes pull it low otherwise); a bus or output is high exactly when a
 * diode into it comes from a high node, and current flows only anode to
 * cathode, so nothing else can raise it: this is the check for sneak paths.
 * Every used state must light exactly its outputs. The depth is the longest
 * run of OR diodes from a gate node or stage line to an output, checked
 * against the limit and the depth policy.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DiodeMatrix, VerifiedMatrix } from "../matrix/matrix.ts";
import type { DepthPolicy } from "../project/project.ts";
import { literalOf, stageBit } from "../spec/counterCode.ts";
import { fail, ok, type Result } from "../result/result.ts";

export interface LogicLimits {
  readonly depthLimit: number;
  readonly policy: DepthPolicy;
}

/**
 * Verifies a coded counter's decoder against its spec. On failure the error
 * lists the violations found (up to 50), each naming the codes, gates,
 * lines or diodes involved.
 *
 * @example
 * const v = verifyLogic(spec, matrix, { depthLimit: 2, policy: "per-segment" });
 * if (!v.ok) console.error(v.error.join("\n"));
 */
export function verifyLogic(spec: DecodeSpec, m: DiodeMatrix, limits: LogicLimits): Result<VerifiedMatrix, string[]> {
  const errors: string[] = [];
  const say = (msg: string): void => {
    if (errors.length < 50) errors.push(msg);
  };
  const same = (a: readonly string[], b: readonly string[]): boolean => a.length === b.length && a.every((x, i) => x === b[i]);
  if (!same(m.states, spec.states)) say("the matrix's states differ from the spec's");
  if (!same(m.codes, spec.counter.codes)) say("the matrix's codes differ from the counter's code table");
  if (!same(m.lines, spec.lines)) say("the matrix's stage lines differ from the counter's");
  if (!same(m.outputs, spec.outputs)) say("the matrix's output lines differ from the spec's");
  if (!same([...m.tiedOn].sort(), [...spec.tiedOn].sort())) say("the tied-on outputs differ from the spec's");
  if (m.count !== m.diodes.length) say(`count ${m.count} differs from the ${m.diodes.length} diodes listed`);
  if (errors.length > 0) return fail(errors);

  const lines = new Set(spec.lines);
  const outputs = new Set(spec.outputs);
  const gates = new Map(m.gates.map((g) => [g.ref, g]));
  const names = new Set<string>([...lines, ...outputs]);
  for (const g of m.gates) {
    if (names.has(g.ref)) say(`gate ${g.ref} reuses the name of a line or another gate`);
    names.add(g.ref);
    if (g.inputs.length < 2) say(`gate ${g.ref} has ${g.inputs.length} input(s); a gate ANDs two or more stage lines`);
    const stages = new Set<number>();
    for (const input of g.inputs) {
      const lit = literalOf(input);
      if (!lines.has(input) || lit === undefined) say(`gate ${g.ref} has unknown input ${input}`);
      else if (stages.has(lit.stage)) say(`gate ${g.ref} uses stage ${lit.stage} twice`);
      else stages.add(lit.stage);
    }
  }
  for (const b of m.buses) {
    if (names.has(b)) say(`bus ${b} reuses the name of a line or gate`);
    names.add(b);
  }

  // Diodes: AND inputs (gate -> its input line) and the OR plane (everything else).
  const orOut = new Map<string, string[]>();
  const orIn = new Map<string, string[]>();
  const andInputs = new Map<string, string[]>();
  const refs = new Set<string>();
  const pairs = new Set<string>();
  for (const d of m.diodes) {
    if (refs.has(d.ref)) say(`reference ${d.ref} is used twice`);
    refs.add(d.ref);
    const key = `${d.from}>${d.to}`;
    if (pairs.has(key)) say(`${d.ref} duplicates another diode from ${d.from} to ${d.to}`);
    pairs.add(key);
    if (!names.has(d.from)) say(`${d.ref} starts at unknown node ${d.from}`);
    if (!names.has(d.to)) say(`${d.ref} ends at unknown node ${d.to}`);
    if (d.from === d.to) say(`${d.ref} joins ${d.from} to itself`);
    if (gates.has(d.to)) say(`${d.ref} drives gate ${d.to}; a gate's node is raised only by its pull-up`);
    if (lines.has(d.to)) {
      const g = gates.get(d.from);
      if (!g || !g.inputs.includes(d.to)) say(`${d.ref} drives stage line ${d.to} from ${d.from}, which is not a gate with that input`);
      else andInputs.set(g.ref, [...(andInputs.get(g.ref) ?? []), d.to]);
      continue;
    }
    orOut.set(d.from, [...(orOut.get(d.from) ?? []), d.to]);
    orIn.set(d.to, [...(orIn.get(d.to) ?? []), d.from]);
  }
  for (const g of m.gates) {
    const wired = andInputs.get(g.ref) ?? [];
    if (!same([...wired].sort(), [...g.inputs].sort()))
      say(`gate ${g.ref} lists inputs ${g.inputs.join(", ")} but has diodes to ${wired.join(", ") || "none"}`);
    if (!orOut.get(g.ref)?.length) say(`gate ${g.ref} drives nothing`);
  }
  for (const b of m.buses) {
    if (!orIn.get(b)?.length) say(`bus ${b} is driven by nothing`);
    if (!orOut.get(b)?.length) say(`bus ${b} drives nothing`);
  }
  for (const t of spec.tiedOn) if (orIn.get(t)?.length || orOut.get(t)?.length) say(`tied-on output ${t} has diodes`);
  if (errors.length > 0) return fail(errors);

  // The OR plane in topological order (Kahn); a node left over is on a loop.
  const sources = [...m.gates.map((g) => g.ref), ...spec.lines];
  const nodes = [...sources, ...m.buses, ...spec.outputs];
  const remaining = new Map(nodes.map((n) => [n, orIn.get(n)?.length ?? 0]));
  const order: string[] = [];
  const queue = nodes.filter((n) => remaining.get(n) === 0);
  while (queue.length > 0) {
    const n = queue.shift() as string;
    order.push(n);
    for (const t of orOut.get(n) ?? []) {
      const r = (remaining.get(t) ?? 0) - 1;
      remaining.set(t, r);
      if (r === 0) queue.push(t);
    }
  }
  if (order.length !== nodes.length)
    return fail([`the OR diodes form a loop through ${nodes.filter((n) => (remaining.get(n) ?? 0) > 0).join(", ")}`]);

  // Depth: every path length, in OR diodes, from a gate node or stage line (bit L = a path of L diodes).
  const lengths = new Map<string, number>();
  for (const s of sources) lengths.set(s, 1);
  for (const n of order)
    for (const t of orOut.get(n) ?? []) lengths.set(t, (lengths.get(t) ?? 0) | (((lengths.get(n) ?? 0) << 1) & 0x7fffffff));
  const all = new Set<number>();
  for (const o of spec.outputs) {
    const bits = lengths.get(o) ?? 0;
    const ls = [...Array(31).keys()].filter((l) => l > 0 && bits & (1 << l));
    ls.forEach((l) => all.add(l));
    const longest = Math.max(0, ...ls);
    if (longest > limits.depthLimit) say(`output ${o} is reached through ${longest} OR diodes, over the limit of ${limits.depthLimit}`);
    if (limits.policy === "per-segment" && ls.length > 1)
      say(`output ${o} is reached through paths of ${ls.join(" and ")} diodes; the per-segment policy wants one length`);
  }
  if (limits.policy === "uniform" && all.size > 1)
    say(`paths have ${[...all].sort().join(", ")} diodes; the uniform policy wants one length`);
  const longest = Math.max(0, ...all);
  if (m.longestPath !== longest) say(`longestPath ${m.longestPath} differs from the longest path ${longest}`);

  // The logic, for every used code.
  spec.states.forEach((s, k) => {
    const high = simulate(m, spec.counter.codes[k] as string, order, orIn);
    const row = spec.lit[k] ?? [];
    const missing = spec.outputs.filter((o, j) => row[j] && !high.has(o));
    const extra = spec.outputs.filter((o, j) => !row[j] && high.has(o));
    const code = spec.counter.codes[k];
    if (missing.length > 0) say(`state ${s} (code ${code}, "${spec.texts[k]}") does not light ${missing.join(", ")}`);
    if (extra.length > 0) say(`state ${s} (code ${code}, "${spec.texts[k]}") also lights ${extra.join(", ")}`);
  });

  if (m.lowerBound !== null && m.lowerBound > m.count) say(`lower bound ${m.lowerBound} exceeds the count ${m.count}`);
  if (m.optimal && m.lowerBound !== m.count) say("marked optimal but the lower bound does not equal the count");
  return errors.length > 0 ? fail(errors) : ok({ ...m, verified: true as const });
}

/** The nodes that are high for one code: stage lines, then gates, then the OR plane in topological order. */
function simulate(m: DiodeMatrix, code: string, order: readonly string[], orIn: ReadonlyMap<string, readonly string[]>): Set<string> {
  const high = new Set<string>();
  for (const line of m.lines) {
    const lit = literalOf(line);
    if (lit && stageBit(code, lit.stage) === lit.high) high.add(line);
  }
  for (const g of m.gates) if (g.inputs.every((i) => high.has(i))) high.add(g.ref);
  for (const n of order) if (!high.has(n) && (orIn.get(n) ?? []).some((f) => high.has(f))) high.add(n);
  return high;
}

/**
 * The outputs a decoder lights for any code, used or not (the power-up
 * table), by the same simulation as the verifier's.
 */
export function litByCode(m: DiodeMatrix, code: string): Set<string> {
  const orIn = new Map<string, string[]>();
  const lines = new Set(m.lines);
  for (const d of m.diodes) if (!lines.has(d.to)) orIn.set(d.to, [...(orIn.get(d.to) ?? []), d.from]);
  const order = topological(m, orIn);
  const high = simulate(m, code, order, orIn);
  return new Set([...m.outputs.filter((o) => high.has(o)), ...m.tiedOn]);
}

function topological(m: DiodeMatrix, orIn: ReadonlyMap<string, readonly string[]>): string[] {
  const done = new Set<string>([...m.lines, ...m.gates.map((g) => g.ref)]);
  const rest = [...m.buses, ...m.outputs];
  const order: string[] = [];
  while (rest.length > 0) {
    const i = rest.findIndex((n) => (orIn.get(n) ?? []).every((f) => done.has(f)));
    if (i < 0) throw new Error("bug: litByCode needs a verified (loop-free) decoder");
    const [n] = rest.splice(i, 1) as [string];
    done.add(n);
    order.push(n);
  }
  return order;
}
