/**
 * Synthesis of a decoder whose outputs may be decoded dark: the decode spec
 * says which polarity each output may take (`spec.polarity.allowed`), and
 * what a dark-decoded output's input network costs in diodes. The objective
 * is every diode the decoder needs: the matrix's plus the level-shift diodes
 * of the dark-decoded outputs.
 *
 * - `dark` (every output dark) is the lit problem on the dark cells with the
 *   active-low lines as its rows (polarityProblem.ts): the heuristic and the
 *   exact stage of the lit decoder solve it unchanged, and the input network
 *   adds the same number whatever the matrix.
 * - `either` chooses per output. The heuristic tries every output lit,
 *   every output dark, each output by its fewer cells, each display
 *   position by its cheaper side, then flips single outputs while that
 *   pays. The exact stage solves the covering model over both polarities of
 *   every output with a choice variable per output (polarityExact.ts).
 *
 * Every result goes through the verifier, which walks both directions.
 */
import type { DecodeSpec, OutputPolarity } from "../spec/decodeSpec.ts";
import { buildMatrix, type DiodeMatrix, type InputNetwork, type VerifiedMatrix } from "../matrix/matrix.ts";
import { fail, type Result } from "../result/result.ts";
import { defaultHighsLoader, exactPlan } from "./exact.ts";
import { HEURISTIC_DEFAULT_WORK, heuristicPlan } from "./heuristic.ts";
import { directPlan, planCount, type SharingPlan, type SharingRules } from "./plan.ts";
import { choiceEdges, choiceProblem, outputGroups } from "./polarityProblem.ts";
import { eitherExact } from "./polarityExact.ts";
import { comparePlans } from "./tieBreak.ts";
import { deadlineMarginMs, workBudget } from "./workBudget.ts";
import { WorkMeter } from "./workMeter.ts";
import { verified, type SynthFailure, type SynthHooks, type SynthSettings } from "./synthesize.ts";

/** A plan of a choice problem and the choice it is for. */
export interface ChosenPlan {
  readonly choice: readonly OutputPolarity[];
  readonly plan: SharingPlan;
}

/** Most single-output flips the `either` heuristic tries, per output. */
const FLIPS_PER_OUTPUT = 3;

/**
 * Synthesizes a decoder with dark-decoded outputs (`spec.polarity.decode`
 * `dark` or `either`); a lit-only spec belongs to `synthesize`.
 */
