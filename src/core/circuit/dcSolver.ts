/**
 * The DC operating point of one circuit, solved the way SPICE-class
 * simulators do it: modified nodal analysis (every source here is grounded,
 * so its node voltage is known and drops out of the unknowns), Newton-Raphson
 * on companion models with pnjlim junction limiting, then, if that fails,
 * gmin stepping and then source stepping (L. W. Nagel, SPICE2, 1975).
 *
 * Like SPICE, GMIN (1e-12 S) sits across every junction; gmin stepping adds a
 * further conductance from every node to ground and takes it away step by
 * step. A circuit that does not converge comes back as a failure naming its
 * state, never as a number.
 */
import type { Circuit } from "./circuit.ts";
import { GROUND } from "./circuitNodes.ts";
import { criticalVoltage, diodeConductance, diodeCurrent, diodeJunction, limitJunction, npnTransport } from "./deviceModels.ts";
import { minimumDegree, SparsePattern, SparseSolver } from "./linearSolve.ts";
import { thermalVoltage } from "./physics.ts";
import { fail, ok, type Result } from "../result/result.ts";

/** SPICE's absolute voltage tolerance VNTOL, volts: the last Newton update must be within it (plus 1e-9 relative). */
const VNTOL_V = 1e-6;

/** SPICE's default RELTOL: the relative part of its own step criterion. */
const SPICE_RELTOL = 1e-3;

/** SPICE's default GMIN, siemens. */
export const DEFAULT_GMIN_S = 1e-12;

export interface DcSettings {
  /** Conductance across every junction, siemens. */
  readonly gminS: number;
  /** Newton iterations allowed for the plain solve and for each stepping step. */
  readonly maxIterations: number;
  /** The methods to try, in order (tests pick one to exercise it alone). */
  readonly methods: readonly DcMethod[];
  /**
   * A `Date.now()` value after which the solve stops between two Newton
   * iterations and fails with `timeLimit` set. A large circuit (hundreds of
   * lines and outputs) takes a second or more per state, so a caller with a
   * deadline checks it inside the solve, not only between states.
   */
  readonly deadlineMs?: number;
  /**
   * How each Newton step's linear system is solved: `direct`, the sparse
   * elimination of the whole nodal matrix; `split`, the elimination of the
   * matrix without the couplings of the diodes the state leaves idle, then
   * refinement against the whole matrix until the update is down to rounding
   * (the direct solve wherever that does not converge); `auto` (the
   * default), split where the whole matrix's elimination would cost more
   * than `SPLIT_WORK`. See `splitSolve`.
   */
  readonly linear?: "auto" | "direct" | "split";
}

export type DcMethod = "newton" | "gmin-stepping" | "source-stepping";

export const DEFAULT_DC_SETTINGS: DcSettings = {
  gminS: DEFAULT_GMIN_S,
  maxIterations: 150,
  methods: ["newton", "gmin-stepping", "source-stepping"],
};

/**
 * A transistor's currents in the directions it conducts: an NPN's into the
 * collector and base and out of the emitter, a PNP's out of the collector
 * and base and into the emitter (so a transistor that is on has positive
 * currents either way).
 */
export interface TransistorCurrents {
  /** Into an NPN's collector (out of a PNP's), amperes. */
  readonly icA: number;
  /** Into an NPN's base (out of a PNP's), amperes. */
  readonly ibA: number;
  /** Out of an NPN's emitter (into a PNP's), amperes. */
  readonly ieA: number;
  /**
   * From the collector (a PNP's base) to the grounded substrate through
   * GMIN, amperes (ngspice's substrate junction); not part of Ic or Ib.
   */
  readonly substrateA: number;
}

/** A solved circuit. */
export interface OperatingPoint {
  readonly state: string;
  readonly method: DcMethod;
  /** Newton iterations spent, over all steps. */
  readonly iterations: number;
  /** Every node's voltage to ground, volts (ground `0` included). */
  readonly voltages: Readonly<Record<string, number>>;
  /**
   * Two-terminal element currents, amperes: resistors from `a` to `b`,
   * diodes and strings from anode to cathode, voltage sources out of their
   * node into the circuit.
   */
  readonly currents: Readonly<Record<string, number>>;
  readonly transistors: Readonly<Record<string, TransistorCurrents>>;
}

export interface DcFailure {
  readonly state: string;
  readonly message: string;
  /** Set when the solve stopped at `DcSettings.deadlineMs`, not for want of convergence. */
  readonly timeLimit?: true;
}

/**
 * Elimination work (`minimumDegree`) above which `auto` splits the solve:
 * about a dense block of 230 nodes, which only matrices of hundreds of
 * lines and outputs reach (256 states on 8 positions of a 32-segment cell:
 * 22 million). Below it every circuit is solved directly, as it always was
 * (the demos: 41 to 244; 00-99 on two positions: 3 700; 256 states of 8 hex
 * digits: 640 000, where the direct solve takes 50 to 180 ms a state).
 */
export const SPLIT_WORK = 4e6;

