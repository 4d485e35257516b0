/**
 * The presets, the format-2 `electrical` section on top of them, and format
 * 1's section migrated with its meaning kept.
 */
import { describe, expect, it } from "vitest";
import {
  DEFAULT_PRESET,
  ELECTRICAL_PRESETS,
  FORMAT1_ELECTRICAL,
  PRESET_INFO,
  PRESET_NAMES,
} from "../../../../src/core/project/electricalPresets.ts";
import { parseProject, validateProject } from "../../../../src/core/project/projectSchema.ts";
import { serializeProject } from "../../../../src/core/project/projectWriter.ts";
import { segmentDropV } from "../../../../src/core/project/electricalSchema.ts";
import { carriedVoltages, SELV_DC_LIMIT_V } from "../../../../src/core/budget/safety.ts";
import { EXAMPLES, exampleText } from "../../../support/projects.ts";

const base = { counter: { states: 2 }, display: {}, show: ["0", "1"] };
const v2 = (electrical?: unknown) =>
  validateProject({ schema: "diodeloom/project@2", ...base, ...(electrical === undefined ? {} : { electrical }) });
const v1 = (electrical?: unknown) =>
  validateProject({ schema: "diodeloom/project@1", ...base, ...(electrical === undefined ? {} : { electrical }) });
const problems = (r: ReturnType<typeof v2>) => (r.ok ? [] : r.error);

describe("presets", () => {
  it("a format-2 project without an electrical section gets the 5 V switch preset, exactly", () => {
    const r = v2();
    expect(DEFAULT_PRESET).toBe("bench-5v-switch");
    expect(r.ok && r.value.electrical).toEqual(ELECTRICAL_PRESETS["bench-5v-switch"]);
    expect(v2({}).ok && (v2({}) as { value: { electrical: unknown } }).value.electrical).toEqual(ELECTRICAL_PRESETS["bench-5v-switch"]);
  });

  it("names six, one per purpose, each a valid, coherent set on every example (the high-side one on its active-low lines)", () => {
    expect(PRESET_NAMES).toEqual([
      "bench-5v-switch",
      "panel-12v-sink",
      "cathode-5v-follower",
      "bench-5v-high-side",
      "line-direct",
      "string-hv-sink",
    ]);
    expect(PRESET_INFO.every((p) => p.label.length > 20)).toBe(true);
    const kinds = PRESET_NAMES.map((n) => ELECTRICAL_PRESETS[n].driver.kind);
    expect(new Set(kinds)).toEqual(new Set(["low-side-switch", "current-sink", "emitter-follower", "high-side-switch", "direct"]));
    for (const name of EXAMPLES) {
      for (const preset of PRESET_NAMES) {
        const json = JSON.parse(exampleText(name));
        // A high-side switch turns on when its line is pulled low: a sink-drive counter.
        const counter = preset === "bench-5v-high-side" ? { ...json.counter, drive: "sink" } : json.counter;
        const doc = { ...json, counter, electrical: { preset } };
        const r = validateProject(doc);
        expect(r.ok, `${name} with ${preset}: ${JSON.stringify(problems(r))}`).toBe(true);
      }
    }
  });

  it("runs every preset but the high-voltage one at a safe voltage, and that one above 60 V", () => {
    for (const name of PRESET_NAMES) {
      const above = Math.max(...carriedVoltages(ELECTRICAL_PRESETS[name])) > SELV_DC_LIMIT_V;
      expect(above, name).toBe(name === "string-hv-sink");
    }
  });

  it("gives each preset's segment room under its supply: the drop at the target below the lowest supply or the line's level", () => {
    for (const name of PRESET_NAMES) {
      const e = ELECTRICAL_PRESETS[name];
      const drop = segmentDropV(e, e.segment.targetA);
      const feed =
        e.driver.kind === "direct"
          ? e.counterOutput.high - 0.6
          : e.driver.kind === "emitter-follower"
            ? e.counterOutput.high - 1.2
            : e.supply.minVolts;
      expect(drop, name).toBeLessThan(feed);
      expect(e.segment.targetA, name).toBeLessThan(e.segment.maxA);
    }
  });

  it("takes every given field over the preset, a per-output map whole", () => {
    const r = v2({ preset: "panel-12v-sink", supply: { volts: 13, maxVolts: 14 }, driver: { emitterResistors: { "1a": 150 } } });
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    const e = r.value.electrical;
    expect(e.preset).toBe("panel-12v-sink");
    expect(e.supply).toEqual({ volts: 13, minVolts: 11.4, maxVolts: 14 });
    expect(e.driver.kind).toBe("current-sink");
    expect(e.driver.emitterResistors).toEqual({ "1a": 150 });
    expect(e.segment).toEqual(ELECTRICAL_PRESETS["panel-12v-sink"].segment);
    // A kind given explicitly overrides the preset's.
    const k = v2({ preset: "panel-12v-sink", driver: { kind: "low-side-switch", baseResistor: 2200 }, segment: { seriesResistor: 270 } });
    expect(k.ok && [k.value.electrical.driver.kind, k.value.electrical.supply.volts]).toEqual(["low-side-switch", 12]);
  });

  it("refuses an unknown preset and an unknown kind, naming what is allowed", () => {
    expect(problems(v2({ preset: "nixie" }))[0]?.path).toBe("electrical.preset");
    expect(problems(v2({ preset: "nixie" }))[0]?.message).toMatch(/must be one of "bench-5v-switch"/);
    expect(problems(v2({ driver: { kind: "darlington" } }))[0]?.message).toMatch(
      /"current-sink", "low-side-switch", "emitter-follower", "high-side-switch", "direct"/,
    );
  });
});

