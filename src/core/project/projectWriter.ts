/**
 * Writes a validated project back as `diodeloom/project@1` JSON, normalised:
 * every field spelled out (defaults included), glyph overrides as arrays of
 * segment names, two-space indentation, keys in the schema's order.
 *
 * It round-trips: `parseProject(serializeProject(p))` gives a project equal
 * to `p`, and so the same decode spec and the same matrix.
 */
import type { Project, SynthesisFields, SynthesisOptions } from "./project.ts";
import { figureFields } from "./figureSchema.ts";

/** The synthesis options as the file spells them (`maxDepth` is the depth limit, `depth` the policy). */
export function synthesisFields(s: SynthesisOptions): SynthesisFields {
  return { maxDepth: s.depthLimit, depth: s.policy, buses: s.buses, links: s.links, timeLimitMs: s.timeLimitMs, seed: s.seed };
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
    electrical: {
      temperatureC: e.temperatureC,
      counterOutput: { ...e.counterOutput },
      diode: { ...e.diode },
      pullDown: e.pullDown,
      driver: { ...e.driver, emitterResistors: { ...e.driver.emitterResistors } },
      string: { ...e.string },
      supply: { ...e.supply },
      tolerance: { ...e.tolerance, temperatureC: [...e.tolerance.temperatureC] },
    },
  };
  return JSON.stringify(doc, null, 2) + "\n";
}