/**
 * A diode whose conductance in a Newton step is at most this fraction of
 * the geometric mean of its two nodes' diagonal entries is left out of the
 * split solve's matrix: an idle diode on a low line, reverse-biased or near
 * 0 V, carries GMIN to tens of nanosiemens against the millisiemens of the
 * lines and pull-downs around it. (A refinement shrinks the error by about
 * the square of this ratio, summed over a node's idle diodes.)
 */
const IDLE_FRACTION = 0.01;

/** Refinement steps the split solve takes at most before it solves the step directly. */
const MAX_REFINEMENTS = 60;

/**
 * The backward error at which the split solve stops refining: the largest
 * residual of a row against the sum of the magnitudes of its terms, 64
 * units in the last place (a direct elimination leaves a few units per
 * term of a row; rows here have up to tens of terms).
 */
const BACKWARD_ERROR = 64 * Number.EPSILON;

/**
 * The backward error the split solve settles for where two rounds no longer
 * halve it (rounding in the residual of a row whose terms cancel): 1e-12.
 * Above it, a stall means the split matrix is too far from the whole one,
 * and the step is solved directly.
 */
const STALL_ERROR = 1e-12;

// ------------------------------------------------------------ compiled form

/** Node reference: >= 0 an unknown, < 0 a fixed node `-(k + 1)`. */
type NodeRef = number;

interface Junction {
  /** Anode and cathode refs. */
  readonly a: NodeRef;
  readonly k: NodeRef;
  readonly isA: number;
  readonly nVtV: number;
  readonly gminS: number;
  readonly vcritV: number;
  /** Name of the element whose current this is, for the result. */
  readonly name: string;
}

interface Transistor {
  /** 1 for an NPN, -1 for a PNP: the junction voltages and terminal currents are the NPN's times this. */
  readonly sign: 1 | -1;
  readonly c: NodeRef;
  readonly b: NodeRef;
  readonly e: NodeRef;
  readonly params: { readonly isA: number; readonly betaF: number; readonly betaR: number };
  readonly vcritV: number;
  readonly name: string;
}

interface Conductance {
  readonly a: NodeRef;
  readonly b: NodeRef;
  readonly g: number;
  /** Element name for the result, or "" for a diode's series resistance. */
  readonly name: string;
}

interface Compiled {
  readonly n: number;
  readonly gminS: number;
  readonly unknownNames: readonly string[];
  readonly fixedNames: readonly string[];
  /** Fixed node voltages at full source strength (ground first). */
  readonly fixedVolts: Float64Array;
  readonly sourceNames: readonly string[];
  readonly conductances: readonly Conductance[];
  readonly junctions: readonly Junction[];
  readonly transistors: readonly Transistor[];
  readonly vtV: number;
  /** Where the nodal matrix can be non-zero. */
  readonly pattern: SparsePattern;
  /** Its elimination, kept for every Newton iteration of this circuit (built when first needed). */
  readonly solver: () => SparseSolver;
  /** The diode junctions the split solve may leave out of its matrix, or null where every step is solved directly. */
  readonly split: Int32Array | null;
}

/** Every (row, column) of the nodal matrix that the stamps of `Stamper` write. */
function* stampPositions(
  conductances: readonly Conductance[],
  junctions: readonly Junction[],
  transistors: readonly Transistor[],
): Generator<readonly [number, number]> {
  function* pair(a: NodeRef, b: NodeRef): Generator<readonly [number, number]> {
    if (a >= 0) yield [a, a];
    if (b >= 0) yield [b, b];
    if (a >= 0 && b >= 0) {
      yield [a, b];
      yield [b, a];
    }
  }
  for (const c of conductances) yield* pair(c.a, c.b);
  for (const d of junctions) yield* pair(d.a, d.k);
  for (const t of transistors)
    for (const row of [t.c, t.b, t.e]) for (const col of [t.b, t.e, t.c]) if (row >= 0 && col >= 0) yield [row, col];
}

/**
 * The unknowns in the order the elimination takes them: minimum degree over
 * the circuit's connections (linearSolve.ts), so a matrix of hundreds of
 * lines, buses and outputs fills in only where its structure forces it.
 * Every state of one matrix has the same connections, so the order is
 * worked out once and kept in the workspace under a digest of them (a
 * stale order would still be a valid one: any order gives the same
 * solution, to rounding).
 */
