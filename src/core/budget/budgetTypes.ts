/**
 * The shape of a budget (`diodeloom/budget@3`): what every part carries in
 * every state, in SI units, each quantity's unit in its name (`A` amperes,
 * `V` volts, `W` watts, `Ohms`, `Pct` percent, `C` degrees Celsius).
 *
 * Format 3 (this one) follows the driver kinds: every output carries
 * `segmentA`, lit or not, and its driver's operating point; each kind adds
 * its own figures (a sink's and a follower's headroom, a switch's forced
 * beta at the weakest corner). A coded counter's decoder adds its stage
 * lines (as `counterLines`, with what each sinks while low) and its AND
 * gates (`gates`). Dark-decoded outputs add `dark`: their pull-ups and
 * input network as sized, and the ghost check of every state at every
 * corner.
 */
import type { CornerConditions } from "./corners.ts";
import type { CurrentRange } from "./segmentTrim.ts";
import type { TrimEffect, TrimMode } from "./segmentDesign.ts";
import type { ESeriesName } from "./eSeries.ts";
import type { DcMethod } from "../circuit/dcSolver.ts";
import type { CurrentResistorRole, PartResistorRole } from "../matrix/designators.ts";
import type { DriverKind } from "../project/project.ts";
import type { WarningLevel } from "./safety.ts";
import type { DarkFigures, DarkLimit } from "./ghostCheck.ts";

export const BUDGET_SCHEMA = "diodeloom/budget@3";

export interface BudgetOptions {
  /** Preferred-value series of the trim (default E24). */
  readonly series?: ESeriesName;
  /** Whether the design takes the trim (default `auto`: where the rule allows it). */
  readonly trim?: TrimMode;
  /**
   * How far from `segment.targetA` a segment may run at a tolerance corner
   * and still count as meeting the target, percent (default 20, a choice of
   * diodeloom: a difference the eye accepts between neighbouring segments).
   */
  readonly windowPct?: number;
  /**
   * `Date.now()` value after which the budget starts no further state's
   * solve and fails with `time-limit` (default: none). The command line
   * gives the budget the project's time limit again, counted from its start.
   */
  readonly deadlineMs?: number;
  /**
   * The configured time limit, milliseconds: where its work cannot check
   * every state the budget checks the first ones and says so
   * (`Budget.coverage`, budgetWork.ts). Without it every state is checked.
   */
  readonly timeLimitMs?: number;
}

/**
 * Which states a budget checked, where its time limit's work did not cover
 * every one: S0 to S<checked - 1>. Every figure of the budget is of those
 * states alone.
 */
export interface BudgetCoverage {
  /** States checked, from S0. */
  readonly checked: number;
  /** The counter's states. */
  readonly states: number;
  /** The time limit the check was planned for, milliseconds. */
  readonly timeLimitMs: number;
}

/** A transistor's operating point, an NPN's as Vbe, Vce and the currents in; a PNP's as Veb, Vec and the currents out. */
export interface DriverPoint {
  readonly vbeV: number;
  readonly vceV: number;
  /** Into an NPN's collector, out of a PNP's. */
  readonly icA: number;
  /** Into an NPN's base, out of a PNP's. */
  readonly ibA: number;
}

export interface OutputInState {
  readonly lit: boolean;
  /** The segment's current, lit or not. */
  readonly segmentA: number;
  /** The output line's voltage (the matrix's end of the stage). */
  readonly inputV: number;
  /** The driver's operating point; null for direct drive. */
  readonly driver: DriverPoint | null;
}

export interface StateBudget {
  /** The state, `S<k>`. */
  readonly state: string;
  readonly text: string;
  /** Current the counter's high lines source together (the active line of a one-hot counter). */
  readonly sourceCurrentA: number;
  /** Current drawn from the segment supply (0 for direct drive). */
  readonly supplyCurrentA: number;
  /** Current drawn from the logic supply by the tied-on outputs. */
  readonly logicCurrentA: number;
  readonly solver: { readonly method: DcMethod; readonly iterations: number };
  readonly outputs: Readonly<Record<string, OutputInState>>;
}

/** Why an output's current varies between the states that light it. */
/** `gate-sag`: a coded counter's AND gate, its pull-up shared by the drivers of the outputs it feeds. */
export type SpreadCause = "line-sag" | "gate-sag" | "diode-depth" | "switch-unsaturated";

