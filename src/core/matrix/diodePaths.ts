/**
 * The path walks both matrix verifiers share: an order in which every diode
 * runs forward, and every output's path lengths against the depth limit and
 * the depth policy.
 */
import type { DepthPolicy } from "../project/project.ts";
import { fail, ok, type Result } from "../result/result.ts";

/**
 * Topological order of `nodes` (Kahn's algorithm), or the finding that the
 * diodes form a loop, naming the nodes on it.
 *
 * @param out each node's diode targets
 * @param indeg each node's number of incoming diodes
 */
export function diodeOrder(
  nodes: readonly string[],
  out: ReadonlyMap<string, readonly string[]>,
  indeg: ReadonlyMap<string, number>,
): Result<string[], string> {
  const remaining = new Map(nodes.map((n) => [n, indeg.get(n) ?? 0]));
  const order: string[] = [];
  const queue = nodes.filter((n) => remaining.get(n) === 0);
  while (queue.length > 0) {
    const n = queue.shift() as string;
    order.push(n);
    for (const t of out.get(n) ?? []) {
      const r = (remaining.get(t) ?? 0) - 1;
      remaining.set(t, r);
      if (r === 0) queue.push(t);
    }
  }
  if (order.length !== nodes.length)
    return fail(`the diodes form a loop through ${nodes.filter((n) => (remaining.get(n) ?? 0) > 0).join(", ")}`);
  return ok(order);
}

/**
 * Findings on path lengths: every path from a source line into each output,
 * as a bit set (bit L = a path of L diodes), against the depth limit, and one
 * length per output (per-segment) or one overall (uniform); with the longest
 * path into any output.
 */
export function depthFindings(
  sources: readonly string[],
  order: readonly string[],
  out: ReadonlyMap<string, readonly string[]>,
  outputs: readonly string[],
  limits: { readonly depthLimit: number; readonly policy: DepthPolicy },
): { readonly findings: string[]; readonly longest: number } {
  const found: string[] = [];
  const lengths = new Map<string, number>();
  for (const s of sources) lengths.set(s, 1);
  for (const n of order) {
    const here = lengths.get(n) ?? 0;
    for (const t of out.get(n) ?? []) lengths.set(t, (lengths.get(t) ?? 0) | ((here << 1) & 0x7fffffff));
  }
  const all = new Set<number>();
  for (const o of outputs) {
    const bits = lengths.get(o) ?? 0;
    const ls = [...Array(31).keys()].filter((l) => bits & (1 << l));
    ls.forEach((l) => all.add(l));
    const longest = Math.max(0, ...ls);
    if (longest > limits.depthLimit) found.push(`output ${o} is reached through ${longest} diodes, over the limit of ${limits.depthLimit}`);
    if (limits.policy === "per-segment" && ls.length > 1)
      found.push(`output ${o} is reached through paths of ${ls.join(" and ")} diodes; the per-segment policy wants one length`);
  }
  if (limits.policy === "uniform" && all.size > 1)
    found.push(`paths have ${[...all].sort().join(", ")} diodes; the uniform policy wants one length`);
  return { findings: found, longest: Math.max(0, ...all) };
}