function eliminationOrder(
  names: readonly string[],
  circuit: Circuit,
  fixed: ReadonlySet<string>,
  ws: DcWorkspace,
): { readonly names: string[]; readonly work: number } {
  const at = new Map<string, number>();
  names.forEach((nd, i) => at.set(nd, i));
  const pairs: number[] = [];
  const join = (a: string, b: string): void => {
    const i = at.get(a);
    const j = at.get(b);
    if (i !== undefined && j !== undefined && !fixed.has(a) && !fixed.has(b)) pairs.push(i, j);
  };
  for (const el of circuit.elements) {
    switch (el.kind) {
      case "vsource":
        break;
      case "resistor":
        join(el.a, el.b);
        break;
      case "diode":
      case "segment":
        if (el.rsOhms > 0) {
          join(el.anode, `${el.name}#j`);
          join(`${el.name}#j`, el.cathode);
        } else join(el.anode, el.cathode);
        break;
      case "npn":
        join(el.collector, el.base);
        join(el.base, el.emitter);
        join(el.collector, el.emitter);
        break;
    }
  }
  // FNV-1a over the pairs: the digest the order is kept under.
  let h = 0x811c9dc5;
  for (const v of pairs) h = Math.imul(h ^ v, 0x01000193);
  const key = `${names.length}:${pairs.length}:${h >>> 0}`;
  const { order, work } = ws.order(key, () => {
    const entries: (readonly [number, number])[] = [];
    for (let k = 0; k < pairs.length; k += 2) entries.push([pairs[k] as number, pairs[k + 1] as number]);
    return minimumDegree(names.length, entries);
  });
  return { names: Array.from(order, (i) => names[i] as string), work };
}

function compile(circuit: Circuit, settings: DcSettings, ws: DcWorkspace): Compiled {
  const gminS = settings.gminS;
  const vt = thermalVoltage(circuit.temperatureC);
  const fixedNames: string[] = [GROUND];
  const fixedVolts: number[] = [0];
  const sourceNames: string[] = [];
  for (const el of circuit.elements) {
    if (el.kind !== "vsource") continue;
    if (fixedNames.includes(el.node)) throw new Error(`bug: two sources drive node ${el.node}`);
    fixedNames.push(el.node);
    fixedVolts.push(el.volts);
    sourceNames.push(el.name);
  }
  const fixed = new Set(fixedNames);
  // Diode and segment series resistances get an internal node, eliminated first.
  const internal = circuit.elements.filter((e) => (e.kind === "diode" || e.kind === "segment") && e.rsOhms > 0).map((e) => `${e.name}#j`);
  const ordered = eliminationOrder([...internal, ...circuit.nodes.filter((nd) => !fixed.has(nd))], circuit, fixed, ws);
  const unknownNames = ordered.names;
  const index = new Map<string, NodeRef>();
  unknownNames.forEach((nd, i) => index.set(nd, i));
  fixedNames.forEach((nd, k) => index.set(nd, -(k + 1)));
  const ref = (nd: string): NodeRef => {
    const r = index.get(nd);
    if (r === undefined) throw new Error(`bug: element refers to undeclared node ${nd}`);
    return r;
  };

  const conductances: Conductance[] = [];
  const junctions: Junction[] = [];
  const transistors: Transistor[] = [];
  // The junctions of diodes (not segments): the ones the split solve may leave out of its matrix.
  const diodeJunctions: number[] = [];
  for (const el of circuit.elements) {
    switch (el.kind) {
      case "vsource":
        break;
      case "resistor":
        conductances.push({ a: ref(el.a), b: ref(el.b), g: 1 / el.ohms, name: el.name });
        break;
      case "diode": {
        const nVt = el.n * vt;
        let anode = ref(el.anode);
        if (el.rsOhms > 0) {
          const j = ref(`${el.name}#j`);
          conductances.push({ a: anode, b: j, g: 1 / el.rsOhms, name: "" });
          anode = j;
        }
        junctions.push({
          a: anode,
          k: ref(el.cathode),
          isA: el.isA,
          nVtV: nVt,
          gminS,
          vcritV: criticalVoltage(el.isA, nVt),
          name: el.name,
        });
        diodeJunctions.push(junctions.length - 1);
        break;
      }
      case "segment": {
        // The LEDs in series as one junction of emission leds * n, behind leds * rs.
        const nVt = el.leds * el.n * vt;
        let anode = ref(el.anode);
        if (el.rsOhms > 0) {
          const j = ref(`${el.name}#j`);
          conductances.push({ a: anode, b: j, g: 1 / (el.leds * el.rsOhms), name: "" });
          anode = j;
        }
        junctions.push({
          a: anode,
          k: ref(el.cathode),
          isA: el.isA,
          nVtV: nVt,
          gminS: gminS / el.leds,
          vcritV: criticalVoltage(el.isA, nVt),
          name: el.name,
        });
        break;
      }
      case "npn":
      case "pnp": {
        // ngspice's BJT has a substrate junction (substrate grounded for three
        // terminals) with no saturation current but GMIN across it: at the
        // collector of a vertical NPN, at the base of a lateral PNP (its
        // default geometry for each type).
        const pnp = el.kind === "pnp";
        conductances.push({ a: ref(pnp ? el.base : el.collector), b: ref(GROUND), g: gminS, name: `${el.name}#sub` });
        transistors.push({
          sign: pnp ? -1 : 1,
          c: ref(el.collector),
          b: ref(el.base),
          e: ref(el.emitter),
          params: { isA: el.isA, betaF: el.betaF, betaR: el.betaR },
          vcritV: criticalVoltage(el.isA, vt),
          name: el.name,
        });
        break;
      }
    }
  }
  const pattern = new SparsePattern(unknownNames.length, stampPositions(conductances, junctions, transistors));
  const n = unknownNames.length;
  let solver: SparseSolver | null = null;
  const mode = settings.linear ?? "auto";
  const split = mode === "split" || (mode === "auto" && ordered.work > SPLIT_WORK) ? Int32Array.from(diodeJunctions) : null;
  return {
    n: unknownNames.length,
    gminS,
    unknownNames,
    fixedNames,
    fixedVolts: Float64Array.from(fixedVolts),
    sourceNames,
    conductances,
    junctions,
    transistors,
    vtV: vt,
    pattern,
    solver: () => (solver ??= new SparseSolver(pattern, ws.listed(n * n))),
    split,
  };
}