export interface OutputBudget extends CurrentRange {
  /** Largest segment current in a state that does not light the output. */
  readonly offMaxA: number;
  /** The state of `offMaxA`, or null when the output is lit in every state. */
  readonly offMaxState: string | null;
  /** The states of `minA` and `maxA` (null when never lit). */
  readonly minState: string | null;
  readonly maxState: string | null;
  /** Lengths, in diodes, of the paths from the counter lines (and a coded counter's gates) to this output (empty when tied on). */
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

/**
 * A counter line: a one-hot counter's state line (high in its own state),
 * or a coded counter's stage line `Q<i>`/`nQ<i>` (high where the code sets
 * it).
 */
export interface CounterLineBudget {
  /** Largest current the line sources while high (0 when it is never high). */
  readonly sourceCurrentA: number;
  /** The state of `sourceCurrentA`, or null when the line is never high. */
  readonly sourceState: string | null;
  /** Line voltage in that state. */
  readonly lineV: number;
  /** How far the line then falls below its open-circuit `high`. */
  readonly sagV: number;
  /** Largest current the line sinks while low: the gate pull-ups it holds low, leakage for a one-hot line. */
  readonly sinkCurrentA: number;
  /** The state of `sinkCurrentA`, or null when the line is never low. */
  readonly sinkState: string | null;
  /** What the line may source or sink (`counterOutput.maxCurrentA`). */
  readonly ratedA: number;
}

/** An AND gate of a coded counter's decoder over the used codes. */
export interface GateBudget {
  /** Its input lines. */
  readonly inputs: readonly string[];
  /** Its pull-up, as the design has it. */
  readonly pullUp: { readonly ref: string; readonly ohms: number };
  /** Highest gate-node voltage in a state that holds it low (one input low), or null when no used code does. */
  readonly lowMaxV: number | null;
  /** Lowest gate-node voltage in a state where every input is high, or null when no used code makes it high. */
  readonly highMinV: number | null;
  /** Largest current through its pull-up. */
  readonly maxPullUpA: number;
}

/** One resistor of a stage as the design has it. */
export interface StageResistorBudget {
  readonly ref: string;
  readonly role: PartResistorRole;
  readonly ohms: number;
}

export interface DriverBudget {
  /** The transistor, or null for direct drive. */
  readonly transistor: string | null;
  /** The resistor that sets the current, with the design's value. */
  readonly currentResistor: StageResistorBudget;
  /** Every resistor of the stage, the current-setting one first. */
  readonly resistors: readonly StageResistorBudget[];
  /** Largest collector-emitter voltage over the states (0 without a transistor). */
  readonly maxVceV: number;
  /** Largest dissipation Vce Ic + Vbe Ib. */
  readonly maxPowerW: number;
  /** Largest collector current. */
  readonly maxCollectorA: number;
  /**
   * A sink's or a follower's smallest collector-base voltage over the lit
   * states at the lowest supply: how far it is from saturating (Vcb = 0);
   * null for a switch and for direct drive.
   */
  readonly headroomV: number | null;
  /**
   * A switch's largest forced beta Ic/Ib over the lit states at the low
   * corner (lowest beta, weakest base drive); null for other kinds, and for
   * a switch that takes no base current in a lit state (it is off).
   */
  readonly forcedBeta: number | null;
  /**
   * A switch: saturated at the low corner, its base-collector junction
   * forward-biased in every lit state (so its forced beta is below
   * `tolerance.betaMin`, the corner's beta); null for other kinds.
   */
  readonly saturated: boolean | null;
  readonly ratedVceV: number;
  readonly ratedPowerW: number;
  readonly ratedCollectorA: number;
}

export interface CornerBudget {
  readonly conditions: CornerConditions;
  /** Lowest lit segment current of any output. */
  readonly minCurrentA: number;
  /** Highest lit segment current of any output. */
  readonly maxCurrentA: number;
  readonly outputs: Readonly<Record<string, CurrentRange>>;
  /** Smallest collector-base headroom of a lit sink or follower (null for other kinds, 0 when there is no driver). */
  readonly minHeadroomV: number | null;
  /** Largest forced beta of a lit switch (null for other kinds). */
  readonly maxForcedBeta: number | null;
  readonly maxVceV: number;
  readonly maxPowerW: number;
}

/** An unlit segment's current and where: the output and the state that leaves it dark. */
export interface UnlitFigure {
  readonly output: string;
  readonly state: string;
  readonly currentA: number;
}

/**
 * The largest current of a segment its state leaves dark, over every
 * output and state, at the nominal values and at each tolerance corner:
 * how near a ghost the design comes, whatever holds the segment off (a
 * pull-down, a high-side switch's idle lines and `Rbe`, a dark-decoded
 * output's input network). Each is null when no output is ever unlit.
 */
export interface UnlitBudget {
  /** `ghostFraction` of the target, amperes. */
  readonly ghostLimitA: number;
  readonly nominal: UnlitFigure | null;
  readonly low: UnlitFigure | null;
  readonly high: UnlitFigure | null;
}

/**
 * The trim as worked out, and whether the design takes it (`applied`).
 * The figures `...Before` are the project's values, the others the values
 * the rule judged (the centred trim, or its step towards the middle), over
 * the states at nominal.
 */
export interface TrimBudget {
  readonly series: ESeriesName;
  readonly mode: TrimMode;
  readonly role: CurrentResistorRole;
  readonly applied: boolean;
  /** What the trim does over the states at the nominal values (the rule judges no corner: `corners.shortOf` says what the design misses there). */
  readonly effect: TrimEffect;
  /** Per output: the centred preferred value and the exact one, and the range the centred trim gives. */
  readonly outputs: Readonly<Record<string, { readonly ohms: number; readonly idealOhms: number } & CurrentRange>>;
  /** The values the rule judged, ohms, by output. */
  readonly judgedOhms: Readonly<Record<string, number>>;
  readonly spreadPctBefore: number;
  readonly spreadPct: number;
  readonly offTargetPctBefore: number;
  readonly offTargetPct: number;
  readonly windowDistancePctBefore: number;
  readonly windowDistancePct: number;
}

/**
 * A part of the target the tolerance corners miss: a lit segment below the
 * window at the low corner or above it at the high corner, a segment over
 * its rating at the high corner, a sink or follower out of headroom at the
 * low corner, a switch not saturated at the low corner.
 */
export type TargetLimit = "below-window" | "above-window" | "over-rating" | "no-headroom" | "switch-unsaturated";

/** Why a worked-out trim is not in the design. */
export type UnappliedWhy = "turned-off" | "widens-spread" | "over-rating" | "no-help";

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
      readonly code: "driver-current";
      readonly transistor: string;
      readonly output: string;
      readonly currentA: number;
      readonly ratedA: number;
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
  | {
      readonly level: "warn";
      readonly code: "switch-unsaturated";
      readonly transistor: string;
      readonly output: string;
      /** Largest Ic/Ib of a lit state at the low corner; null when it takes no base current (off). */
      readonly forcedBeta: number | null;
      readonly betaMin: number;
    }
  | { readonly level: "warn"; readonly code: "segment-current"; readonly currentA: number; readonly ratedA: number }
  | {
      readonly level: "warn";
      readonly code: "line-current";
      readonly line: string;
      readonly state: string;
      readonly currentA: number;
      readonly ratedA: number;
    }
  | {
      readonly level: "warn";
      readonly code: "line-sink";
      readonly line: string;
      readonly state: string;
      readonly currentA: number;
      readonly ratedA: number;
      /**
       * What the line sinks: a coded counter's gate pull-ups (`gate-pull-ups`), or, on a high-side
       * switch's active-low line, the bases and line pull-ups of the switches it turns on (`switch-bases`).
       */
      readonly from: "gate-pull-ups" | "switch-bases";
    }
  | {
      readonly level: "warn";
      readonly code: "ghost-segment";
      readonly output: string;
      readonly state: string;
      readonly currentA: number;
      /** `ghostFraction` of the target. */
      readonly limitA: number;
    }
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
      /** What the corners miss (`corners.shortOf`). */
      readonly shortOf: readonly TargetLimit[];
      /** The switches not saturated at the low corner, by output. */
      readonly unsaturated: readonly string[];
      /** The segment rating, amperes. */
      readonly maxRatedA: number;
      /** Whether the design takes the trim: a trim of the current-setting resistors that still misses. */
      readonly trimApplied: boolean;
      /** The driver kind (for what to change). */
      readonly kind: DriverKind;
      /** The dark-decoded outputs' input network, or null (for what to change). */
      readonly darkInput: "level-shift" | "divider" | null;
      /** Whether some path has more than one diode (for what to change). */
      readonly deeperPaths: boolean;
    }
  | {
      readonly level: "warn";
      readonly code: "state-spread";
      readonly output: string;
      readonly spreadPct: number;
      readonly minState: string;
      readonly maxState: string;
      /** What makes it vary, largest share first. */
      readonly causes: readonly SpreadCause[];
      /** How much lower the active line (a coded counter: the high line or gate that drives the output) sits in `minState` than in `maxState`, volts. */
      readonly sagDeltaV: number;
      /** The AND gate that drives the output in `minState`, for a coded counter's decoder; else null. */
      readonly gate: string | null;
      /** Segments lit in `minState` and in `maxState`, sharing the active line. */
      readonly litMin: number;
      readonly litMax: number;
      /** Diodes on the path from the active line in `minState` and in `maxState`. */
      readonly depthMin: number;
      readonly depthMax: number;
    }
  | {
      readonly level: "warn";
      readonly code: "dark-network";
      /** The limits the dark-decoded outputs' network breaks. */
      readonly broken: readonly DarkLimit[];
      /** Where, in words (ghostCheck.ts). */
      readonly where: string;
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
      readonly level: "warn";
      readonly code: "states-unchecked";
      /** States checked, from S0. */
      readonly checked: number;
      readonly states: number;
      readonly timeLimitMs: number;
    }
  | {
      readonly level: "info";
      readonly code: "counter-sag";
      readonly line: string;
      readonly sagV: number;
      readonly sourceCurrentA: number;
    };

