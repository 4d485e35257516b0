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
 * output across A. A move is looked at again only once a row it touches
 * has changed since (its cover, or the structures it may use).
 *
 * At its local minimum it kicks (an iterated local search): it forces one
 * move the descent would not make and descends again with that move kept.
 * A forced add is followed by drops only: a swap of one structure for one
 * or several, the move a first-improvement descent misses. A forced drop (the
 * structure barred from coming back) or a forced move of an output across
 * A is followed by the whole descent. A kick is kept when it ends no dearer
 * than the point it started from (a few at the same count, to walk along a
 * plateau); the best point seen is the result. Kicks are tried in a fixed
 * order within a work budget, so the result is the same on every machine.
 * On 0-5 uniform they turn the buses a b d e and c f g into a c d f and
 * b e (25 -> 24 diodes, the optimum), a change no single add or drop pays for.
 *
 * Where the caller asks for it (small problems), the search also runs from
 * two fresh starts, each with its own kicks: nothing shared (every output
 * through padding buses, or direct under mixed) and every output direct
 * (all in A). The greedy's plan is often a deep local minimum: on 0-F
 * uniform the kicks leave its 54 alone, while from nothing shared they
 * reach 53 and then the optimum 52.
 *
 * The count it works with is exact (a structure no row uses costs nothing
 * and is dropped), so it only ever returns a plan no dearer than the one it
 * got, and every plan it builds is exact by the rules of rules.ts: a bus
 * drives only outputs every state feeding it lights, a link runs only where
 * `within` holds, and levels follow the policy.
 */
import { planCost, type PlanBus, type PlanLink, type SharingPlan, type SharingProblem, type SharingRules } from "./plan.ts";
import { linkFits } from "./rules.ts";
import { comparePlans } from "./tieBreak.ts";
import type { WorkMeter } from "./workMeter.ts";

/** Most level-2 outputs a row may have for the subset DP (2^r masks). */
export const REFINE_MAX_ROW_OUTPUTS = 16;
/** Most candidate bus shapes in the pool the search adds from. */
const MAX_POOL = 3000;
/** Most rounds of one first-improvement descent. */
const MAX_ROUNDS = 40;
/**
 * Most kicks kept that end at the same count (a walk along a plateau),
 * counted since the last gain; then the kicks stop. Measured on the bench:
 * 1-12 per-segment needs the plateau walk (43 without, the optimum 41
 * with); 10 reaches every figure 40 did, at less work.
 */
const MAX_SIDEWAYS = 10;
/** Default work of the kicks from one start, in DP steps and moves looked at (heuristic.ts passes its own). */
export const REFINE_KICK_WORK = 500_000;

export interface RefineOptions {
  /** Most work units of the kicks after the first descent (default `REFINE_KICK_WORK`; 0: no kicks). */
  readonly kickWork?: number;
  /** Also search from fresh starts (nothing shared; every output direct), each with its own kicks, and keep the best. */
  readonly restarts?: boolean;
}

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
  /** Items used (indices into the item list), ascending. */
  readonly items: readonly number[];
  /**
   * Level-2 outputs (local bits) the items leave: driven directly (mixed)
   * or, with `padUsed`, through the row's padding bus. Outputs in A are
   * always direct.
   */
  readonly single: number;
  readonly padUsed: boolean;
}

/** A saved point of the search (see `snapshot`). */
interface Snapshot {
  readonly a: readonly boolean[];
  readonly covers: readonly RowCover[];
  readonly uses: ReadonlyMap<number, number>;
  readonly total: number;
  readonly version: number;
}

const EMPTY: readonly number[] = [];

/** True when the refinement can take this problem and rules (depth 2, rows of few outputs). */
export function refineApplies(p: SharingProblem, rules: SharingRules): boolean {
  return rules.depthLimit === 2 && p.row.every((r) => r.length <= REFINE_MAX_ROW_OUTPUTS);
}