// ------------------------------------------------------------ Newton-Raphson

interface NewtonState {
  readonly x: Float64Array;
  /** Junction voltages last evaluated at: diodes, then (vbe, vbc) per transistor. */
  readonly jv: Float64Array;
}

interface NewtonRun {
  readonly converged: boolean;
  readonly iterations: number;
  /** The deadline passed before the run converged. */
  readonly timedOut?: true;
}

/**
 * Writes companion models into the nodal matrix `G` and right-hand side.
 * A class rather than closures: the inner loops call these for every diode
 * in every iteration.
 */
class Stamper {
  constructor(
    readonly G: Float64Array,
    readonly rhs: Float64Array,
    /** Sum of |current| meeting at each node, for the KCL tolerance. */
    readonly scale: Float64Array,
    readonly n: number,
    readonly fixedV: Float64Array,
  ) {}

  /** Coefficient `coef` of node `col` in the KCL row of node `row`. */
  entry(row: NodeRef, col: NodeRef, coef: number): void {
    if (row < 0) return;
    if (col >= 0) this.G[row * this.n + col] = (this.G[row * this.n + col] as number) + coef;
    else this.rhs[row] = (this.rhs[row] as number) - coef * (this.fixedV[-col - 1] as number);
  }

  /** A companion current source leaving `row`, and the true current there for the KCL scale. */
  inject(row: NodeRef, companionA: number, trueA: number): void {
    if (row < 0) return;
    this.rhs[row] = (this.rhs[row] as number) - companionA;
    this.scale[row] = (this.scale[row] as number) + Math.abs(trueA);
  }

  conductance(a: NodeRef, b: NodeRef, g: number): void {
    this.entry(a, a, g);
    this.entry(a, b, -g);
    this.entry(b, b, g);
    this.entry(b, a, -g);
  }

  /**
   * One NPN terminal whose current is i0 + dVbe (vb - ve - vbe) + dVbc (vb - vc - vbc)
   * around the junction voltages (vbe, vbc) it was evaluated at.
   */
  terminal(row: NodeRef, t: Transistor, i0: number, dVbe: number, dVbc: number, vbe: number, vbc: number): void {
    if (row < 0) return;
    this.entry(row, t.b, dVbe + dVbc);
    this.entry(row, t.e, -dVbe);
    this.entry(row, t.c, -dVbc);
    this.inject(row, i0 - dVbe * vbe - dVbc * vbc, i0);
  }
}

/**
 * Runs Newton-Raphson from `st` (updated in place). Convergence needs a step
 * with no junction limited, a last update within 1e-9 relative + 1 µV
 * (SPICE's VNTOL: a node held only by GMIN, such as a dark follower's
 * emitter, is known no better than that in double precision), and
 * Kirchhoff's current law at every node within 1e-15 A + 1e-10 of the
 * currents meeting there (plus the rounding of its terms, at most 1 pA),
 * checked on the unlinearized devices; that is far
 * tighter than SPICE's 0.1 %, so the result is the solution to many digits.
 */