export type BudgetWarningCode = BudgetWarning["code"];

/** One dark-decoded output's parts between its node and its driver. */
export interface DarkInputBudget {
  readonly output: string;
  /** Its pull-up's designator. */
  readonly pullUp: string;
  /** Its divider's upper resistor, or null with level-shift diodes. */
  readonly divider: string | null;
  /** Its level-shift diodes, from the node. */
  readonly shiftDiodes: readonly string[];
  /** Its pull-down at the driver's input (the shift diodes' bleed, the divider's lower resistor). */
  readonly bleed: string;
}

/**
 * The dark-decoded outputs: their input network as the budget sized it and
 * the ghost check of the design, every state at the nominal values and
 * both corners (ghostCheck.ts).
 */
export interface DarkBudget extends DarkFigures {
  /** `level-shift` or `divider`. */
  readonly input: "level-shift" | "divider";
  readonly pullUpOhms: number;
  /** Per output. */
  readonly shiftDiodes: number;
  /** The divider's upper resistor, or null. */
  readonly dividerOhms: number | null;
  /** What bleeds the driver's input: the pull-down, or the divider's lower resistor in its place. */
  readonly bleedOhms: number;
  readonly outputs: readonly DarkInputBudget[];
  /** The limits broken and where, in words, or "every limit holds". */
  readonly verdict: string;
  /** How the sizing chose the values: the limit that stops a smaller one, or the one no value keeps. */
  readonly sizing: string;
}
export type { WarningLevel };

