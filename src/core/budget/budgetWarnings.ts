/**
 * The budget's findings, most severe first. Thresholds are the parts' own
 * ratings from the project, the counter line's `maxCurrentA` and the
 * `ghostFraction` of the target; the 10 % spread notes are a choice of
 * diodeloom. Each finding carries its figures in SI; the reports put them
 * in words (render/budgetWarningText.ts).
 */
import type { Project } from "../project/project.ts";
import { carriedVoltages, safetyCautions, type WarningLevel } from "./safety.ts";
import type { Budget, BudgetWarning, UnappliedWhy } from "./budgetTypes.ts";
import type { StateSpreadWarning } from "./stateSpread.ts";

/** Brightness spread above which the budget adds a note, percent (a choice of diodeloom). */
export const SPREAD_NOTE_PCT = 10;

/** Why the design does not take a worked-out trim, or null when it does (or the trim changes nothing). */
export function unappliedWhy(trim: Budget["trim"]): UnappliedWhy | null {
  if (trim.applied || trim.effect === "no-change") return null;
  if (trim.mode === "off") return "turned-off";
  return trim.effect === "improves" ? null : trim.effect;
}

/** Most ghost findings listed, the worst first; the rest follow from the same cause. */
const MAX_GHOSTS = 12;

/**
 * The findings of a budget, most severe first.
 *
 * @param spreads the state-spread findings (stateSpread.ts), worked out from the solved states
 */