function newton(
  cp: Compiled,
  st: NewtonState,
  fixedV: Float64Array,
  gshuntS: number,
  maxIterations: number,
  first: boolean,
  ws: DcWorkspace,
  deadlineMs: number,
): NewtonRun {
  const n = cp.n;
  const { x, jv } = st;
  const G = ws.buffer("G", n * n);
  const rhs = ws.buffer("rhs", n);
  const scale = ws.buffer("scale", n);
  const b = ws.buffer("b", n);
  const jg = ws.buffer("jg", cp.junctions.length);
  const sp = new Stamper(G, rhs, scale, n, fixedV);
  const volt = (r: NodeRef): number => (r >= 0 ? (x[r] as number) : (fixedV[-r - 1] as number));
  let stepSmall = false;
  let stepWithinReltol = false;
  let useStored = first;
  const nJ = cp.junctions.length;
  G.fill(0);
  for (let it = 1; it <= maxIterations; it++) {
    if (Date.now() > deadlineMs) return { converged: false, iterations: it - 1, timedOut: true };
    cp.pattern.clear(G);
    rhs.fill(0);
    scale.fill(0);
    let limited = false;
    for (let i = 0; i < n; i++) G[i * n + i] = gshuntS;
    for (const c of cp.conductances) {
      sp.conductance(c.a, c.b, c.g);
      const iA = Math.abs(c.g * (volt(c.a) - volt(c.b)));
      if (c.a >= 0) scale[c.a] = (scale[c.a] as number) + iA;
      if (c.b >= 0) scale[c.b] = (scale[c.b] as number) + iA;
    }
    for (let j = 0; j < nJ; j++) {
      const d = cp.junctions[j] as Junction;
      let v = useStored ? (jv[j] as number) : volt(d.a) - volt(d.k);
      if (!useStored) {
        const l = limitJunction(v, jv[j] as number, d.nVtV, d.vcritV);
        if (l !== v) limited = true;
        v = l;
      }
      jv[j] = v;
      const iA = diodeCurrent(v, d.isA, d.nVtV, d.gminS);
      const gS = diodeConductance(v, d.isA, d.nVtV, d.gminS);
      jg[j] = gS;
      sp.conductance(d.a, d.k, gS);
      // Companion source: the part of the current the conductance does not carry.
      const ieq = iA - gS * v;
      sp.inject(d.a, ieq, iA);
      sp.inject(d.k, -ieq, iA);
    }
    for (let q = 0; q < cp.transistors.length; q++) {
      const t = cp.transistors[q] as Transistor;
      const slot = nJ + 2 * q;
      // Junction voltages as the NPN's equations take them (Veb, Vcb for a PNP).
      let vbe = useStored ? (jv[slot] as number) : t.sign * (volt(t.b) - volt(t.e));
      let vbc = useStored ? (jv[slot + 1] as number) : t.sign * (volt(t.b) - volt(t.c));
      if (!useStored) {
        const lbe = limitJunction(vbe, jv[slot] as number, cp.vtV, t.vcritV);
        const lbc = limitJunction(vbc, jv[slot + 1] as number, cp.vtV, t.vcritV);
        if (lbe !== vbe || lbc !== vbc) limited = true;
        vbe = lbe;
        vbc = lbc;
      }
      jv[slot] = vbe;
      jv[slot + 1] = vbc;
      const p = npnTransport(vbe, vbc, t.params, cp.vtV, cp.gminS);
      // Ic and Ib enter c and b; Ie = -(Ic + Ib) leaves e (a PNP's, times -1). The
      // derivatives with respect to the node voltages are the same for both
      // types (the sign enters twice); the companion takes the node voltages.
      const sg = t.sign;
      const nbe = sg * vbe;
      const nbc = sg * vbc;
      sp.terminal(t.c, t, sg * p.icA, p.dIcVbe, p.dIcVbc, nbe, nbc);
      sp.terminal(t.b, t, sg * p.ibA, p.dIbVbe, p.dIbVbc, nbe, nbc);
      sp.terminal(t.e, t, -sg * (p.icA + p.ibA), -(p.dIcVbe + p.dIbVbe), -(p.dIcVbc + p.dIbVbc), nbe, nbc);
    }
    if (!useStored && !limited && stepSmall && kclHolds(G, rhs, x, scale, cp.pattern)) return { converged: true, iterations: it };
    // The budget spent in a limit cycle within SPICE's own RELTOL (a node that
    // floats on picoamperes behind a small resistor, such as a dark
    // follower's emitter, moves by rounding): converged if KCL holds.
    if (it === maxIterations && !useStored && !limited && stepWithinReltol && kclHolds(G, rhs, x, scale, cp.pattern)) {
      return { converged: true, iterations: it };
    }
    useStored = false;
    if (!linearStep(cp, G, rhs, x, b, jg, ws)) return { converged: false, iterations: it };
    stepSmall = true;
    stepWithinReltol = true;
    for (let i = 0; i < n; i++) {
      const xi = x[i] as number;
      const bi = b[i] as number;
      const step = Math.abs(bi - xi);
      const size = Math.max(Math.abs(bi), Math.abs(xi));
      if (step > 1e-9 * size + VNTOL_V) stepSmall = false;
      if (step > SPICE_RELTOL * size + VNTOL_V) stepWithinReltol = false;
      x[i] = bi;
    }
  }
  return { converged: false, iterations: maxIterations };
}

/**
 * Solves one Newton step's system `G x = rhs` into `out`; false when it is
 * singular. `G` (zero outside the circuit's pattern) is overwritten inside
 * the pattern.
 *
 * The split solve, where the circuit has one, eliminates the matrix without
 * the couplings of the idle diodes (`IDLE_FRACTION`; their conductance stays
 * on the diagonal), whose elimination fills in little (the whole matrix's
 * fills a dense block of every line and output of a big matrix), and refines from
 * `start` (the Newton iterate, near the answer) with the residual of the
 * whole matrix, y += M^-1 (rhs - G y), until every row's residual is down
 * to the rounding of its terms (`BACKWARD_ERROR`): what a direct solve
 * leaves. An idle diode couples its
 * nodes by nanosiemens against the millisiemens that hold them, so every
 * refinement gains digits. Where it does not converge the step is solved
 * directly.
 *
 * @param jg each junction's conductance as stamped in `G`, siemens
 */
