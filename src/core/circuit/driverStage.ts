/**
 * Driver stages: what sits between an output line and its segment, one
 * builder per `driver.kind`. The circuit builder puts the counter lines,
 * the matrix, each output line's bleed resistor (and tie-on) in place, then
 * asks the stage of the project's kind for the rest, so a new kind is one
 * more builder here, not a change to the builder.
 */
import type { DriverParts } from "../matrix/designators.ts";
import type { DriverKind, ElectricalModel } from "../project/project.ts";
import type { CircuitElement, DriverStage, LedSegment } from "./circuit.ts";
import { currentSinkStage } from "./currentSinkStage.ts";
import { directStage } from "./directStage.ts";
import { emitterFollowerStage } from "./emitterFollowerStage.ts";
import { highSideSwitchStage } from "./highSideSwitchStage.ts";
import { lowSideSwitchStage } from "./lowSideSwitchStage.ts";
import { shockleyVoltage, thermalVoltage } from "./physics.ts";

/** The nodes a stage joins besides its output line; null where the kind has no such node. */
export interface StageNodes {
  /** The transistor's base (the output line itself where nothing sits between). */
  readonly baseNode: string | null;
  readonly emitterNode: string | null;
  readonly collectorNode: string | null;
  /** The segment's anode and cathode ends. */
  readonly segmentAnode: string;
  readonly segmentCathode: string;
}

/** What a stage builder is given: the output's parts, the model, and its output line's node. */
export interface StageInput {
  readonly parts: DriverParts;
  readonly model: ElectricalModel;
  /** The output line (`o1a`). */
  readonly input: string;
}

/** A built stage: its elements, the nodes it joins and the nodes it adds to the circuit. */
export interface BuiltStage {
  readonly elements: readonly CircuitElement[];
  readonly nodes: StageNodes;
  /** Nodes of this stage alone, to declare in the circuit. */
  readonly ownNodes: readonly string[];
}

/** What the starting guess of a stage is worked out from. */
export interface GuessInput {
  readonly stage: DriverStage;
  readonly model: ElectricalModel;
  /** The guessed voltage of the output line, volts. */
  readonly inputV: number;
  readonly lit: boolean;
}

/** One driver kind. */
export interface StageKind {
  readonly kind: DriverKind;
  /** Whether its segments draw from the segment supply `VSUP` (direct drive draws from the counter lines). */
  readonly usesSupply: boolean;
  build(input: StageInput): BuiltStage;
  /** Node voltages a lit (or dark) stage of this kind sits near, for the solver's start. */
  guess(input: GuessInput): Record<string, number>;
}

const STAGES: Readonly<Record<DriverKind, StageKind>> = {
  "current-sink": currentSinkStage,
  "low-side-switch": lowSideSwitchStage,
  "emitter-follower": emitterFollowerStage,
  "high-side-switch": highSideSwitchStage,
  direct: directStage,
};

/** The stage builder of a kind. */
export function driverStage(kind: DriverKind): StageKind {
  return STAGES[kind];
}

/** The segment element of an output, between two nodes. */
export function segmentElement(parts: DriverParts, model: ElectricalModel, anode: string, cathode: string): LedSegment {
  const s = model.segment;
  return { kind: "segment", name: parts.display, anode, cathode, leds: s.leds, isA: s.is, n: s.n, rsOhms: s.rs };
}

/** The segment's drop at a current, volts (its LEDs with their series resistance), for guesses. */
export function segmentGuessV(model: ElectricalModel, currentA: number): number {
  const s = model.segment;
  return s.leds * (shockleyVoltage(currentA, s.is, s.n, thermalVoltage(model.temperatureC)) + currentA * s.rs);
}

/** A dark segment's current for guesses, amperes: leakage. */
export const DARK_GUESS_A = 1e-10;
