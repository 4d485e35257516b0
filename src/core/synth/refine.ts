/**
 * The heuristic's last step at depth limit 2: a local search over the set
 * of shared structures in which every row takes its cheapest cover exactly.
 *
 * Structure it uses: at depth 2, once the level-1 outputs (set A: fed by
 * direct diodes only) and the shared structures in use are fixed, each
 * row's cheapest cover is independent of every other row (the same fact
 * search.ts builds its bound on). A row lights its outputs in A with direct
 * diodes and the rest with the structures whose outputs it lights, with
 * direct diodes where the policy allows them (mixed) or with its own padding
 * bus (one diode in per state it stands for, one out per output). That
 * cover is a subset DP over the row's own lit outputs, so a row of a merged
 * problem (reduce.ts, a digit standing for many states) pays its weight for
 * every bus it feeds, which is what a greedy by diodes saved gets wrong:
 * there the best matrix usually gives each merged row one bus.
 *
 * The search starts from a plan (the greedy's), takes its level-1 set and
 * its structures, and then, first improvement, drops a structure, adds one
 * from a pool (the rows' level-2 parts, their pairwise intersections, the
 * padding buses in use, which then serve every row that fits), or moves an
 * output across A. The count it works with is exact (a structure no row
 * uses costs nothing and is dropped), so it only ever returns a plan no
 * dearer than the one it got, and every plan it builds is exact by the rules
 * of rules.ts: a bus drives only outputs every state feeding it lights, a
 * link runs only where `within` holds, and levels follow the policy.
 */
import { planCost, type PlanBus, type PlanLink, type SharingPlan, type SharingProblem, type SharingRules } from "./plan.ts";
import { linkFits } from "./rules.ts";
import { comparePlans } from "./tieBreak.ts";
import type { WorkMeter } from "./workMeter.ts";

/** Most level-2 outputs a row may have for the subset DP (2^r masks). */
export const REFINE_MAX_ROW_OUTPUTS = 16;
/** Most candidate bus shapes in the pool the search adds from. */
const MAX_POOL = 3000;
/** Most rounds of the first-improvement search. */
const MAX_ROUNDS = 40;

interface Item {
  /** Bus outputs, or the link's target alone. */
  readonly outputs: readonly number[];
  /** Cost paid once when some row uses it. */
  readonly fixed: number;
  /** The link, or null for a bus. */
  readonly link: PlanLink | null;
  /** Rows that may use it. */
  readonly users: readonly number[];
  readonly key: string;
}

interface RowCover {
  readonly cost: number;
  /** Items used (indices into the item list). */
  readonly items: readonly number[];
  /** Outputs driven directly (level-2 outputs under mixed; A outputs are always direct). */
  readonly direct: readonly number[];
  /** Outputs on the row's padding bus. */
  readonly pad: readonly number[];
}

/** True when the refinement can take this problem and rules (depth 2, rows of few outputs). */
export function refineApplies(p: SharingProblem, rules: SharingRules): boolean {
  return rules.depthLimit === 2 && p.row.every((r) => r.length <= REFINE_MAX_ROW_OUTPUTS);
}

/**
 * Improves `plan` by the local search above; returns a plan no worse under
 * `comparePlans` (the input itself when nothing better was found, the
 * problem is out of reach, or the meter ran out first).
 */
export function refinePlan(p: SharingProblem, rules: SharingRules, plan: SharingPlan, meter: WorkMeter): SharingPlan {
  if (!refineApplies(p, rules) || meter.spent()) return plan;
  if (!rules.buses && (!rules.links || rules.policy === "uniform")) return plan;
  const s = new RefineSearch(p, rules, meter);
  const start = s.levelSetOf(plan);
  if (start === null) return plan;
  const found = s.run(start, plan);
  return found !== null && comparePlans(found, plan, p) < 0 ? found : plan;
}

class RefineSearch {
  private readonly mixed: boolean;
  private readonly uniform: boolean;
  private readonly items: Item[] = [];
  private readonly byKey = new Map<string, number>();
  /** Per row: the local bit of each output (-1 when unlit). */
  private readonly local: Int32Array[];
  private memo = new Float64Array(1 << 8);
  private choice = new Int32Array(1 << 8);
  private stamp = new Uint32Array(1 << 8);
  private tick = 0;

  constructor(
    private readonly p: SharingProblem,
    private readonly rules: SharingRules,
    private readonly meter: WorkMeter,
  ) {
    this.mixed = rules.policy === "mixed";
    this.uniform = rules.policy === "uniform";
    this.local = p.row.map((r) => {
      const a = new Int32Array(p.m).fill(-1);
      r.forEach((o, i) => (a[o] = i));
      return a;
    });
  }