function linearStep(
  cp: Compiled,
  G: Float64Array,
  rhs: Float64Array,
  start: Float64Array,
  out: Float64Array,
  jg: Float64Array,
  ws: DcWorkspace,
): boolean {
  if (cp.split !== null && splitSolve(cp, cp.split, G, rhs, start, out, jg, ws)) return true;
  out.set(rhs);
  return cp.solver().solve(G, out);
}

/** The split solve of `linearStep`; false when it does not converge (`out` then holds nothing of use, `G` is as it was). */
function splitSolve(
  cp: Compiled,
  diodes: Int32Array,
  G: Float64Array,
  rhs: Float64Array,
  start: Float64Array,
  out: Float64Array,
  jg: Float64Array,
  ws: DcWorkspace,
): boolean {
  const n = cp.n;
  const y = ws.buffer("refined", n);
  const { rowStart, cols } = cp.pattern;
  // G's entries in the pattern's order: the residuals take them from here, and G is put back from them.
  const values = ws.buffer("values", cols.length);
  for (let i = 0; i < n; i++) {
    const row = i * n;
    const end = rowStart[i + 1] as number;
    for (let c = rowStart[i] as number; c < end; c++) values[c] = G[row + (cols[c] as number)] as number;
  }
  // The split matrix, in G's place: the idle diodes' couplings taken out.
  for (let q = 0; q < diodes.length; q++) {
    const d = cp.junctions[diodes[q] as number] as Junction;
    if (d.a < 0 || d.k < 0) continue;
    const g = jg[diodes[q] as number] as number;
    if (g * g > IDLE_FRACTION * IDLE_FRACTION * (G[d.a * n + d.a] as number) * (G[d.k * n + d.k] as number)) continue;
    G[d.a * n + d.k] = 0;
    G[d.k * n + d.a] = 0;
  }
  const solver = cp.solver();
  const factored = solver.factor(G);
  let done = false;
  if (factored) {
    y.set(start);
    // The backward errors of the last two rounds: an idle diode's node follows its neighbours a round late, so progress shows over two.
    let last = Infinity;
    let before = Infinity;
    for (let round = 0; round < MAX_REFINEMENTS; round++) {
      // The residual of the whole matrix, and the largest of it against the terms it sums (the backward error).
      let backward = 0;
      for (let i = 0; i < n; i++) {
        let r = rhs[i] as number;
        let size = Math.abs(r);
        const end = rowStart[i + 1] as number;
        for (let c = rowStart[i] as number; c < end; c++) {
          const t = (values[c] as number) * (y[cols[c] as number] as number);
          r -= t;
          size += Math.abs(t);
        }
        out[i] = r;
        if (size > 0) backward = Math.max(backward, Math.abs(r) / size);
      }
      // Solved to rounding (y solves a system within a few units in the last place of this one), or stalled a little short of it.
      const stalled = backward > before / 2;
      if (backward <= BACKWARD_ERROR || (stalled && backward <= STALL_ERROR)) {
        done = true;
        break;
      }
      // No progress over two rounds: the split matrix is too far from the whole one here.
      if (stalled) break;
      before = last;
      last = backward;
      // substitute checks the update is finite.
      if (!solver.substitute(out)) break;
      for (let i = 0; i < n; i++) y[i] = (y[i] as number) + (out[i] as number);
    }
  }
  solver.release();
  for (let i = 0; i < n; i++) {
    const row = i * n;
    const end = rowStart[i + 1] as number;
    for (let c = rowStart[i] as number; c < end; c++) G[row + (cols[c] as number)] = values[c] as number;
  }
  if (done) out.set(y);
  return done;
}

/**
 * Rounding allowance of a KCL residual, relative to the sum of the
 * magnitudes of its terms: a few units in the last place of double
 * precision. A small resistor between two nodes near the same voltage (a
 * dark segment's 0.5 Ω behind a 12 V supply) has terms of amperes that
 * cancel to picoamperes, and no solver gets that residual below their
 * rounding. The allowance never exceeds SPICE's ABSTOL, 1 pA, so a
 * conductance that swamps every other one (1e300 S) still fails the check.
 */
const KCL_ROUNDING = 1e-14;
/** SPICE's ABSTOL, amperes: the most the rounding allowance may add. */
const ABSTOL_A = 1e-12;

/** Kirchhoff's current law at x: (G x - rhs) is the sum of currents leaving each node. */
function kclHolds(G: Float64Array, rhs: Float64Array, x: Float64Array, scale: Float64Array, pattern: SparsePattern): boolean {
  const { n, rowStart, cols } = pattern;
  for (let i = 0; i < n; i++) {
    let r = -(rhs[i] as number);
    let size = Math.abs(rhs[i] as number);
    const row = i * n;
    const end = rowStart[i + 1] as number;
    for (let c = rowStart[i] as number; c < end; c++) {
      const j = cols[c] as number;
      const g = G[row + j] as number;
      if (g !== 0) {
        const t = g * (x[j] as number);
        r += t;
        size += Math.abs(t);
      }
    }
    if (!(Math.abs(r) <= 1e-15 + 1e-10 * (scale[i] as number) + Math.min(ABSTOL_A, KCL_ROUNDING * size))) return false;
  }
  return true;
}