export async function synthesizePolarity(
  spec: DecodeSpec,
  settings: SynthSettings,
  hooks: SynthHooks = {},
): Promise<Result<VerifiedMatrix, SynthFailure>> {
  const pol = spec.polarity;
  const per = pol.inputDiodes;
  if (per === null) {
    const last = pol.levelShift.steps[pol.levelShift.steps.length - 1];
    return fail({
      kind: "infeasible",
      message:
        `a dark-decoded output pulled down to ${pol.levelShift.nodeLowV.toFixed(2)} V keeps its driver on even behind ` +
        `${last?.diodes ?? 0} level-shift diodes (${((last?.collectorA ?? 0) * 1e6).toFixed(0)} µA, the ghost limit is ${(pol.levelShift.ghostA * 1e6).toFixed(0)} µA); ` +
        `use "darkInput": "divider", a lower depth limit, a stiffer low line (electrical.lowLine) or "decode": "lit"`,
    });
  }
  const rules: SharingRules = { depthLimit: settings.depthLimit, policy: settings.policy, buses: settings.buses, links: settings.links };
  const m = spec.outputs.length;
  const cost = (c: ChosenPlan): number => planCount(c.plan) + per * c.choice.filter((x) => x === "dark").length;
  // One polarity where the spec allows one (a high-side switch's `either` is lit).
  const allowedAll = new Set(pol.allowed.flat());
  const only = allowedAll.size === 1 ? ([...allowedAll][0] as OutputPolarity) : null;
  const fixed: OutputPolarity | null = pol.decode === "dark" ? "dark" : pol.decode === "lit" ? "lit" : only;
  const sharing = m > 0 && settings.depthLimit >= 2 && (settings.buses || (settings.links && settings.policy !== "uniform"));

  const started = Date.now();
  const deadlineMs = started + settings.timeLimitMs - deadlineMarginMs(settings.timeLimitMs);
  const budget = workBudget(settings.timeLimitMs);
  const meter = new WorkMeter(Math.min(budget.heuristicWork, HEURISTIC_DEFAULT_WORK), deadlineMs);

  const fewerCells = spec.outputs.map((_, o): OutputPolarity => {
    if (fixed) return fixed;
    const lit = spec.lit.filter((r) => r[o]).length;
    return lit <= spec.lit.length - lit + per ? "lit" : "dark";
  });
  const directOf = (choice: readonly OutputPolarity[]): ChosenPlan => ({ choice, plan: directPlan(choiceProblem(spec, choice)) });
  if (settings.mode === "direct" || !sharing) {
    const d = directOf(fewerCells);
    const proven = !sharing ? cost(d) : null;
    return verified(spec, polarityMatrix(spec, d, settings, proven, "direct", false), settings);
  }

  const heuristic = fixed ? fixedHeuristic(spec, rules, fixed, meter) : eitherHeuristic(spec, rules, per, fewerCells, meter);
  const fast = verified(spec, polarityMatrix(spec, heuristic, settings, null, "heuristic", meter.deadlineHit), settings);
  if (!fast.ok || settings.mode === "fast") return fast;
  hooks.onProgress?.({ stage: "heuristic", count: cost(heuristic), lowerBound: null });

  const opts = {
    timeLimitMs: settings.timeLimitMs,
    deadlineMs,
    budget,
    seed: settings.seed,
    loadHighs: hooks.loadHighs ?? defaultHighsLoader,
  };
  let best: ChosenPlan;
  let lowerBound: number | null;
  let deadlineHit = meter.deadlineHit;
  let method: "exact" | "heuristic" = "exact";
  if (fixed) {
    const exact = await exactPlan(choiceProblem(spec, heuristic.choice), rules, heuristic.plan, opts);
    best = { choice: heuristic.choice, plan: exact.plan };
    const input = per * heuristic.choice.filter((x) => x === "dark").length;
    lowerBound = exact.lowerBound + input;
    deadlineHit ||= exact.deadlineHit;
    if (exact.status === "solver-failed") method = "heuristic";
  } else {
    const exact = await eitherExact(spec, rules, per, heuristic, opts);
    best = cost(exact.best) <= cost(heuristic) ? exact.best : heuristic;
    lowerBound = exact.lowerBound;
    deadlineHit ||= exact.deadlineHit;
    if (exact.status === "solver-failed") method = "heuristic";
  }
  const total = cost(best);
  if (lowerBound !== null) lowerBound = Math.min(lowerBound, total);
  const result = verified(spec, polarityMatrix(spec, best, settings, lowerBound, method, deadlineHit), settings);
  if (result.ok) hooks.onProgress?.({ stage: "exact", count: total, lowerBound });
  return result;
}

/** The heuristic on one fixed polarity for every output. */
function fixedHeuristic(spec: DecodeSpec, rules: SharingRules, polarity: OutputPolarity, meter: WorkMeter): ChosenPlan {
  const choice = spec.outputs.map(() => polarity);
  return { choice, plan: heuristicPlan(choiceProblem(spec, choice), rules, { meter }) };
}

/**
 * The `either` heuristic: the best of several choices, each covered by the
 * lit decoder's heuristic, then single-output flips while one pays. Every
 * cover gets an even portion of what is left of the meter.
 */