  /** The level-1 set of a depth-2 plan: under per-segment the outputs nothing shared feeds, under mixed the link sources. */
  levelSetOf(plan: SharingPlan): boolean[] | null {
    const shared = Array(this.p.m).fill(false) as boolean[];
    for (const b of plan.buses) for (const o of b.outputs) shared[o] = true;
    for (const l of plan.links) shared[l.to] = true;
    if (this.uniform) return Array(this.p.m).fill(false) as boolean[];
    if (this.mixed) {
      const a = Array(this.p.m).fill(false) as boolean[];
      for (const l of plan.links) a[l.from] = true;
      // A link source fed by anything shared would make a three-diode path: not a depth-2 plan.
      return a.some((x, o) => x && shared[o]) ? null : a;
    }
    return shared.map((x) => !x);
  }

  private item(outputs: readonly number[], link: PlanLink | null): number {
    const key = link ? `${link.from}>${link.to}` : outputs.join(",");
    const at = this.byKey.get(key);
    if (at !== undefined) return at;
    const users = link
      ? (this.p.col[link.from] ?? [])
      : this.p.row.flatMap((_, k) => (outputs.every((o) => this.p.lit[k]?.[o] === true) ? [k] : []));
    this.meter.charge(this.p.n);
    this.items.push({ outputs, fixed: link ? 1 : outputs.length, link, users, key });
    this.byKey.set(key, this.items.length - 1);
    return this.items.length - 1;
  }

  /** True when item i may be used with level-1 set `a`. */
  private allowed(i: number, a: readonly boolean[]): boolean {
    const it = this.items[i] as Item;
    if (it.link) return a[it.link.from] === true && a[it.link.to] !== true;
    if (!this.rules.buses) return false;
    return it.outputs.every((o) => a[o] !== true);
  }

  /** Row k's cheapest cover with the items of `set` (charged nothing for their fixed cost). */
  private cover(k: number, a: readonly boolean[], set: ReadonlySet<number>, usable: readonly number[]): RowCover {
    const p = this.p;
    const w = p.weight[k] ?? 1;
    const row = p.row[k] ?? [];
    const loc = this.local[k] as Int32Array;
    let base = 0;
    let need = 0;
    for (const o of row) {
      if (a[o]) base += w;
      else need |= 1 << (loc[o] ?? 0);
    }
    const direct = row.filter((o) => a[o]);
    if (need === 0) return { cost: base, items: [], direct, pad: [] };
    const size = 1 << row.length;
    if (this.memo.length < size) {
      this.memo = new Float64Array(size);
      this.choice = new Int32Array(size);
      this.stamp = new Uint32Array(size);
    }
    const masks: number[] = [];
    const ids: number[] = [];
    const costs: number[] = [];
    for (const i of usable) {
      if (!set.has(i)) continue;
      const it = this.items[i] as Item;
      let mask = 0;
      for (const o of it.outputs) mask |= 1 << (loc[o] ?? 0);
      if ((mask & need) !== mask) continue;
      masks.push(mask);
      ids.push(i);
      costs.push(it.link ? 0 : w);
    }
    this.meter.charge(masks.length + row.length);
    const padOk = this.rules.buses && (!this.mixed || w >= 2);
    const solve = (pad: boolean): number => {
      this.tick++;
      // Each leftover output: a direct diode (mixed, w) or a padding-bus output (1).
      const single = pad ? 1 : this.mixed ? w : Infinity;
      const dp = (mask: number): number => {
        if (mask === 0) return 0;
        if (this.stamp[mask] === this.tick) return this.memo[mask] ?? Infinity;
        this.meter.work += masks.length + 1;
        const bit = mask & -mask;
        let best = single === Infinity ? Infinity : single + dp(mask & ~bit);
        let pick = -1;
        for (let j = 0; j < masks.length; j++) {
          const im = masks[j] as number;
          if ((im & bit) === 0) continue;
          const c = (costs[j] as number) + dp(mask & ~im);
          if (c < best) {
            best = c;
            pick = j;
          }
        }
        this.memo[mask] = best;
        this.choice[mask] = pick;
        this.stamp[mask] = this.tick;
        return best;
      };
      return dp(need);
    };
    const walk = (): { items: number[]; single: number } => {
      const used: number[] = [];
      let single = 0;
      let mask = need;
      while (mask !== 0) {
        const j = this.choice[mask] ?? -1;
        if (j < 0) {
          const bit = mask & -mask;
          single |= bit;
          mask &= ~bit;
        } else {
          used.push(ids[j] as number);
          mask &= ~(masks[j] as number);
        }
      }
      return { items: used, single };
    };
    const plain = solve(false);
    let out = plain === Infinity ? null : { cost: plain, ...walk(), pad: false };
    if (padOk) {
      const withPad = w + solve(true);
      if (out === null || withPad < out.cost) out = { cost: withPad, ...walk(), pad: true };
    }
    if (out === null) return { cost: Infinity, items: [], direct, pad: [] };
    const singles = row.filter((o) => !a[o] && (out.single >> (loc[o] ?? 0)) & 1);
    return {
      cost: base + out.cost,
      items: out.items,
      direct: out.pad ? direct : [...direct, ...singles],
      pad: out.pad ? singles : [],
    };
  }

