/**
 * The Electrical panel's fields: every number of the `electrical` section,
 * grouped as a builder thinks of the circuit, each with the unit it is
 * shown in (milliamperes for segment and line currents, SI otherwise) and
 * the driver kinds that use it; and the edits the panel makes to the draft.
 *
 * A value goes into the draft as typed, converted to SI; the schema then
 * names an out-of-range value as it names a file's.
 */
import { ELECTRICAL_PRESETS } from "../../core/project/electricalPresets.ts";
import { ELECTRICAL_RANGES } from "../../core/project/electricalSchema.ts";
import type { DriverKind, ElectricalModel, PresetName } from "../../core/project/project.ts";
import { electricalFields } from "../../core/project/projectWriter.ts";
import type { Draft } from "./draft.ts";

/** A number of the section, by its path below `electrical`. */
export type ElectricalPath =
  | Exclude<keyof typeof ELECTRICAL_RANGES, "driver.emitterResistors" | "segment.seriesResistors" | "tolerance.temperatureC">
  | "tolerance.temperatureC.0"
  | "tolerance.temperatureC.1";

/** A per-output map of resistor values, by its path. */
export type OverridePath = "driver.emitterResistors" | "segment.seriesResistors";

export interface NumberField {
  readonly path: ElectricalPath;
  readonly label: string;
  /** The unit shown beside the field. */
  readonly unit: string;
  /** Shown value = SI value × scale (1000 for milliamperes). */
  readonly scale: number;
  /** The kinds that use it; absent: every kind. */
  readonly kinds?: readonly DriverKind[];
  /** May be left empty for none (`driver.baseEmitterResistor`). */
  readonly optional?: boolean;
  /** What the value means, beyond its label (the field's tooltip). */
  readonly hint?: string;
}

export interface OverrideField {
  readonly path: OverridePath;
  readonly label: string;
  readonly kinds?: readonly DriverKind[];
}

export interface FieldGroup {
  readonly title: string;
  readonly fields: readonly NumberField[];
  readonly overrides?: readonly OverrideField[];
}

const TRANSISTOR: readonly DriverKind[] = ["current-sink", "low-side-switch", "emitter-follower", "high-side-switch"];
const SINK: readonly DriverKind[] = ["current-sink"];
const WITH_BASE_R: readonly DriverKind[] = ["low-side-switch", "emitter-follower", "high-side-switch"];

const f = (path: ElectricalPath, label: string, unit: string, extra: Partial<NumberField> = {}): NumberField => ({
  path,
  label,
  unit,
  scale: unit === "mA" ? 1000 : 1,
  ...extra,
});

