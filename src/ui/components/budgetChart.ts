/**
 * Geometry of the budget chart: one row per output, the string current of
 * every lit state as a tick on a shared current axis, the design's min-max
 * band, the band the trim gives, and the target as a vertical line. Pure,
 * so the scale can be checked without a DOM.
 */
import type { Budget } from "../../core/budget/budgetTypes.ts";
import { microampsShort } from "../../render/units.ts";

export interface ChartRow {
  readonly output: string;
  readonly y: number;
  /** x of every lit state's current, with the state name. */
  readonly ticks: readonly { readonly x: number; readonly state: string; readonly currentA: number }[];
  readonly band: { readonly x0: number; readonly x1: number };
  readonly trimmed: { readonly x0: number; readonly x1: number } | null;
  readonly spreadPct: number;
}

export interface BudgetChart {
  readonly width: number;
  readonly height: number;
  readonly plotX0: number;
  readonly plotX1: number;
  readonly targetX: number;
  /** Axis ticks: x and the label in `unit`. */
  readonly axis: readonly { readonly x: number; readonly label: string }[];
  /** The axis unit: mA from a 0.1 mA target up, else µA. */
  readonly unit: "mA" | "µA";
  readonly rows: readonly ChartRow[];
}

export const CHART_ROW_H = 13;
const TOP = 6;
const AXIS_H = 18;

/** Lays out the chart in a box `width` units wide. */
export function budgetChart(b: Budget, width: number): BudgetChart {
  const outputs = Object.keys(b.outputs);
  let top = b.targetA;
  for (const o of outputs) {
    top = Math.max(top, b.outputs[o]?.maxA ?? 0, b.trim.outputs[o]?.maxA ?? 0);
  }
  const scaleMax = niceCeil(top * 1.08);
  const plotX0 = 34;
  const plotX1 = width - 44;
  const x = (a: number) => plotX0 + ((plotX1 - plotX0) * Math.max(0, a)) / scaleMax;
  const rows = outputs.map((o, i): ChartRow => {
    const ob = b.outputs[o];
    const ticks = b.states.flatMap((s) => {
      const v = s.outputs[o];
      return v && v.lit ? [{ x: x(v.segmentA), state: s.state, currentA: v.segmentA }] : [];
    });
    const t = b.trim.outputs[o];
    return {
      output: o,
      y: TOP + i * CHART_ROW_H + CHART_ROW_H / 2,
      ticks,
      band: { x0: x(ob?.minA ?? 0), x1: x(ob?.maxA ?? 0) },
      trimmed: t ? { x0: x(t.minA), x1: x(t.maxA) } : null,
      spreadPct: ob?.spreadPct ?? 0,
    };
  });
  const steps = 4;
  const unit = b.targetA >= 1e-4 ? "mA" : "µA";
  const axis = Array.from({ length: steps + 1 }, (_, k) => {
    const a = (scaleMax * k) / steps;
    return { x: x(a), label: unit === "mA" ? String(Number((a * 1e3).toPrecision(3))) : microampsShort(a) };
  });
  return { width, height: TOP + rows.length * CHART_ROW_H + AXIS_H, plotX0, plotX1, targetX: x(b.targetA), axis, rows, unit };
}

/** The next 1, 2 or 5 times a power of ten at or above v. */
function niceCeil(v: number): number {
  if (!(v > 0)) return 1e-6;
  const p = 10 ** Math.floor(Math.log10(v));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * p >= v) return m * p;
  return 10 * p;
}