  /** Covers of every row, and the exact count (fixed costs of used items included). */
  private evaluate(a: readonly boolean[], set: ReadonlySet<number>): { total: number; covers: RowCover[] } | null {
    const usable = [...set].filter((i) => this.allowed(i, a)).sort((x, y) => x - y);
    const byRow: number[][] = Array.from({ length: this.p.n }, () => []);
    for (const i of usable) for (const k of (this.items[i] as Item).users) byRow[k]?.push(i);
    const covers: RowCover[] = [];
    let total = 0;
    const used = new Set<number>();
    for (let k = 0; k < this.p.n; k++) {
      const c = this.cover(k, a, set, byRow[k] ?? []);
      if (c.cost === Infinity) return null;
      total += c.cost;
      for (const i of c.items) used.add(i);
      covers.push(c);
    }
    for (const i of used) total += (this.items[i] as Item).fixed;
    return { total, covers };
  }

  private planOf(covers: readonly RowCover[]): SharingPlan {
    const direct: [number, number][] = [];
    const users = new Map<number, number[]>();
    const pads = new Map<string, { states: number[]; outputs: number[] }>();
    covers.forEach((c, k) => {
      for (const o of c.direct) direct.push([k, o]);
      for (const i of c.items) {
        let u = users.get(i);
        if (!u) users.set(i, (u = []));
        u.push(k);
      }
      if (c.pad.length > 0) {
        const key = c.pad.join(",");
        const pad = pads.get(key) ?? { states: [], outputs: [...c.pad] };
        pad.states.push(k);
        pads.set(key, pad);
      }
    });
    const buses: PlanBus[] = [];
    const links: PlanLink[] = [];
    for (const [i, u] of [...users.entries()].sort((x, y) => x[0] - y[0])) {
      const it = this.items[i] as Item;
      if (it.link) links.push(it.link);
      else buses.push({ states: u, outputs: [...it.outputs] });
    }
    return { direct, buses: [...buses, ...pads.values()], links };
  }

  /** Bus shapes to try adding, for level-1 set `a`: rows' level-2 parts and their pairwise intersections. */
  private pool(a: readonly boolean[]): number[] {
    if (!this.rules.buses) return [];
    const parts = this.p.row.map((r) => r.filter((o) => !a[o]));
    const least = this.mixed ? 2 : 1;
    const out: number[] = [];
    const seen = new Set<string>();
    const add = (t: readonly number[]): void => {
      if (t.length < least || out.length >= MAX_POOL) return;
      const key = t.join(",");
      if (seen.has(key)) return;
      seen.add(key);
      out.push(this.item(t, null));
    };
    for (let x = 0; x < parts.length && out.length < MAX_POOL; x++) {
      const px = parts[x] ?? [];
      add(px);
      for (let y = x + 1; y < parts.length && out.length < MAX_POOL; y++) {
        if (this.meter.charge(px.length)) return out;
        const ly = this.p.lit[y] ?? [];
        add(px.filter((o) => ly[o] === true));
      }
    }
    return out;
  }

  private linksFor(a: readonly boolean[]): number[] {
    if (!this.rules.links || this.uniform) return [];
    const out: number[] = [];
    for (let x = 0; x < this.p.m; x++) {
      if (!a[x]) continue;
      for (let y = 0; y < this.p.m; y++) if (!a[y] && linkFits(this.p, x, y)) out.push(this.item([y], { from: x, to: y }));
    }
    return out;
  }

