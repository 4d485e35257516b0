import { describe, expect, it } from "vitest";
import { ELECTRICAL_PRESETS, PRESET_NAMES } from "../../../../src/core/project/electricalPresets.ts";
import { ELECTRICAL_RANGES } from "../../../../src/core/project/electricalSchema.ts";
import { validateProject } from "../../../../src/core/project/projectSchema.ts";
import { draftFromProject } from "../../../../src/ui/state/draft.ts";
import { setTitle } from "../../../../src/ui/state/draftEdits.ts";
import {
  ELECTRICAL_GROUPS,
  fieldText,
  onlyElectricalChanged,
  overridesText,
  sameSynthesisInput,
  setDriverKind,
  setElectricalPreset,
  setElectricalText,
  setOverridesText,
  type NumberField,
} from "../../../../src/ui/state/electricalForm.ts";
import { example } from "../../../support/projects.ts";

const fields = ELECTRICAL_GROUPS.flatMap((g) => g.fields);
const field = (path: string): NumberField => {
  const f = fields.find((x) => x.path === path);
  if (!f) throw new Error(`no field ${path}`);
  return f;
};

describe("the Electrical panel's fields", () => {
  it("offer every number of the electrical section, once, with the unit of its range", () => {
    const paths = [
      ...fields.map((f) => f.path.replace(/\.\d$/, "")),
      ...ELECTRICAL_GROUPS.flatMap((g) => g.overrides ?? []).map((o) => o.path),
    ];
    expect(new Set(paths)).toEqual(new Set(Object.keys(ELECTRICAL_RANGES)));
    expect(fields.map((f) => f.path).length).toBe(new Set(fields.map((f) => f.path)).size);
    for (const f of fields) {
      const unit = (ELECTRICAL_RANGES as Record<string, { unit?: string }>)[f.path.replace(/\.\d$/, "")]?.unit ?? "";
      // Currents are shown in mA, everything else in the range's own unit.
      expect(f.unit === "mA" ? "A" : f.unit, f.path).toBe(unit);
    }
  });

  it("read and write values in the shown unit, SI in the draft", () => {
    const d = draftFromProject(example("relay-hex-monitor"));
    expect(fieldText(d.electrical, field("segment.targetA"))).toBe("10");
    const next = setElectricalText(d, field("segment.targetA"), " 12.5 ");
    expect(next?.electrical.segment.targetA).toBeCloseTo(0.0125, 15);
    expect(setElectricalText(d, field("supply.volts"), "5,5")).toBeNull();
    expect(setElectricalText(d, field("supply.volts"), "")).toBeNull();
    // The base-emitter resistor may be left out (none).
    expect(setElectricalText(d, field("driver.baseEmitterResistor"), "")?.electrical.driver.baseEmitterResistor).toBeNull();
    const hot = setElectricalText(d, field("tolerance.temperatureC.1"), "70");
    expect(hot?.electrical.tolerance.temperatureC).toEqual([0, 70]);
    // The draft validates with the new value, and the schema still names a value out of range.
    expect(validateProject(next).ok).toBe(true);
    const bad = validateProject(setElectricalText(d, field("segment.leds"), "0"));
    expect(bad.ok ? [] : bad.error.map((p) => p.path)).toEqual(["electrical.segment.leds"]);
  });

  it("take a preset's complete set of values, and a kind on its own", () => {
    const d = draftFromProject(example("relay-hex-monitor"));
    for (const name of PRESET_NAMES) {
      const p = setElectricalPreset(d, name);
      // A high-side switch's lit cells sit on active-low lines: a sink-drive counter.
      const v = validateProject(name === "bench-5v-high-side" ? { ...p, counter: { ...p.counter, drive: "sink" } } : p);
      expect(v.ok && v.value.electrical).toEqual(ELECTRICAL_PRESETS[name]);
    }
    const follower = setDriverKind(d, "emitter-follower");
    expect(follower.electrical.driver.kind).toBe("emitter-follower");
    expect(follower.electrical.segment).toEqual(d.electrical.segment);
    // A high-side switch keeps a switch's base resistors, and takes its preset's where the draft has none.
    const fromSwitch = setDriverKind(d, "high-side-switch");
    expect([fromSwitch.electrical.driver.baseResistor, fromSwitch.electrical.driver.baseEmitterResistor]).toEqual([
      d.electrical.driver.baseResistor,
      d.electrical.driver.baseEmitterResistor,
    ]);
    const fromFollower = setDriverKind(setElectricalPreset(d, "cathode-5v-follower"), "high-side-switch");
    expect([fromFollower.electrical.driver.baseResistor, fromFollower.electrical.driver.baseEmitterResistor]).toEqual([6800, 10_000]);
    // Its lit cells sit on other lines: the synthesis reads that much of the electrical section.
    expect(sameSynthesisInput(d, fromSwitch)).toBe(false);
    expect(sameSynthesisInput(d, follower)).toBe(true);
  });

  it("read per-output resistors as a list", () => {
    const d = draftFromProject(example("turntable-position"));
    const next = setOverridesText(d, "driver.emitterResistors", "1a=330, 2b = 300");
    expect(next?.electrical.driver.emitterResistors).toEqual({ "1a": 330, "2b": 300 });
    expect(overridesText(next?.electrical.driver.emitterResistors ?? {})).toBe("1a=330, 2b=300");
    expect(setOverridesText(d, "segment.seriesResistors", "1a:330")).toBeNull();
    expect(setOverridesText(d, "segment.seriesResistors", "")?.electrical.segment.seriesResistors).toEqual({});
  });

  it("tell an edit the synthesis does not read (electrical) from one it does", () => {
    const d = draftFromProject(example("relay-hex-monitor"));
    const supply = setElectricalText(d, field("supply.volts"), "6");
    if (!supply) throw new Error("no draft");
    expect(onlyElectricalChanged(d, supply)).toBe(true);
    expect(sameSynthesisInput(d, supply)).toBe(true);
    expect(onlyElectricalChanged(d, setTitle(supply, "Other"))).toBe(false);
    expect(onlyElectricalChanged(d, { ...d, show: [...d.show].reverse() })).toBe(false);
    expect(onlyElectricalChanged(d, d)).toBe(false);
  });
});