/** Every field, in the panel's groups and order. */
export const ELECTRICAL_GROUPS: readonly FieldGroup[] = [
  {
    title: "Segment supply",
    fields: [
      f("supply.volts", "Nominal", "V", { kinds: TRANSISTOR }),
      f("supply.minVolts", "Lowest", "V", { kinds: TRANSISTOR }),
      f("supply.maxVolts", "Highest", "V", { kinds: TRANSISTOR }),
      f("logicSupply.volts", "Logic supply", "V", { hint: "the net VLOGIC that tied-on outputs hang from" }),
    ],
  },
  {
    title: "Segment",
    fields: [
      f("segment.leds", "LEDs in series", ""),
      f("segment.targetA", "Target current", "mA"),
      f("segment.maxA", "Rated current", "mA"),
      f("segment.seriesResistor", "Series resistor", "Ω", {
        hint: "in series with each segment; under a sink, its collector resistor (0 = none)",
      }),
      f("segment.is", "LED saturation current", "A"),
      f("segment.n", "LED emission coefficient", ""),
      f("segment.rs", "LED series resistance", "Ω"),
    ],
    overrides: [{ path: "segment.seriesResistors", label: "Series resistor per output" }],
  },
  {
    title: "Driver",
    fields: [
      f("driver.emitterResistor", "Emitter resistor", "Ω", { kinds: SINK }),
      f("driver.baseResistor", "Base resistor", "Ω", {
        kinds: WITH_BASE_R,
        hint: "from the output line to the base (0 = the base on the line)",
      }),
      f("driver.baseEmitterResistor", "Base-emitter resistor", "Ω", {
        kinds: ["low-side-switch", "high-side-switch"],
        optional: true,
        hint: "holds the switch off: base to ground, or for a high-side PNP base to the supply, where it is needed (empty = none)",
      }),
      f("driver.betaF", "Forward beta", "", { kinds: TRANSISTOR }),
      f("driver.betaR", "Reverse beta", "", { kinds: TRANSISTOR }),
      f("driver.is", "Saturation current", "A", { kinds: TRANSISTOR }),
      f("driver.maxVceV", "Rated Vce", "V", { kinds: TRANSISTOR }),
      f("driver.maxPowerW", "Rated power", "W", { kinds: TRANSISTOR }),
      f("driver.maxCollectorA", "Rated collector current", "mA", { kinds: TRANSISTOR }),
    ],
    overrides: [{ path: "driver.emitterResistors", label: "Emitter resistor per output", kinds: SINK }],
  },
  {
    title: "Counter lines",
    fields: [
      f("counterOutput.high", "Active level", "V"),
      f("counterOutput.low", "Idle level", "V"),
      f("counterOutput.resistance", "Source resistance", "Ω"),
      f("counterOutput.lowResistance", "Idle source resistance", "Ω", { hint: "an idle line behind its saturated transistor" }),
      f("counterOutput.maxCurrentA", "Line current limit", "mA", { hint: "the most one counter line may source" }),
      f("pullDown", "Output pull-down", "Ω", {
        hint: "from each output line to ground (a high-side switch's: a pull-up to the segment supply)",
      }),
      f("gatePullUp", "AND-gate pull-up", "Ω", { hint: "a coded counter's AND gates, each from the logic supply" }),
      f("lowLine.low", "Active-low line, active", "V", { hint: "an nS line in its own state (sink or complementary drive)" }),
      f("lowLine.high", "Active-low line, idle", "V"),
      f("lowLine.resistance", "Active-low source resistance", "Ω"),
      f("lowLine.maxCurrentA", "Active-low sink limit", "mA", { hint: "the most one active nS line may sink" }),
    ],
  },
  {
    title: "Matrix diodes",
    fields: [
      f("diode.is", "Saturation current", "A"),
      f("diode.n", "Emission coefficient", ""),
      f("diode.rs", "Series resistance", "Ω"),
      f("diode.maxForwardA", "Rated forward current", "mA"),
      f("diode.maxReverseV", "Rated reverse voltage", "V"),
    ],
  },
  {
    title: "Tolerances and temperature",
    fields: [
      f("tolerance.resistorPct", "Resistor tolerance", "%"),
      f("tolerance.betaMin", "Lowest beta", ""),
      f("tolerance.betaMax", "Highest beta", ""),
      f("tolerance.temperatureC.0", "Lowest temperature", "°C"),
      f("tolerance.temperatureC.1", "Highest temperature", "°C"),
      f("temperatureC", "Nominal temperature", "°C"),
      f("ghostFraction", "Glow warning at", "", { hint: "share of the target current above which an unlit segment is said to glow" }),
    ],
  },
];

/** The words of each kind, for the picker. */
export const KIND_NAMES: Readonly<Record<DriverKind, string>> = {
  "low-side-switch": "low-side NPN switch (common anode)",
  "current-sink": "NPN constant-current sink",
  "emitter-follower": "NPN emitter follower (common cathode)",
  "high-side-switch": "high-side PNP switch (common cathode, active-low lines)",
  direct: "direct from the counter lines",
};

/** Whether a field matters for a kind. */
export function usedBy(field: { readonly kinds?: readonly DriverKind[] }, kind: DriverKind): boolean {
  return field.kinds === undefined || field.kinds.includes(kind);
}

/** The SI value of a field in a model; null for an empty optional one. */
export function fieldValue(e: ElectricalModel, path: ElectricalPath): number | null {
  let at: unknown = e;
  for (const key of path.split(".")) at = (at as Record<string, unknown>)[key];
  return at === null ? null : (at as number);
}

/** The text a field shows: its value in the shown unit, without binary noise (0.01 A -> "10"). */
export function fieldText(e: ElectricalModel, field: NumberField): string {
  const v = fieldValue(e, field.path);
  return v === null ? "" : String(Number((v * field.scale).toPrecision(12)));
}