  run(a0: boolean[], plan: SharingPlan): SharingPlan | null {
    let a = a0;
    let set = new Set<number>();
    for (const b of plan.buses) if (b.states.length >= 2 || !this.mixed) set.add(this.item([...b.outputs], null));
    for (const l of plan.links) set.add(this.item([l.to], l));
    const first = this.evaluate(a, set);
    if (first === null) return null;
    let cur: { total: number; covers: RowCover[] } = first;
    // Items in use, with the number of rows using each; the set holds only those.
    const countUses = (covers: readonly RowCover[]): Map<number, number> => {
      const uses = new Map<number, number>();
      for (const c of covers) for (const i of c.items) uses.set(i, (uses.get(i) ?? 0) + 1);
      return uses;
    };
    let uses = countUses(cur.covers);
    set = new Set([...set].filter((i) => uses.has(i)));
    // Rows whose cover may change when item i joins or leaves: its users.
    const rowsUsing = (i: number): number[] => {
      const out: number[] = [];
      cur.covers.forEach((c, k) => {
        if (c.items.includes(i)) out.push(k);
      });
      return out;
    };
    const usableFor = (k: number, s2: ReadonlySet<number>): number[] => {
      const out: number[] = [];
      for (const i of s2) if ((this.items[i] as Item).users.includes(k) && this.allowed(i, a)) out.push(i);
      return out.sort((x, y) => x - y);
    };
    // A change of the set that touches only `rows`: kept when it lowers the exact count.
    const trySet = (s2: Set<number>, rows: readonly number[]): boolean => {
      if (this.meter.spent()) return false;
      const next = new Map<number, RowCover>();
      let delta = 0;
      const uses2 = new Map(uses);
      for (const k of rows) {
        const c = this.cover(k, a, s2, usableFor(k, s2));
        if (c.cost === Infinity) return false;
        const old = cur.covers[k] as RowCover;
        delta += c.cost - old.cost;
        for (const i of old.items) uses2.set(i, (uses2.get(i) ?? 0) - 1);
        for (const i of c.items) uses2.set(i, (uses2.get(i) ?? 0) + 1);
        next.set(k, c);
      }
      for (const [i, u] of uses2) {
        const was = uses.get(i) ?? 0;
        if (was === 0 && u > 0) delta += (this.items[i] as Item).fixed;
        if (was > 0 && u <= 0) delta -= (this.items[i] as Item).fixed;
      }
      if (delta >= 0) return false;
      const covers = cur.covers.slice();
      for (const [k, c] of next) covers[k] = c;
      cur = { total: cur.total + delta, covers };
      uses = new Map([...uses2].filter(([, u]) => u > 0));
      set = new Set([...s2].filter((i) => uses.has(i)));
      return true;
    };
    // A new level-1 set: every row again.
    const tryLevels = (a2: boolean[], s2: Set<number>): boolean => {
      if (this.meter.spent()) return false;
      const next = this.evaluate(a2, s2);
      if (next === null || next.total >= cur.total) return false;
      cur = next;
      a = a2;
      uses = countUses(next.covers);
      set = new Set([...s2].filter((i) => uses.has(i)));
      return true;
    };
    for (let round = 0; round < MAX_ROUNDS && !this.meter.spent(); round++) {
      let improved = false;
      // Padding buses in use, as shared buses any fitting row may feed.
      const pads = new Set<string>();
      for (const c of cur.covers) if (c.pad.length > (this.mixed ? 1 : 0)) pads.add(c.pad.join(","));
      const candidates = [...[...pads].map((key) => this.item(key.split(",").map(Number), null)), ...this.pool(a), ...this.linksFor(a)];
      for (const i of [...set]) if (set.has(i) && trySet(new Set([...set].filter((j) => j !== i)), rowsUsing(i))) improved = true;
      for (const i of candidates) {
        if (set.has(i) || !this.allowed(i, a)) continue;
        if (trySet(new Set([...set, i]), (this.items[i] as Item).users)) improved = true;
      }
      // Moving an output across the level-1 set (not under uniform, which has none).
      if (!this.uniform) {
        for (let o = 0; o < this.p.m; o++) {
          if ((this.p.col[o] ?? []).length === 0) continue;
          const a2 = a.slice();
          a2[o] = !a2[o];
          const kept = new Set([...set].filter((i) => this.allowed(i, a2)));
          if (tryLevels(a2, kept)) improved = true;
        }
      }
      if (!improved) break;
    }
    const out = this.planOf(cur.covers);
    // The plan may only be cheaper than the DP's count (equal padding buses merge); anything else is a bug here, and the input plan stands.
    return planCost(this.p, out) <= cur.total ? out : null;
  }
}