/**
 * Improves `plan` by the local search above; returns a plan no worse under
 * `comparePlans` (the input itself when nothing better was found, the
 * problem is out of reach, or the meter ran out first).
 */
export function refinePlan(
  p: SharingProblem,
  rules: SharingRules,
  plan: SharingPlan,
  meter: WorkMeter,
  opts: RefineOptions = {},
): SharingPlan {
  if (!refineApplies(p, rules) || meter.spent()) return plan;
  if (!rules.buses && (!rules.links || rules.policy === "uniform")) return plan;
  const s = new RefineSearch(p, rules, meter);
  const a0 = s.levelSetOf(plan);
  if (a0 === null) return plan;
  const kickWork = opts.kickWork ?? REFINE_KICK_WORK;
  let best = plan;
  const consider = (found: SharingPlan | null): void => {
    if (found !== null && comparePlans(found, best, p) < 0) best = found;
  };
  consider(s.run(a0, s.itemsOf(plan), kickWork));
  if (opts.restarts) {
    // Fresh starts: nothing shared (every output through padding buses, or direct under mixed), and every output direct.
    consider(s.run(Array(p.m).fill(false) as boolean[], [], kickWork));
    if (rules.policy !== "uniform") consider(s.run(Array(p.m).fill(true) as boolean[], [], kickWork));
  }
  return best;
}

class RefineSearch {
  private readonly mixed: boolean;
  private readonly uniform: boolean;
  private readonly items: Item[] = [];
  private readonly byKey = new Map<string, number>();
  /** Per row: the items it may use, in the order they were made. */
  private readonly rowItems: number[][];
  /** Per item: at each row that may use it, its outputs as the row's local bits (0 elsewhere). */
  private readonly rowMask: Int32Array[] = [];
  /** Per item: whether the current level-1 set allows it, and for which level-1 set (`aVersion`) that was worked out. */
  private allowedVal = new Uint8Array(256);
  private allowedAt = new Float64Array(256);
  private aVersion = 1;
  /** Per row: the local bit of each output (-1 when unlit). */
  private readonly local: Int32Array[];
  /** `candidates` of the point `candidatesAt`, and the pool and links of the level-1 set `sharedAt`. */
  private candidatesCache: number[] = [];
  private candidatesAt = -1;
  private sharedCache: number[] = [];
  private sharedAt = -1;
  /** Pool of bus shapes per level-1 set. */
  private readonly pools = new Map<string, number[]>();

  // The subset DP's scratch.
  private memo = new Float64Array(1 << 8);
  private choice = new Int32Array(1 << 8);
  private stamp = new Uint32Array(1 << 8);
  private tick = 0;
  private dpMasks = new Int32Array(64);
  private dpCosts = new Float64Array(64);
  private dpIds = new Int32Array(64);
  private dpCount = 0;
  private dpSingle = 0;
  /** The outputs the last `walk` left single. */
  private walkSingle = 0;

  // The current point: level-1 set, every row's cover, the items in use (with their rows), the exact count.
  private a: boolean[] = [];
  private covers: RowCover[] = [];
  private uses = new Map<number, number>();
  /** 1 for the items in use (the set on offer). */
  private inSet = new Uint8Array(256);
  /** The items on offer, ascending. */
  private setList: number[] = [];
  /** Scratch of `change`: per item, the change in its rows. */
  private diff = new Int32Array(256);
  private total = 0;
  /** Id of the current point (a snapshot restores it). */
  private version = 0;
  private versions = 0;