/** Sets one value (in SI; null empties an optional field) and returns a new model. */
function withValue(e: ElectricalModel, path: ElectricalPath, value: number | null): ElectricalModel {
  const copy = electricalFields(e) as unknown as Record<string, unknown>;
  const keys = path.split(".");
  let at = copy;
  for (const key of keys.slice(0, -1)) at = at[key] as Record<string, unknown>;
  const last = keys[keys.length - 1] as string;
  if (Array.isArray(at)) (at as unknown[])[Number(last)] = value;
  else at[last] = value;
  return copy as unknown as ElectricalModel;
}

/**
 * The draft with one field set from the text typed into it (in the field's
 * unit). Text that is not a number leaves the draft as it was (null); an
 * empty optional field is none.
 *
 * @example
 * setElectricalText(d, field("segment.targetA"), "12")?.electrical.segment.targetA; // 0.012
 */
export function setElectricalText(d: Draft, field: NumberField, text: string): Draft | null {
  const t = text.trim();
  if (t === "") return field.optional ? { ...d, electrical: withValue(d.electrical, field.path, null) } : null;
  const shown = Number(t);
  if (!Number.isFinite(shown)) return null;
  return { ...d, electrical: withValue(d.electrical, field.path, shown / field.scale) };
}

/**
 * The draft with the circuit of another kind; the other values stay, but
 * for a high-side switch's base and base-emitter resistors, which it needs:
 * where the draft has none, the `bench-5v-high-side` preset's.
 */
export function setDriverKind(d: Draft, kind: DriverKind): Draft {
  const e = electricalFields(d.electrical);
  const driver = { ...e.driver, kind };
  if (kind === "high-side-switch") {
    const own = ELECTRICAL_PRESETS["bench-5v-high-side"].driver;
    if (!(driver.baseResistor > 0)) driver.baseResistor = own.baseResistor;
    if (driver.baseEmitterResistor === null) driver.baseEmitterResistor = own.baseEmitterResistor;
  }
  return { ...d, electrical: { ...e, driver } };
}

/** The draft with every electrical value of a preset (the preset's complete set, replacing the section). */
export function setElectricalPreset(d: Draft, name: PresetName): Draft {
  return { ...d, electrical: electricalFields(ELECTRICAL_PRESETS[name]) };
}

/** A per-output map as the panel shows it: `1a=330, 2b=300` (ohms). */
export function overridesText(map: Readonly<Record<string, number>>): string {
  return Object.entries(map)
    .map(([o, ohms]) => `${o}=${ohms}`)
    .join(", ");
}

/**
 * The draft with a per-output map read from `1a=330, 2b=300` (ohms; empty
 * text clears it), or null when the text does not read as such a list.
 */
export function setOverridesText(d: Draft, path: OverridePath, text: string): Draft | null {
  const map: Record<string, number> = {};
  for (const part of text
    .split(",")
    .map((p) => p.trim())
    .filter((p) => p !== "")) {
    const m = /^([^=\s]+)\s*=\s*(\S+)$/.exec(part);
    const ohms = m ? Number(m[2]) : NaN;
    if (!m || !Number.isFinite(ohms)) return null;
    map[m[1] as string] = ohms;
  }
  const e = electricalFields(d.electrical);
  return path === "driver.emitterResistors"
    ? { ...d, electrical: { ...e, driver: { ...e.driver, emitterResistors: map } } }
    : { ...d, electrical: { ...e, segment: { ...e.segment, seriesResistors: map } } };
}

/**
 * Whether two drafts ask the synthesis the same: equal but for the
 * `electrical` section, which it reads only for whether the driver is a
 * high-side switch (whose lit cells sit on the active-low lines).
 */
export function sameSynthesisInput(a: Draft, b: Draft): boolean {
  if (a === b) return true;
  const { electrical: ea, ...restA } = a;
  const { electrical: eb, ...restB } = b;
  const highSide = (e: Draft["electrical"]): boolean => e.driver.kind === "high-side-switch";
  return highSide(ea) === highSide(eb) && JSON.stringify(restA) === JSON.stringify(restB);
}

/** Whether two drafts differ in their `electrical` section alone: the budget is worked out again, not the matrix. */
export function onlyElectricalChanged(before: Draft, after: Draft): boolean {
  return sameSynthesisInput(before, after) && JSON.stringify(before.electrical) !== JSON.stringify(after.electrical);
}
