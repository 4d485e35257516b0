/**
 * What a design that misses its target at the tolerance corners misses, and
 * what the builder can change, in words: for the corner-target warning, the
 * budget's corner line and the note on the trim. A trim moves the
 * current-setting resistors only; where the corners still leave the window
 * (a switch short of base current, say, whose current its base sets and
 * not its series resistor), the trim must not read as a success.
 */
import type { Budget, TargetLimit } from "../core/budget/budgetTypes.ts";
import { designNote } from "../core/budget/segmentDesign.ts";
import { budgetDesign } from "../core/budget/budget.ts";
import type { DriverKind } from "../core/project/project.ts";
import { currentText, percent } from "./units.ts";

/** What the remedies depend on: the dark-decoded outputs' input network, and whether any path has more than one diode. */
export interface RemedyFacts {
  readonly kind: DriverKind;
  readonly darkInput: "level-shift" | "divider" | null;
  readonly deeperPaths: boolean;
}

/** The remedies' facts of a budget. */
export function remedyFacts(b: Pick<Budget, "kind" | "outputs" | "dark">): RemedyFacts {
  return {
    kind: b.kind,
    darkInput: b.dark?.input ?? null,
    deeperPaths: Object.values(b.outputs).some((o) => o.pathLengths.some((n) => n > 1)),
  };
}

/** Figures the words quote, SI. */
export interface ShortFigures {
  readonly minA: number;
  readonly maxA: number;
  readonly targetA: number;
  readonly windowPct: number;
  readonly maxRatedA: number;
  /** The switches not saturated at the low corner, by output. */
  readonly unsaturated: readonly string[];
}

function limitWords(limit: TargetLimit, f: ShortFigures): string {
  const w = f.windowPct / 100;
  switch (limit) {
    case "below-window":
      return `below the window at the low corner (${currentText(f.minA)} against ${currentText(f.targetA * (1 - w))})`;
    case "above-window":
      return `above it at the high corner (${currentText(f.maxA)} against ${currentText(f.targetA * (1 + w))})`;
    case "over-rating":
      return `over the segment rating at the high corner (${currentText(f.maxA)} against ${currentText(f.maxRatedA)})`;
    case "no-headroom":
      return "a driver out of collector-base headroom at the low corner";
    case "switch-unsaturated":
      return `the switch${f.unsaturated.length === 1 ? "" : "es"} of ${f.unsaturated.join(", ")} not saturated at the low corner`;
  }
}

/**
 * The limits missed, in words.
 *
 * @example
 * shortOfText(["below-window"], { minA: 0.0038, maxA: 0.011, targetA: 0.01, windowPct: 20, maxRatedA: 0.02, unsaturated: [] });
 * // "below the window at the low corner (3.79 mA against 8 mA)"
 */
export function shortOfText(limits: readonly TargetLimit[], f: ShortFigures): string {
  return limits.map((l) => limitWords(l, f)).join("; ");
}

/**
 * What the builder can change for the limits, each said once, as things to do.
 *
 * @example
 * remedyText(["above-window"], { kind: "low-side-switch", darkInput: null, deeperPaths: false });
 * // "narrow the supply range (electrical.supply.minVolts and maxVolts) or use closer resistors (electrical.tolerance.resistorPct)"
 */
export function remedyText(limits: readonly TargetLimit[], facts: RemedyFacts): string {
  const said = new Set<string>();
  const shallower = "a lower depth limit (synthesis.maxDepth: fewer diodes in series)";
  // Where outputs are decoded dark, their pull-ups feed the switches' bases, sized by the ghost check against the lit window.
  const network = [
    ...(facts.darkInput === "divider" ? ['the level-shift input network (synthesis.darkInput "level-shift") instead of the divider'] : []),
    ...(facts.deeperPaths ? [shallower] : []),
  ];
  const viaNetwork = facts.darkInput !== null && network.length > 0;
  for (const l of limits) {
    switch (l) {
      case "switch-unsaturated": {
        const ways = viaNetwork
          ? network
          : ["a smaller base resistor (electrical.driver.baseResistor)", ...(facts.deeperPaths ? [shallower] : [])];
        said.add(
          `give the switches more base current (an unsaturated switch's base current sets its segment current, not its series resistor), with ${ways.join(" or ")}`,
        );
        break;
      }
      case "below-window":
      case "above-window":
        // An unsaturated switch's current follows its beta over the corners: more base current comes first.
        if (limits.includes("switch-unsaturated")) break;
        said.add(
          viaNetwork
            ? `try ${network.join(" or ")}: the ghost check sizes the dark-decoded outputs' input network against the lit window`
            : facts.kind === "low-side-switch" || facts.kind === "high-side-switch"
              ? "narrow the supply range (electrical.supply.minVolts and maxVolts) or use closer resistors (electrical.tolerance.resistorPct)"
              : "use closer resistors (electrical.tolerance.resistorPct)",
        );
        break;
      case "over-rating":
        said.add("lower the target (electrical.segment.targetA) or use a segment rated higher (electrical.segment.maxA)");
        break;
      case "no-headroom":
        said.add("raise the supply or use fewer LEDs per segment (electrical.segment.leds)");
        break;
    }
  }
  return [...said].join("; or ");
}

/**
 * The note on the design's current-setting resistors for the budget: the
 * design's own (`designNote`), except where the design takes the trim and
 * the corners still miss the target, where it says so, which limits, and
 * what to change instead.
 *
 * @example
 * budgetDesignNote(budget);
 * // "Series resistors: the E24 trim is applied at the nominal values, but the segments still miss the target over the corners: ..."
 */
export function budgetDesignNote(b: Budget): string {
  const note = designNote(budgetDesign(b));
  if (!b.trim.applied || b.corners.meetsTarget) return note;
  const what = b.trim.role === "emitter" ? "Emitter resistors" : "Series resistors";
  const f = shortFigures(b);
  return (
    `${what}: the ${b.trim.series} trim is applied (at the nominal values it takes the farthest segment from ${percent(b.trim.offTargetPctBefore)} % ` +
    `to ${percent(b.trim.offTargetPct)} % off the target), but it does not bring the segments into the ±${b.corners.windowPct} % window: ` +
    `over the corners they are ${shortOfText(b.corners.shortOf, f)}. What to change: ${remedyText(b.corners.shortOf, remedyFacts(b))}.`
  );
}

/** The figures of a budget the words quote. */
export function shortFigures(b: Budget): ShortFigures {
  return {
    minA: b.corners.low.minCurrentA,
    maxA: b.corners.high.maxCurrentA,
    targetA: b.targetA,
    windowPct: b.corners.windowPct,
    maxRatedA: b.maxA,
    unsaturated: Object.entries(b.drivers)
      .filter(([, d]) => d.saturated === false)
      .map(([o]) => o),
  };
}