export interface SupplyBudget {
  readonly volts: number;
  /** Largest current over the states, amperes. */
  readonly maxCurrentA: number;
  /** Largest power over the states, watts. */
  readonly maxPowerW: number;
}

export interface Budget {
  readonly schema: typeof BUDGET_SCHEMA;
  readonly title: string;
  /** The driver kind of every output (`electrical.driver.kind`). */
  readonly kind: DriverKind;
  readonly temperatureC: number;
  readonly targetA: number;
  /** The segment's rating. */
  readonly maxA: number;
  /** Every figure below (but `trim`) is of this design: the current-setting resistors `trimmed` or as in the `project`. */
  readonly design: "trimmed" | "project";
  readonly states: readonly StateBudget[];
  readonly outputs: Readonly<Record<string, OutputBudget>>;
  /** Spread over every lit segment, percent. */
  readonly spreadPct: number;
  readonly diodes: Readonly<Record<string, DiodeBudget>>;
  readonly counterLines: Readonly<Record<string, CounterLineBudget>>;
  /** A coded counter's AND gates, keyed by gate (`G1`); empty for a one-hot counter. */
  readonly gates: Readonly<Record<string, GateBudget>>;
  /** One per driven output, keyed by output. */
  readonly drivers: Readonly<Record<string, DriverBudget>>;
  /** The segment supply (unused by direct drive). */
  readonly supply: SupplyBudget;
  /** The logic supply as the counter lines, the tied-on outputs and the gates' pull-ups draw on it (the lines at their high level). */
  readonly logic: SupplyBudget;
  readonly trim: TrimBudget;
  readonly corners: {
    readonly windowPct: number;
    readonly meetsTarget: boolean;
    /** The parts of the target the corners miss, in this order; empty when `meetsTarget`. */
    readonly shortOf: readonly TargetLimit[];
    readonly low: CornerBudget;
    readonly high: CornerBudget;
  };
  /** The worst unlit segment at the nominal values and each corner. */
  readonly unlit: UnlitBudget;
  /** The dark-decoded outputs' network and ghost check; null when every output is decoded lit. */
  readonly dark: DarkBudget | null;
  /** Present only where the time limit's work did not cover every state: which ones were checked. */
  readonly coverage?: BudgetCoverage;
  readonly warnings: readonly BudgetWarning[];
}
