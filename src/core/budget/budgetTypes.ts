/**
 * The shape of a budget (`diodeloom/budget@2`): what every part carries in
 * every state, in SI units, each quantity's unit in its name (`A` amperes,
 * `V` volts, `W` watts, `Ohms`, `Pct` percent, `C` degrees Celsius).
 */
import type { CornerConditions } from "./corners.ts";
import type { CurrentRange } from "./emitterTrim.ts";
import type { TrimEffect, TrimMode } from "./emitterDesign.ts";
import type { ESeriesName } from "./eSeries.ts";
import type { DcMethod } from "../circuit/dcSolver.ts";
import type { WarningLevel } from "./safety.ts";

export const BUDGET_SCHEMA = "diodeloom/budget@2";

export interface BudgetOptions {
  /** Preferred-value series of the trim (default E24). */
  readonly series?: ESeriesName;
  /** Whether the design takes the trim (default `auto`: where it improves the design). */
  readonly trim?: TrimMode;
  /**
   * How far from `string.targetA` a string may run at a tolerance corner and
   * still count as meeting the target, percent (default 20, a choice of
   * diodeloom: a difference the eye accepts between neighbouring segments).
   */
  readonly windowPct?: number;
}

export interface OutputInState {
  readonly lit: boolean;
  readonly baseV: number;
  readonly stringCurrentA: number;
}

export interface StateBudget {
  readonly state: string;
  readonly text: string;
  /** Current the active counter line sources. */
  readonly sourceCurrentA: number;
  /** Current drawn from the string supply. */
  readonly supplyCurrentA: number;
  readonly solver: { readonly method: DcMethod; readonly iterations: number };
  readonly outputs: Readonly<Record<string, OutputInState>>;
}

export interface OutputBudget extends CurrentRange {
  /** Largest string current in a state that does not light the output (leakage). */
  readonly offMaxA: number;
  /** Lengths, in diodes, of the paths from the counter lines to this output (empty when tied on). */
  readonly pathLengths: readonly number[];
  readonly tiedOn: boolean;
}

export interface DiodeBudget {
  readonly from: string;
  readonly to: string;
  /** Largest forward current. */
  readonly maxCurrentA: number;
  /** Largest reverse voltage. */
  readonly maxReverseV: number;
  readonly ratedCurrentA: number;
  readonly ratedReverseV: number;
}

export interface CounterLineBudget {
  /** Current the line sources when its state is active. */
  readonly sourceCurrentA: number;
  /** Line voltage when active. */
  readonly lineV: number;
  /** How far the active line falls below its open-circuit `high`. */
  readonly sagV: number;
}

export interface DriverBudget {
  readonly transistor: string;
  readonly emitterResistor: string;
  /** The design's emitter resistor. */
  readonly emitterOhms: number;
  /** Largest collector-emitter voltage over the states. */
  readonly maxVceV: number;
  /** Largest dissipation Vce Ic + Vbe Ib. */
  readonly maxPowerW: number;
  /**
   * Smallest collector-base voltage over the lit states at the lowest supply:
   * how far the driver is from the edge of saturation (Vcb = 0).
   */
  readonly headroomV: number;
  readonly ratedVceV: number;
  readonly ratedPowerW: number;
}

export interface CornerBudget {
  readonly conditions: CornerConditions;
  /** Lowest lit string current of any output. */
  readonly minCurrentA: number;
  /** Highest lit string current of any output. */
  readonly maxCurrentA: number;
  readonly outputs: Readonly<Record<string, CurrentRange>>;
  /** Smallest collector-base headroom of a lit driver (0 when there is no driver). */
  readonly minHeadroomV: number;
  readonly maxVceV: number;
  readonly maxPowerW: number;
}

/**
 * The trim as worked out, and whether the design takes it (`applied`).
 * `spreadPctBefore` / `offTargetPctBefore` are the project's values,
 * `spreadPct` / `offTargetPct` the trim's, over the states at nominal.
 */
export interface TrimBudget {
  readonly series: ESeriesName;
  readonly mode: TrimMode;
  readonly applied: boolean;
  readonly effect: TrimEffect;
  readonly outputs: Readonly<Record<string, { readonly ohms: number; readonly idealOhms: number } & CurrentRange>>;
  readonly spreadPctBefore: number;
  readonly spreadPct: number;
  readonly offTargetPctBefore: number;
  readonly offTargetPct: number;
}