export function budgetWarnings(
  project: Project,
  b: Omit<Budget, "warnings">,
  spreads: readonly StateSpreadWarning[] = [],
): BudgetWarning[] {
  const e = project.electrical;
  const w: BudgetWarning[] = [];
  const volts = carriedVoltages(e);
  for (const c of safetyCautions(volts)) {
    w.push(
      c.code === "hazardous-voltage" ? { level: "danger", code: c.code, supplyV: Math.max(...volts) } : { level: "danger", code: c.code },
    );
  }
  if (b.coverage !== undefined) {
    const { checked, states, timeLimitMs } = b.coverage;
    w.push({ level: "warn", code: "states-unchecked", checked, states, timeLimitMs });
  }
  for (const [ref, d] of Object.entries(b.diodes)) {
    if (d.maxCurrentA > d.ratedCurrentA) {
      w.push({
        level: "warn",
        code: "diode-current",
        diode: ref,
        from: d.from,
        to: d.to,
        currentA: d.maxCurrentA,
        ratedA: d.ratedCurrentA,
      });
    }
    if (d.maxReverseV > d.ratedReverseV) {
      w.push({
        level: "warn",
        code: "diode-reverse",
        diode: ref,
        from: d.from,
        to: d.to,
        reverseV: d.maxReverseV,
        ratedV: d.ratedReverseV,
      });
    }
  }
  const hi = b.corners.high;
  const lo = b.corners.low;
  for (const [o, d] of Object.entries(b.drivers)) {
    const transistor = d.transistor;
    if (transistor === null) continue;
    const vceV = Math.max(d.maxVceV, hi.maxVceV);
    if (vceV > d.ratedVceV) w.push({ level: "warn", code: "driver-vce", transistor, output: o, vceV, ratedV: d.ratedVceV });
    const powerW = Math.max(d.maxPowerW, hi.maxPowerW);
    if (powerW > d.ratedPowerW) w.push({ level: "warn", code: "driver-power", transistor, output: o, powerW, ratedW: d.ratedPowerW });
    if (d.maxCollectorA > d.ratedCollectorA) {
      w.push({ level: "warn", code: "driver-current", transistor, output: o, currentA: d.maxCollectorA, ratedA: d.ratedCollectorA });
    }
    if (d.headroomV !== null && d.headroomV <= 0) {
      w.push({ level: "warn", code: "driver-saturation", transistor, output: o, supplyV: e.supply.minVolts, belowV: -d.headroomV });
    }
    if (d.saturated === false) {
      w.push({ level: "warn", code: "switch-unsaturated", transistor, output: o, forcedBeta: d.forcedBeta, betaMin: e.tolerance.betaMin });
    }
  }
  if (
    lo.minHeadroomV !== null &&
    lo.minHeadroomV <= 0 &&
    Object.values(b.drivers).some((d) => d.transistor !== null) &&
    Object.values(b.drivers).every((d) => d.headroomV === null || d.headroomV > 0)
  ) {
    w.push({ level: "warn", code: "corner-saturation", belowV: -lo.minHeadroomV });
  }
  const maxA = Math.max(0, ...Object.values(b.outputs).map((o) => o.maxA), hi.maxCurrentA);
  if (maxA > e.segment.maxA) w.push({ level: "warn", code: "segment-current", currentA: maxA, ratedA: e.segment.maxA });
  for (const [line, c] of Object.entries(b.counterLines)) {
    if (c.sourceCurrentA > c.ratedA)
      w.push({ level: "warn", code: "line-current", line, state: c.sourceState ?? line, currentA: c.sourceCurrentA, ratedA: c.ratedA });
    if (c.sinkCurrentA > c.ratedA)
      w.push({
        level: "warn",
        code: "line-sink",
        line,
        state: c.sinkState ?? line,
        currentA: c.sinkCurrentA,
        ratedA: c.ratedA,
        from: e.driver.kind === "high-side-switch" ? "switch-bases" : "gate-pull-ups",
      });
  }
  const targetA = e.segment.targetA;
  if (b.dark !== null && !b.dark.passes) w.push({ level: "warn", code: "dark-network", broken: b.dark.broken, where: b.dark.verdict });
  const limitA = e.ghostFraction * targetA;
  const ghosts: Extract<BudgetWarning, { code: "ghost-segment" }>[] = [];
  for (const s of b.states) {
    for (const [o, x] of Object.entries(s.outputs)) {
      if (!x.lit && x.segmentA > limitA)
        ghosts.push({ level: "warn", code: "ghost-segment", output: o, state: s.state, currentA: x.segmentA, limitA });
    }
  }
  w.push(...ghosts.sort((a, c) => c.currentA - a.currentA).slice(0, MAX_GHOSTS));
  const windowPct = b.corners.windowPct;
  const windowLowA = targetA * (1 - windowPct / 100);
  const why = unappliedWhy(b.trim);
  for (const [o, r] of Object.entries(b.outputs)) {
    if (r.maxA > 0 && r.minA < windowLowA) {
      const t = b.trim.outputs[o];
      const helps =
        t !== undefined && why !== null && Math.abs((t.minA + t.maxA) / 2 - targetA) < Math.abs((r.minA + r.maxA) / 2 - targetA);
      w.push({
        level: "warn",
        code: "dim-segment",
        output: o,
        minA: r.minA,
        targetA,
        windowPct,
        unappliedTrim: helps && t ? { series: b.trim.series, ohms: t.ohms, why, minA: t.minA, maxA: t.maxA, spreadPct: t.spreadPct } : null,
      });
    }
  }
  if (!b.corners.meetsTarget) {
    w.push({
      level: "warn",
      code: "corner-target",
      minA: lo.minCurrentA,
      maxA: hi.maxCurrentA,
      targetA,
      windowPct,
      shortOf: b.corners.shortOf,
      unsaturated: Object.entries(b.drivers)
        .filter(([, d]) => d.saturated === false)
        .map(([o]) => o),
      maxRatedA: b.maxA,
      trimApplied: b.trim.applied,
      kind: b.kind,
      darkInput: b.dark?.input ?? null,
      deeperPaths: Object.values(b.outputs).some((o) => o.pathLengths.some((n) => n > 1)),
    });
  }
  w.push(...spreads);
  if (b.spreadPct > SPREAD_NOTE_PCT) {
    const trimmed = b.trim.applied;
    w.push({
      level: "info",
      code: "brightness-spread",
      spreadPct: b.spreadPct,
      series: b.trim.series,
      trim: trimmed ? "applied" : (why ?? "no-change"),
      otherSpreadPct: trimmed ? b.trim.spreadPctBefore : b.trim.spreadPct,
    });
  }
  // A high-side switch's lines are active-low: they sink, and never sag under a load they source.
  const sags = b.kind === "high-side-switch" ? [] : Object.entries(b.counterLines);
  if (sags.length > 0) {
    const [line, worst] = sags.reduce((a, c) => (c[1].sagV > a[1].sagV ? c : a));
    w.push({ level: "info", code: "counter-sag", line, sagV: worst.sagV, sourceCurrentA: worst.sourceCurrentA });
  }
  const order: Record<WarningLevel, number> = { danger: 0, warn: 1, info: 2 };
  return w.sort((a, c) => order[a.level] - order[c.level]);
}