describe("the checks each driver kind needs", () => {
  it("a switch needs a base resistor; a switch, a follower and direct drive a series resistor", () => {
    expect(problems(v2({ driver: { baseResistor: 0 } }))).toEqual([
      { path: "electrical.driver.baseResistor", message: "got 0; a switch needs a base resistor (above 0 Ω) to set its base current" },
    ]);
    for (const preset of ["bench-5v-switch", "cathode-5v-follower", "line-direct"]) {
      expect(problems(v2({ preset, segment: { seriesResistor: 0 } }))[0]?.path, preset).toBe("electrical.segment.seriesResistor");
    }
    // A sink may go without one (0: no collector resistor), and a follower without a base resistor.
    expect(v2({ preset: "panel-12v-sink", segment: { seriesResistor: 0 } }).ok).toBe(true);
    expect(v2({ preset: "cathode-5v-follower", driver: { baseResistor: 0 } }).ok).toBe(true);
  });

  it("says when the segment's LEDs drop more than what feeds them, naming the field that fixes it", () => {
    const sink = problems(v2({ preset: "panel-12v-sink", segment: { leds: 6 } }));
    expect(sink[0]?.path).toBe("electrical.supply.minVolts");
    expect(sink[0]?.message).toMatch(
      /6 LEDs drop at the target current; raise the supply or put fewer LEDs in each segment \(segment\.leds\)/,
    );
    const direct = problems(v2({ preset: "line-direct", segment: { leds: 3 } }));
    expect(direct[0]?.path).toBe("electrical.segment.leds");
    expect(direct[0]?.message).toMatch(/the counter's 5 V high level, less a matrix diode \(about 4\.4 V\), cannot light 3 LEDs/);
    expect(problems(v2({ preset: "cathode-5v-follower", segment: { leds: 2 } }))[0]?.path).toBe("electrical.segment.leds");
  });
});

describe("format 1", () => {
  it("keeps its meaning: a current sink at 100 V under 19-die strings, with format 1's defaults", () => {
    const r = v1();
    expect(r.ok && r.value.electrical).toEqual(FORMAT1_ELECTRICAL);
    expect(r.ok && r.value.schema).toBe("diodeloom/project@2");
    const s = v1({
      string: { dies: 12, targetA: 0.0002 },
      counterOutput: { high: 3.3 },
      supply: { volts: 48, minVolts: 45, maxVolts: 50 },
    });
    if (!s.ok) throw new Error(JSON.stringify(s.error));
    const e = s.value.electrical;
    expect([e.preset, e.driver.kind, e.segment.leds, e.segment.targetA, e.segment.rs, e.segment.seriesResistor]).toEqual([
      null,
      "current-sink",
      12,
      0.0002,
      0,
      0,
    ]);
    // The tie-on net sits at the counter's high level, as format 1's tie-on did.
    expect(e.logicSupply.volts).toBe(3.3);
  });

  it("names its own fields in its problems, and refuses format 2's", () => {
    const low = problems(v1({ supply: { volts: 40, minVolts: 30, maxVolts: 50 } }));
    expect(low[0]?.path).toBe("electrical.supply.minVolts");
    expect(low[0]?.message).toMatch(/below the 52\.4 V that 19 dies drop/);
    expect(low[0]?.message).toMatch(/\(string\.dies\)/);
    expect(problems(v1({ segment: { leds: 2 } }))[0]?.message).toMatch(/unknown key/);
    expect(problems(v1({ string: { targetA: 0.02 } }))[0]?.path).toBe("electrical.string.targetA");
  });

  it("is written back as format 2 with every value and no preset, and reads back to the same project", () => {
    const r = parseProject(JSON.stringify({ schema: "diodeloom/project@1", ...base, electrical: { string: { dies: 12 } } }));
    if (!r.ok) throw new Error("no parse");
    const text = serializeProject(r.value);
    const doc = JSON.parse(text);
    expect(doc.schema).toBe("diodeloom/project@2");
    expect(doc.electrical.preset).toBeNull();
    expect(doc.electrical.segment.leds).toBe(12);
    const again = parseProject(text);
    expect(again.ok && again.value).toEqual(r.value);
  });
});