/** Why a worked-out trim is not in the design. */
export type UnappliedWhy = "turned-off" | "widens-spread" | "moves-off-target";

/** A finding of the budget: its severity, its code and the figures behind it (SI). The words are the reports' (render). */
export type BudgetWarning =
  | { readonly level: "danger"; readonly code: "hazardous-voltage"; readonly supplyV: number }
  | { readonly level: "danger"; readonly code: "mains-supply" }
  | {
      readonly level: "warn";
      readonly code: "diode-current";
      readonly diode: string;
      readonly from: string;
      readonly to: string;
      readonly currentA: number;
      readonly ratedA: number;
    }
  | {
      readonly level: "warn";
      readonly code: "diode-reverse";
      readonly diode: string;
      readonly from: string;
      readonly to: string;
      readonly reverseV: number;
      readonly ratedV: number;
    }
  | {
      readonly level: "warn";
      readonly code: "driver-vce";
      readonly transistor: string;
      readonly output: string;
      readonly vceV: number;
      readonly ratedV: number;
    }
  | {
      readonly level: "warn";
      readonly code: "driver-power";
      readonly transistor: string;
      readonly output: string;
      readonly powerW: number;
      readonly ratedW: number;
    }
  | {
      readonly level: "warn";
      readonly code: "driver-saturation";
      readonly transistor: string;
      readonly output: string;
      readonly supplyV: number;
      /** How far the collector sits below the base. */
      readonly belowV: number;
    }
  | { readonly level: "warn"; readonly code: "corner-saturation"; readonly belowV: number }
  | { readonly level: "warn"; readonly code: "string-current"; readonly currentA: number; readonly ratedA: number }
  | {
      readonly level: "warn";
      readonly code: "dim-segment";
      readonly output: string;
      readonly minA: number;
      readonly targetA: number;
      readonly windowPct: number;
      /** What the trim would give this output where the design does not take it and it would help; else null. */
      readonly unappliedTrim: ({ readonly series: ESeriesName; readonly ohms: number; readonly why: UnappliedWhy } & CurrentRange) | null;
    }
  | {
      readonly level: "warn";
      readonly code: "corner-target";
      readonly minA: number;
      readonly maxA: number;
      readonly targetA: number;
      readonly windowPct: number;
    }
  | {
      readonly level: "info";
      readonly code: "brightness-spread";
      /** The design's spread. */
      readonly spreadPct: number;
      readonly series: ESeriesName;
      /** `applied`, or why the design does not take the trim. */
      readonly trim: "applied" | UnappliedWhy | "no-change";
      /** The spread of the other choice: the project's values when trimmed, the trim's when not. */
      readonly otherSpreadPct: number;
    }
  | {
      readonly level: "info";
      readonly code: "counter-sag";
      readonly line: string;
      readonly sagV: number;
      readonly sourceCurrentA: number;
    };

export type BudgetWarningCode = BudgetWarning["code"];
export type { WarningLevel };

export interface Budget {
  readonly schema: typeof BUDGET_SCHEMA;
  readonly title: string;
  readonly temperatureC: number;
  readonly targetCurrentA: number;
  /** Every figure below (but `trim`) is of this design. */
  readonly emitterResistors: "trimmed" | "project";
  readonly states: readonly StateBudget[];
  readonly outputs: Readonly<Record<string, OutputBudget>>;
  /** Spread over every lit string, percent. */
  readonly spreadPct: number;
  readonly diodes: Readonly<Record<string, DiodeBudget>>;
  readonly counterLines: Readonly<Record<string, CounterLineBudget>>;
  readonly drivers: Readonly<Record<string, DriverBudget>>;
  readonly supply: { readonly volts: number; readonly maxCurrentA: number; readonly maxPowerW: number };
  readonly trim: TrimBudget;
  readonly corners: {
    readonly windowPct: number;
    readonly meetsTarget: boolean;
    readonly low: CornerBudget;
    readonly high: CornerBudget;
  };
  readonly warnings: readonly BudgetWarning[];
}
