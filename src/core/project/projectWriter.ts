/**
 * Writes a validated project back as `diodeloom/project@2` JSON, normalised:
 * every field spelled out (defaults included, the electrical preset named
 * when the values started from one), glyph overrides as arrays of segment
 * names, two-space indentation, keys in the schema's order. A format-1 file
 * read and written again becomes format 2 with the same meaning.
 *
 * It round-trips: `parseProject(serializeProject(p))` gives a project equal
 * to `p`, and so the same decode spec and the same matrix.
 */
import type { ElectricalModel, Project, SynthesisFields, SynthesisOptions } from "./project.ts";
import { figureFields } from "./figureSchema.ts";

/** The synthesis options as the file spells them (`maxDepth` is the depth limit, `depth` the policy). */
export function synthesisFields(s: SynthesisOptions): SynthesisFields {
  return {
    maxDepth: s.depthLimit,
    depth: s.policy,
    buses: s.buses,
    links: s.links,
    timeLimitMs: s.timeLimitMs,
    seed: s.seed,
    decode: s.decode,
    darkInput: s.darkInput,
  };
}

/**
 * @example
 * const text = serializeProject(project);
 * parseProject(text); // { ok: true, value: <equal to project> }
 */
export function serializeProject(project: Project): string {
  const { cell } = project.display;
  const e = project.electrical;
  const doc = {
    schema: project.schema,
    title: project.title,
    counter: {
      states: project.counter.states,
      drive: project.counter.drive,
      code: project.counter.code,
      ...(project.counter.code === "custom" ? { codes: [...project.counter.codes] } : {}),
    },
    display: {
      positions: project.display.positions,
      cell: cell.kind,
      ...(cell.kind === "custom" ? { segments: [...cell.segments] } : {}),
      ...(cell.figure ? { figure: figureFields(cell.figure) } : {}),
    },
    glyphs: Object.fromEntries(Object.entries(project.glyphOverrides).map(([ch, segs]) => [ch, [...segs]])),
    show: [...project.show],
    synthesis: synthesisFields(project.synthesis),
    electrical: electricalFields(e),
  };
  return JSON.stringify(doc, null, 2) + "\n";
}

/**
 * The `electrical` section as format 2 spells it: the preset the values
 * started from (null for none), then every field in the schema's order (a
 * fresh copy), so that the file means the same whatever the presets become
 * and two equal models give the same text.
 */
export function electricalFields(e: ElectricalModel): ElectricalModel {
  const { counterOutput: co, lowLine: ll, logicSupply: ls, diode: d, driver: dr, segment: sg, supply: su, tolerance: t } = e;
  return {
    preset: e.preset,
    temperatureC: e.temperatureC,
    ghostFraction: e.ghostFraction,
    counterOutput: { high: co.high, low: co.low, resistance: co.resistance, lowResistance: co.lowResistance, maxCurrentA: co.maxCurrentA },
    lowLine: { low: ll.low, high: ll.high, resistance: ll.resistance, maxCurrentA: ll.maxCurrentA },
    logicSupply: { volts: ls.volts },
    diode: { is: d.is, n: d.n, rs: d.rs, maxForwardA: d.maxForwardA, maxReverseV: d.maxReverseV },
    pullDown: e.pullDown,
    gatePullUp: e.gatePullUp,
    driver: {
      kind: dr.kind,
      is: dr.is,
      betaF: dr.betaF,
      betaR: dr.betaR,
      emitterResistor: dr.emitterResistor,
      emitterResistors: { ...dr.emitterResistors },
      baseResistor: dr.baseResistor,
      baseEmitterResistor: dr.baseEmitterResistor,
      maxVceV: dr.maxVceV,
      maxPowerW: dr.maxPowerW,
      maxCollectorA: dr.maxCollectorA,
    },
    segment: {
      leds: sg.leds,
      is: sg.is,
      n: sg.n,
      rs: sg.rs,
      seriesResistor: sg.seriesResistor,
      seriesResistors: { ...sg.seriesResistors },
      targetA: sg.targetA,
      maxA: sg.maxA,
    },
    supply: { volts: su.volts, minVolts: su.minVolts, maxVolts: su.maxVolts },
    tolerance: { resistorPct: t.resistorPct, betaMin: t.betaMin, betaMax: t.betaMax, temperatureC: [t.temperatureC[0], t.temperatureC[1]] },
  };
}