// ------------------------------------------------------------ the solve

/**
 * Scratch arrays a caller may share between solves (say, every state of one
 * matrix) so that the large nodal matrix is allocated once, not per solve.
 * Holds no results; solves with and without one give the same numbers.
 */
export class DcWorkspace {
  readonly #buffers = new Map<string, Float64Array>();

  #listed: Uint8Array | undefined;

  /** Elimination orders and their work by digest of a circuit's connections (see `eliminationOrder`); the last few only. */
  readonly #orders = new Map<string, { readonly order: Int32Array; readonly work: number }>();

  /** The elimination order kept under `key`, worked out by `make` the first time. */
  order(
    key: string,
    make: () => { readonly order: Int32Array; readonly work: number },
  ): { readonly order: Int32Array; readonly work: number } {
    const have = this.#orders.get(key);
    if (have) return have;
    const fresh = make();
    if (this.#orders.size >= 8) this.#orders.delete(this.#orders.keys().next().value as string);
    this.#orders.set(key, fresh);
    return fresh;
  }

  /** Work space of at least `length` bytes for `SparseSolver`, shared by every solve. */
  listed(length: number): Uint8Array {
    if (!this.#listed || this.#listed.length < length) this.#listed = new Uint8Array(length);
    return this.#listed;
  }

  /** A scratch array of `length` doubles; its contents are whatever the last user left. */
  buffer(name: string, length: number): Float64Array {
    const have = this.#buffers.get(name);
    if (have && have.length >= length) return have.subarray(0, length);
    const fresh = new Float64Array(length);
    this.#buffers.set(name, fresh);
    return fresh;
  }
}

/**
 * Solves one circuit's DC operating point.
 *
 * Starts from the circuit's own guess (`guess`, node voltages), else from
 * SPICE's junction initialisation (every junction at vcrit, base-collector
 * at 0). Falls back to gmin stepping, then source stepping.
 *
 * @example
 * const op = solveDc(buildCircuit(spec, matrix, project.electrical, 0));
 * if (op.ok) op.value.voltages["o1a"]; // ~1.96 V for a lit segment
 */
export function solveDc(
  circuit: Circuit,
  guess?: Readonly<Record<string, number>>,
  settings: DcSettings = DEFAULT_DC_SETTINGS,
  workspace: DcWorkspace = new DcWorkspace(),
): Result<OperatingPoint, DcFailure> {
  const cp = compile(circuit, settings, workspace);
  const jCount = cp.junctions.length + 2 * cp.transistors.length;
  const fresh = (): NewtonState => {
    const x = new Float64Array(cp.n);
    const jv = new Float64Array(jCount);
    if (guess) {
      cp.unknownNames.forEach((nd, i) => (x[i] = guess[nd] ?? 0));
      const volt = (r: NodeRef): number => (r >= 0 ? (x[r] as number) : (cp.fixedVolts[-r - 1] as number));
      cp.junctions.forEach((d, j) => (jv[j] = volt(d.a) - volt(d.k)));
      cp.transistors.forEach((t, q) => {
        jv[cp.junctions.length + 2 * q] = t.sign * (volt(t.b) - volt(t.e));
        jv[cp.junctions.length + 2 * q + 1] = t.sign * (volt(t.b) - volt(t.c));
      });
    } else {
      cp.junctions.forEach((d, j) => (jv[j] = d.vcritV));
      cp.transistors.forEach((t, q) => (jv[cp.junctions.length + 2 * q] = t.vcritV));
    }
    return { x, jv };
  };
  let total = 0;
  const deadline = settings.deadlineMs ?? Infinity;

  const tries = new Set(settings.methods);
  let st = fresh();
  let run: NewtonRun;

  // 1. Plain Newton.
  if (tries.has("newton")) {
    run = newton(cp, st, cp.fixedVolts, 0, settings.maxIterations, true, workspace, deadline);
    total += run.iterations;
    if (run.timedOut) return fail(timeLimit(circuit, total));
    if (run.converged) return ok(result(circuit, cp, st, "newton", total));
  }

  // 2. gmin stepping: 1e10 x GMIN from every node to ground, a decade at a time.
  if (tries.has("gmin-stepping")) {
    st = fresh();
    let good = true;
    for (let g = 1e10 * settings.gminS, first = true; good; g /= 10, first = false) {
      const gs = g < settings.gminS * 0.5 ? 0 : g;
      run = newton(cp, st, cp.fixedVolts, gs, settings.maxIterations, first, workspace, deadline);
      total += run.iterations;
      if (run.timedOut) return fail(timeLimit(circuit, total));
      good = run.converged;
      if (gs === 0) break;
    }
    if (good) return ok(result(circuit, cp, st, "gmin-stepping", total));
  }

  // 3. Source stepping: every source ramped from 0 to full strength.
  if (!tries.has("source-stepping")) return fail(noConvergence(circuit, total));
  st = { x: new Float64Array(cp.n), jv: new Float64Array(jCount) };
  let lambda = 0;
  let step = 0.1;
  const scaled = new Float64Array(cp.fixedVolts.length);
  while (lambda < 1) {
    const next = Math.min(1, lambda + step);
    for (let k = 0; k < scaled.length; k++) scaled[k] = (cp.fixedVolts[k] as number) * next;
    const saved: NewtonState = { x: st.x.slice(), jv: st.jv.slice() };
    run = newton(cp, st, scaled, 0, settings.maxIterations, false, workspace, deadline);
    total += run.iterations;
    if (run.timedOut) return fail(timeLimit(circuit, total));
    if (run.converged) {
      lambda = next;
      step = Math.min(0.25, step * 1.5);
    } else {
      st = saved;
      step /= 4;
      if (step < 1e-6) break;
    }
  }
  if (lambda >= 1) return ok(result(circuit, cp, st, "source-stepping", total));
  return fail(noConvergence(circuit, total));
}

function timeLimit(circuit: Circuit, iterations: number): DcFailure {
  return {
    state: circuit.state,
    message: `the time limit ran out while solving state ${circuit.state} (after ${iterations} Newton iterations)`,
    timeLimit: true,
  };
}

function noConvergence(circuit: Circuit, iterations: number): DcFailure {
  return {
    state: circuit.state,
    message:
      `the DC solver did not converge for state ${circuit.state} (Newton, gmin stepping and source stepping all failed ` +
      `after ${iterations} iterations); check the electrical values for extremes`,
  };
}

function result(circuit: Circuit, cp: Compiled, st: NewtonState, method: DcMethod, iterations: number): OperatingPoint {
  const voltages: Record<string, number> = {};
  cp.fixedNames.forEach((nd, k) => (voltages[nd] = cp.fixedVolts[k] as number));
  cp.unknownNames.forEach((nd, i) => (voltages[nd] = st.x[i] as number));
  const volt = (r: NodeRef): number => (r >= 0 ? (st.x[r] as number) : (cp.fixedVolts[-r - 1] as number));
  const currents: Record<string, number> = {};
  const substrate = new Map<string, number>();
  for (const c of cp.conductances) {
    if (c.name.endsWith("#sub")) substrate.set(c.name.slice(0, -4), c.g * (volt(c.a) - volt(c.b)));
    else if (c.name !== "") currents[c.name] = c.g * (volt(c.a) - volt(c.b));
  }
  for (const d of cp.junctions) currents[d.name] = diodeJunction(volt(d.a) - volt(d.k), d.isA, d.nVtV, d.gminS).currentA;
  const transistors: Record<string, TransistorCurrents> = {};
  for (const t of cp.transistors) {
    const vbe = t.sign * (volt(t.b) - volt(t.e));
    const vbc = t.sign * (volt(t.b) - volt(t.c));
    const p = npnTransport(vbe, vbc, t.params, cp.vtV, cp.gminS);
    transistors[t.name] = { icA: p.icA, ibA: p.ibA, ieA: p.icA + p.ibA, substrateA: substrate.get(t.name) ?? 0 };
  }
  // A source delivers what its node's other elements draw (KCL at that node).
  const drawn = sourceDraws(circuit, currents, transistors);
  for (const el of circuit.elements) if (el.kind === "vsource") currents[el.name] = drawn.get(el.node) ?? 0;
  return { state: circuit.state, method, iterations, voltages, currents, transistors };
}

/** Current the elements draw out of every node, amperes (used at source nodes). */
function sourceDraws(
  circuit: Circuit,
  currents: Readonly<Record<string, number>>,
  transistors: Readonly<Record<string, TransistorCurrents>>,
): Map<string, number> {
  const out = new Map<string, number>();
  const add = (node: string, i: number): void => void out.set(node, (out.get(node) ?? 0) + i);
  for (const el of circuit.elements) {
    switch (el.kind) {
      case "resistor": {
        const i = currents[el.name] as number;
        add(el.a, i);
        add(el.b, -i);
        break;
      }
      case "diode":
      case "segment": {
        const i = currents[el.name] as number;
        add(el.anode, i);
        add(el.cathode, -i);
        break;
      }
      case "npn": {
        const t = transistors[el.name] as TransistorCurrents;
        add(el.collector, t.icA + t.substrateA);
        add(el.base, t.ibA);
        add(el.emitter, -t.ieA);
        break;
      }
      case "pnp": {
        const t = transistors[el.name] as TransistorCurrents;
        add(el.collector, -t.icA);
        add(el.base, -t.ibA + t.substrateA);
        add(el.emitter, t.ieA);
        break;
      }
      case "vsource":
        break;
    }
  }
  return out;
}