export function eitherHeuristic(
  spec: DecodeSpec,
  rules: SharingRules,
  per: number,
  fewerCells: readonly OutputPolarity[],
  meter: WorkMeter,
): ChosenPlan {
  const m = spec.outputs.length;
  const darkCount = (c: readonly OutputPolarity[]): number => c.filter((x) => x === "dark").length;
  const cost = (c: ChosenPlan): number => planCount(c.plan) + per * darkCount(c.choice);
  const cache = new Map<string, ChosenPlan>();
  const starts = 4;
  const flips = FLIPS_PER_OUTPUT * m;
  let left = starts + flips + 1;
  const cover = (choice: readonly OutputPolarity[]): ChosenPlan => {
    const key = choice.join();
    const hit = cache.get(key);
    if (hit) return hit;
    const portion = meter.portion(Math.max(1, left));
    left = Math.max(1, left - 1);
    const p = choiceProblem(spec, choice);
    const plan = heuristicPlan(p, rules, { meter: portion });
    meter.settle(portion);
    const out = { choice: [...choice], plan };
    cache.set(key, out);
    return out;
  };
  const better = (a: ChosenPlan, b: ChosenPlan): boolean => {
    const d = cost(a) - cost(b);
    return d < 0 || (d === 0 && comparePlans(a.plan, b.plan) < 0);
  };
  const allLit = spec.outputs.map((): OutputPolarity => "lit");
  const allDark = spec.outputs.map((): OutputPolarity => "dark");
  let best = cover(allLit);
  for (const c of [allDark, fewerCells]) {
    const x = cover(c);
    if (better(x, best)) best = x;
  }
  // Each display position on its cheaper side, judged on the whole problem's covers of both.
  const groups = outputGroups(spec);
  const litCover = cover(allLit);
  const darkCover = cover(allDark);
  const perGroup = spec.outputs.map((_, o): OutputPolarity => {
    const g = groups[o];
    const inGroup = (j: number): boolean => groups[j] === g;
    const share = (c: ChosenPlan): number =>
      groupCost(c.plan, inGroup) + per * c.choice.filter((x, j) => x === "dark" && inGroup(j)).length;
    return share(darkCover) < share(litCover) ? "dark" : "lit";
  });
  const byGroup = cover(perGroup);
  if (better(byGroup, best)) best = byGroup;
  // Single-output flips, first improvement, while the meter lasts.
  let tried = 0;
  let improved = true;
  while (improved && tried < flips && !meter.spent()) {
    improved = false;
    for (let o = 0; o < m && tried < flips && !meter.spent(); o++) {
      const next = [...best.choice];
      next[o] = next[o] === "dark" ? "lit" : "dark";
      if (cache.has(next.join())) continue;
      tried++;
      const x = cover(next);
      if (better(x, best)) {
        best = x;
        improved = true;
      }
    }
  }
  return best;
}

/** The diodes of a plan that serve the outputs `inGroup` picks (a bus's inputs shared out by its outputs). */
function groupCost(plan: SharingPlan, inGroup: (o: number) => boolean): number {
  let c = 0;
  for (const [, o] of plan.direct) if (inGroup(o)) c++;
  for (const l of plan.links) if (inGroup(l.to)) c++;
  for (const b of plan.buses) {
    const mine = b.outputs.filter(inGroup).length;
    c += mine + (b.states.length * mine) / b.outputs.length;
  }
  return c;
}

/** The matrix of a chosen plan, with its decode and input network. */
export function polarityMatrix(
  spec: DecodeSpec,
  chosen: ChosenPlan,
  s: Pick<SynthSettings, "depthLimit" | "policy">,
  lowerBound: number | null,
  method: "direct" | "heuristic" | "exact",
  deadlineHit: boolean,
): DiodeMatrix {
  const pol = spec.polarity;
  // buildMatrix orders diodes from the lines it is given: every line, so none is taken for a bus.
  const view: DecodeSpec = { ...spec, states: [...spec.states.map((_, k) => `S${k}`), ...spec.states.map((_, k) => `nS${k}`)] };
  // A high-side switch's node needs no input network: its own resistors pull it up.
  const dark = pol.inverting ? 0 : chosen.choice.filter((x) => x === "dark").length;
  const inputNetwork: InputNetwork | undefined =
    dark > 0
      ? { kind: pol.darkInput, outputs: dark, diodes: (pol.inputDiodes ?? 0) * dark, resistors: pol.inputResistors * dark }
      : undefined;
  const built = buildMatrix(view, choiceEdges(spec, chosen.plan), {
    lowerBound,
    optimal: false,
    depthLimit: s.depthLimit,
    policy: s.policy,
    method,
    deadlineHit,
  });
  const decode = Object.fromEntries(spec.outputs.map((o, j) => [o, chosen.choice[j] ?? "lit"]));
  const total = built.count + (inputNetwork?.diodes ?? 0);
  return {
    ...built,
    states: spec.states,
    lines: spec.lines,
    decode,
    ...(inputNetwork ? { inputNetwork } : {}),
    optimal: lowerBound !== null && lowerBound === total,
  };
}