  // Staleness: a move is looked at again only after a row it touches changed.
  private clock = 1;
  private readonly rowChanged: Float64Array;
  private checked = new Float64Array(256);
  private readonly flipChecked: Float64Array;

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
    this.rowItems = p.row.map(() => []);
    this.rowChanged = new Float64Array(p.n);
    this.flipChecked = new Float64Array(p.m).fill(-1);
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
    const id = this.items.length;
    this.items.push({ outputs, fixed: link ? 1 : outputs.length, link, users, key });
    this.byKey.set(key, id);
    const mark = new Int32Array(this.p.n);
    for (const k of users) {
      const loc = this.local[k] as Int32Array;
      let bits = 0;
      for (const o of outputs) bits |= 1 << (loc[o] ?? 0);
      mark[k] = bits;
      this.rowItems[k]?.push(id);
    }
    this.rowMask.push(mark);
    if (id >= this.inSet.length) {
      const grown = new Uint8Array(this.inSet.length * 2);
      grown.set(this.inSet);
      this.inSet = grown;
      const checked = new Float64Array(this.checked.length * 2);
      checked.set(this.checked);
      this.checked = checked;
      this.diff = new Int32Array(this.checked.length);
      this.allowedVal = new Uint8Array(this.checked.length);
      this.allowedAt = new Float64Array(this.checked.length);
    }
    return id;
  }

  /** True when item i may be used with the current level-1 set. */
  private allowed(i: number): boolean {
    if (this.allowedAt[i] === this.aVersion) return this.allowedVal[i] === 1;
    const it = this.items[i] as Item;
    let ok: boolean;
    if (it.link) ok = this.a[it.link.from] === true && this.a[it.link.to] !== true;
    else ok = this.rules.buses && it.outputs.every((o) => !this.a[o]);
    this.allowedVal[i] = ok ? 1 : 0;
    this.allowedAt[i] = this.aVersion;
    return ok;
  }

  /** Row k's cheapest cover with the items in use, plus `extra`, less `without` (charged nothing for their fixed cost). */
  private cover(k: number, extra: number, without: number): RowCover {
    const p = this.p;
    const w = p.weight[k] ?? 1;
    const row = p.row[k] ?? EMPTY;
    const loc = this.local[k] as Int32Array;
    let base = 0;
    let need = 0;
    for (const o of row) {
      if (this.a[o]) base += w;
      else need |= 1 << (loc[o] ?? 0);
    }
    if (need === 0) return { cost: base, items: EMPTY, single: 0, padUsed: false };
    const size = 1 << row.length;
    if (this.memo.length < size) {
      this.memo = new Float64Array(size);
      this.choice = new Int32Array(size);
      this.stamp = new Uint32Array(size);
    }
    const list = this.setList;
    let count = 0;
    for (let x = 0; x <= list.length; x++) {
      // The items on offer, then `extra`.
      const i = x < list.length ? (list[x] as number) : extra;
      if (i < 0 || i === without || (x === list.length && this.inSet[i] === 1)) continue;
      const mask = (this.rowMask[i] as Int32Array)[k] as number;
      if (mask === 0 || (mask & need) !== mask || !this.allowed(i)) continue;
      const it = this.items[i] as Item;
      if (count === this.dpMasks.length) {
        const masks = new Int32Array(count * 2);
        masks.set(this.dpMasks);
        this.dpMasks = masks;
        const costs = new Float64Array(count * 2);
        costs.set(this.dpCosts);
        this.dpCosts = costs;
        const ids = new Int32Array(count * 2);
        ids.set(this.dpIds);
        this.dpIds = ids;
      }
      this.dpMasks[count] = mask;
      this.dpIds[count] = i;
      this.dpCosts[count] = it.link ? 0 : w;
      count++;
    }
    this.dpCount = count;
    this.meter.charge(count + row.length);
    // Each leftover output: a direct diode (mixed, w) or a padding-bus output (1).
    // The padding-bus DP first: when its best cover leaves no output single,
    // that cover is also the best without the padding bus (which then is not placed).
    let best = Infinity;
    let padUsed = false;
    let items: number[] | null = null;
    if (this.rules.buses && (!this.mixed || w >= 2)) {
      this.tick++;
      this.dpSingle = 1;
      const cost = this.dp(need);
      items = this.walk(need);
      if (this.walkSingle === 0) best = cost;
      else {
        best = w + cost;
        padUsed = true;
      }
    }
    let single = this.walkSingle;
    if (items === null || single !== 0) {
      this.tick++;
      this.dpSingle = this.mixed ? w : Infinity;
      const plain = this.dp(need);
      if (plain !== Infinity && plain <= best) {
        best = plain;
        padUsed = false;
        items = this.walk(need);
        single = this.walkSingle;
      }
    }
    if (items === null) return { cost: Infinity, items: EMPTY, single: 0, padUsed: false };
    return { cost: base + best, items, single, padUsed };
  }

  /** Outputs of row k a cover leaves single (driven directly, or on the padding bus with `padUsed`). */
  private singles(k: number, c: RowCover): number[] {
    if (c.single === 0) return [];
    const loc = this.local[k] as Int32Array;
    return (this.p.row[k] ?? EMPTY).filter((o) => !this.a[o] && (c.single >> (loc[o] ?? 0)) & 1);
  }

  /** Outputs of row k a cover drives directly. */
  private directOf(k: number, c: RowCover): number[] {
    const inA = (this.p.row[k] ?? EMPTY).filter((o) => this.a[o]);
    return c.padUsed ? inA : [...inA, ...this.singles(k, c)];
  }

  /** Outputs on row k's padding bus. */
  private padOf(k: number, c: RowCover): number[] {
    return c.padUsed ? this.singles(k, c) : [];
  }

  /** The subset DP: least cost of covering `mask`, lowest output first. */
  private dp(mask: number): number {
    if (mask === 0) return 0;
    if (this.stamp[mask] === this.tick) return this.memo[mask] as number;
    this.meter.work += this.dpCount + 1;
    const bit = mask & -mask;
    let best = this.dpSingle === Infinity ? Infinity : this.dpSingle + this.dp(mask & ~bit);
    let pick = -1;
    for (let j = 0; j < this.dpCount; j++) {
      const im = this.dpMasks[j] as number;
      if ((im & bit) === 0) continue;
      const c = (this.dpCosts[j] as number) + this.dp(mask & ~im);
      if (c < best) {
        best = c;
        pick = j;
      }
    }
    this.memo[mask] = best;
    this.choice[mask] = pick;
    this.stamp[mask] = this.tick;
    return best;
  }

  /** The choices along the DP's best path from `need`: items used, and the outputs left single. */
  private walk(need: number): number[] {
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
        used.push(this.dpIds[j] as number);
        mask &= ~(this.dpMasks[j] as number);
      }
    }
    this.walkSingle = single;
    return used.length > 1 ? used.sort((x, y) => x - y) : used;
  }

  /** Covers every row afresh (a new level-1 set); false when a row has none, or the meter ran out. */
  private coverAll(): { total: number; covers: RowCover[]; uses: Map<number, number> } | null {
    const covers: RowCover[] = [];
    const uses = new Map<number, number>();
    let total = 0;
    for (let k = 0; k < this.p.n; k++) {
      const c = this.cover(k, -1, -1);
      if (c.cost === Infinity || this.meter.spent()) return null;
      total += c.cost;
      for (const i of c.items) uses.set(i, (uses.get(i) ?? 0) + 1);
      covers.push(c);
    }
    for (const i of uses.keys()) total += (this.items[i] as Item).fixed;
    return { total, covers, uses };
  }

  /** Makes `uses` the items in use, marking the rows whose choice of items changed. */
  private setUses(uses: Map<number, number>): void {
    for (const i of this.uses.keys()) if (!uses.has(i)) this.offer(i, false);
    for (const i of uses.keys()) if (!this.uses.has(i)) this.offer(i, true);
    this.uses = uses;
    this.setList = [...uses.keys()].sort((x, y) => x - y);
  }

  private offer(i: number, on: boolean): void {
    this.inSet[i] = on ? 1 : 0;
    const at = ++this.clock;
    for (const k of (this.items[i] as Item).users) this.rowChanged[k] = at;
  }

  private setCover(k: number, c: RowCover): void {
    this.covers[k] = c;
    this.rowChanged[k] = ++this.clock;
  }

  /**
   * Covers `rows` again with `extra` on offer or `without` withdrawn; the
   * change is made when it lowers the count, or always with `force`. False
   * when it was not made.
   */
  private change(rows: readonly number[], extra: number, without: number, force: boolean): boolean {
    if (this.meter.spent()) return false;
    const next: RowCover[] = [];
    let delta = 0;
    const diff = this.diff;
    const touched: number[] = [];
    let ok = true;
    for (const k of rows) {
      const c = this.cover(k, extra, without);
      if (c.cost === Infinity) {
        ok = false;
        break;
      }
      const old = this.covers[k] as RowCover;
      delta += c.cost - old.cost;
      for (const i of old.items) {
        if (diff[i] === 0 && !touched.includes(i)) touched.push(i);
        diff[i] = (diff[i] as number) - 1;
      }
      for (const i of c.items) {
        if (diff[i] === 0 && !touched.includes(i)) touched.push(i);
        diff[i] = (diff[i] as number) + 1;
      }
      next.push(c);
    }
    let extraGain = 0;
    for (const i of touched) {
      const d = diff[i] as number;
      if (i === extra) extraGain = d;
      if (d === 0) continue;
      const was = this.uses.get(i) ?? 0;
      if (was === 0 && d > 0) delta += (this.items[i] as Item).fixed;
      if (was > 0 && was + d <= 0) delta -= (this.items[i] as Item).fixed;
    }
    const changes = touched.map((i) => [i, diff[i] as number] as const);
    for (const i of touched) diff[i] = 0;
    if (!ok || (!force && delta >= 0)) return false;
    if (force && extra >= 0 && extraGain <= 0) return false;
    rows.forEach((k, x) => this.setCover(k, next[x] as RowCover));
    const uses = new Map(this.uses);
    for (const [i, d] of changes) {
      const u = (uses.get(i) ?? 0) + d;
      if (u > 0) uses.set(i, u);
      else uses.delete(i);
    }
    this.setUses(uses);
    this.total += delta;
    this.version = ++this.versions;
    return true;
  }

  /** Moves output o across the level-1 set when that lowers the count (always with `force`); every row is covered again. */
  private flip(o: number, force: boolean): boolean {
    if (this.meter.spent()) return false;
    this.a[o] = !this.a[o];
    this.aVersion++;
    const next = this.coverAll();
    if (next === null || (!force && next.total >= this.total)) {
      this.a[o] = !this.a[o];
      this.aVersion++;
      return false;
    }
    const at = ++this.clock;
    this.rowChanged.fill(at);
    this.covers = next.covers;
    this.setUses(next.uses);
    this.total = next.total;
    this.version = ++this.versions;
    return true;
  }

  private rowsUsing(i: number): number[] {
    const out: number[] = [];
    for (const k of (this.items[i] as Item).users) if ((this.covers[k] as RowCover).items.includes(i)) out.push(k);
    return out;
  }

  /** True when no row item i touches has changed since it was last found not to pay. */
  private fresh(i: number): boolean {
    const at = this.checked[i] as number;
    if (at === 0) return false;
    const users = (this.items[i] as Item).users;
    this.meter.work += users.length;
    for (const k of users) if ((this.rowChanged[k] as number) > at) return false;
    return true;
  }

  /** Items to try adding now: padding buses in use (as shared buses any fitting row may feed), the pool, the links. */
  private candidates(): number[] {
    if (this.candidatesAt === this.version) return this.candidatesCache;
    const pads = new Set<string>();
    this.covers.forEach((c, k) => {
      if (!c.padUsed) return;
      const pad = this.padOf(k, c);
      if (pad.length > (this.mixed ? 1 : 0)) pads.add(pad.join(","));
    });
    if (this.sharedAt !== this.aVersion) {
      this.sharedCache = [...this.pool(), ...this.linksFor()];
      this.sharedAt = this.aVersion;
    }
    const out =
      pads.size === 0 ? this.sharedCache : [...[...pads].map((key) => this.item(key.split(",").map(Number), null)), ...this.sharedCache];
    this.candidatesCache = out;
    this.candidatesAt = this.version;
    return out;
  }

  /**
   * First-improvement descent: drop an item (not `locked`), add one (not
   * `banned`), move an output (not `fixedOutput`) across the level-1 set.
   */
  private descend(banned: number, locked: number, fixedOutput: number, flips = true, adds = true): void {
    for (let round = 0; round < MAX_ROUNDS && !this.meter.spent(); round++) {
      let improved = false;
      for (const i of this.setList) {
        if (i === locked || this.inSet[i] === 0 || this.fresh(i)) continue;
        if (this.change(this.rowsUsing(i), -1, i, false)) improved = true;
        else this.checked[i] = this.clock;
      }
      for (const j of adds ? this.candidates() : EMPTY) {
        if (j === banned || this.inSet[j] === 1 || !this.allowed(j) || this.fresh(j)) continue;
        if (this.change((this.items[j] as Item).users, j, -1, false)) improved = true;
        else this.checked[j] = this.clock;
      }
      // Not under uniform, which has no level-1 outputs.
      if (!this.uniform && flips) {
        for (let o = 0; o < this.p.m; o++) {
          if (o === fixedOutput || (this.p.col[o] ?? []).length === 0 || this.flipChecked[o] === this.version) continue;
          if (this.flip(o, false)) improved = true;
          else this.flipChecked[o] = this.version;
        }
      }
      if (!improved) break;
    }
  }

  private snapshot(): Snapshot {
    return { a: this.a.slice(), covers: this.covers.slice(), uses: new Map(this.uses), total: this.total, version: this.version };
  }

  private restore(s: Snapshot): void {
    if (s.version === this.version) return;
    if (s.a.some((x, o) => x !== this.a[o])) {
      this.a = s.a.slice();
      this.aVersion++;
      this.rowChanged.fill(++this.clock);
    }
    s.covers.forEach((c, k) => {
      if (this.covers[k] !== c) this.setCover(k, c);
    });
    this.setUses(new Map(s.uses));
    this.total = s.total;
    this.version = s.version;
  }

  /**
   * The kicks (see the top of this file), from the best point, within
   * `work` units: each forces one move, descends with it kept, and is kept
   * when the count ends lower. Leaves the search at the best point.
   */
  private kick(work: number): void {
    const until = this.meter.work + work;
    const out = (): boolean => this.meter.spent() || this.meter.work >= until;
    let best = this.snapshot();
    let cur = best;
    let sideways = 0;
    let next = 0;
    while (!out()) {
      // The kicks from the current point: force an add, a drop or a move across A.
      const kicks: [number, number][] = [];
      for (const j of this.candidates()) if (this.inSet[j] === 0 && this.allowed(j)) kicks.push([0, j]);
      for (const i of [...this.uses.keys()].sort((x, y) => x - y)) kicks.push([1, i]);
      if (!this.uniform) this.p.col.forEach((c, o) => c.length > 0 && kicks.push([2, o]));
      let moved = false;
      for (let t = 0; t < kicks.length && !out(); t++) {
        const [kind, x] = kicks[(next + t) % kicks.length] as [number, number];
        this.restore(cur);
        if (kind === 0) {
          if (!this.change((this.items[x] as Item).users, x, -1, true)) continue;
          this.descend(-1, x, -1, false, false);
        } else if (kind === 1) {
          if (!this.change(this.rowsUsing(x), -1, x, true)) continue;
          this.descend(x, -1, -1, false);
        } else {
          if (!this.flip(x, true)) continue;
          this.descend(-1, -1, x, false);
        }
        if (this.total > cur.total) continue;
        this.descend(-1, -1, -1);
        if (this.total === cur.total) sideways++;
        cur = this.snapshot();
        if (cur.total < best.total) {
          best = cur;
          sideways = 0;
        }
        next = (next + t + 1) % kicks.length;
        moved = true;
        break;
      }
      if (!moved || sideways >= MAX_SIDEWAYS) break;
    }
    this.restore(best);
  }

  private planOf(covers: readonly RowCover[]): SharingPlan {
    const direct: [number, number][] = [];
    const users = new Map<number, number[]>();
    const pads = new Map<string, { states: number[]; outputs: number[] }>();
    covers.forEach((c, k) => {
      for (const o of this.directOf(k, c)) direct.push([k, o]);
      for (const i of c.items) {
        let u = users.get(i);
        if (!u) users.set(i, (u = []));
        u.push(k);
      }
      const padOut = this.padOf(k, c);
      if (padOut.length > 0) {
        const key = padOut.join(",");
        const pad = pads.get(key) ?? { states: [], outputs: padOut };
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

  /** Bus shapes to try adding, for the current level-1 set: rows' level-2 parts and their pairwise intersections. */
  private pool(): number[] {
    if (!this.rules.buses) return [];
    const a = this.a;
    const aKey = a.map((x) => (x ? 1 : 0)).join("");
    const hit = this.pools.get(aKey);
    if (hit) return hit;
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
    let cut = false;
    for (let x = 0; x < parts.length && out.length < MAX_POOL && !cut; x++) {
      const px = parts[x] ?? [];
      add(px);
      for (let y = x + 1; y < parts.length && out.length < MAX_POOL; y++) {
        if (this.meter.charge(px.length)) {
          cut = true;
          break;
        }
        const ly = this.p.lit[y] ?? [];
        add(px.filter((o) => ly[o] === true));
      }
    }
    // A pool the meter cut short is not kept: a later call (there is none once the meter is spent) would see more.
    if (!cut) this.pools.set(aKey, out);
    return out;
  }

  private linksFor(): number[] {
    if (!this.rules.links || this.uniform) return [];
    const out: number[] = [];
    for (let x = 0; x < this.p.m; x++) {
      if (!this.a[x]) continue;
      for (let y = 0; y < this.p.m; y++) if (!this.a[y] && linkFits(this.p, x, y)) out.push(this.item([y], { from: x, to: y }));
    }
    return out;
  }

  /** The items a plan uses, as items of this search (its padding buses too, except under mixed). */
  itemsOf(plan: SharingPlan): number[] {
    const out: number[] = [];
    for (const b of plan.buses) if (b.states.length >= 2 || !this.mixed) out.push(this.item([...b.outputs], null));
    for (const l of plan.links) out.push(this.item([l.to], l));
    return out;
  }

  /** The search from level-1 set `a0` with `start` on offer: descent, then kicks; null when a row has no cover or the meter ran out. */
  run(a0: readonly boolean[], start: readonly number[], kickWork: number): SharingPlan | null {
    this.a = a0.slice();
    this.aVersion++;
    this.inSet.fill(0);
    this.checked.fill(0);
    this.flipChecked.fill(-1);
    this.rowChanged.fill(++this.clock);
    this.uses = new Map();
    for (const i of start) this.inSet[i] = 1;
    this.setList = [...new Set(start)].sort((x, y) => x - y);
    const first = this.coverAll();
    if (first === null) return null;
    this.covers = first.covers;
    this.total = first.total;
    for (const i of start) this.inSet[i] = 0;
    this.uses = new Map();
    this.setUses(first.uses);
    this.version = ++this.versions;
    this.descend(-1, -1, -1);
    if (kickWork > 0) this.kick(kickWork);
    const out = this.planOf(this.covers);
    // The plan may only be cheaper than the DP's count (equal padding buses merge); anything else is a bug here, and the input plan stands.
    return planCost(this.p, out) <= this.total ? out : null;
  }
}
