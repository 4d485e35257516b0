import { readFileSync } from "node:fs";
import { parseProject } from "../../src/core/project/projectSchema.ts";
import type { Project } from "../../src/core/project/project.ts";

/**
 * Builds and validates a format-1 project from a few fields (its
 * `electrical` section means format 1's current sink at 100 V); throws on
 * a bad test fixture.
 */
export function makeProject(fields: Record<string, unknown>): Project {
  const r = parseProject(JSON.stringify({ schema: "diodeloom/project@1", ...fields }));
  if (!r.ok) throw new Error(`bad fixture: ${JSON.stringify(r.error)}`);
  return r.value;
}

/** Builds and validates a format-2 project from a few fields (no `electrical`: the 5 V preset). */
export function makeProject2(fields: Record<string, unknown>): Project {
  const r = parseProject(JSON.stringify({ schema: "diodeloom/project@2", ...fields }));
  if (!r.ok) throw new Error(`bad fixture: ${JSON.stringify(r.error)}`);
  return r.value;
}

/** A seg7 format-1 project that shows the given texts, one per state. */
export function showing(texts: readonly string[], positions = 1, extra: Record<string, unknown> = {}): Project {
  return makeProject({ counter: { states: texts.length }, display: { positions, cell: "seg7" }, show: texts, ...extra });
}

/** A seg7 format-2 project that shows the given texts, with an `electrical` section (a preset, a kind, overrides). */
export function showingWith(texts: readonly string[], electrical: Record<string, unknown>, positions = 1): Project {
  return makeProject2({ counter: { states: texts.length }, display: { positions, cell: "seg7" }, show: texts, electrical });
}

export const EXAMPLES = ["relay-hex-monitor", "turntable-position", "die-roller", "antenna-rotator"] as const;

export function exampleText(name: string): string {
  return readFileSync(new URL(`../../public/examples/${name}.json`, import.meta.url), "utf8");
}

export function example(name: string): Project {
  const r = parseProject(exampleText(name));
  if (!r.ok) throw new Error(`example ${name} is invalid: ${JSON.stringify(r.error)}`);
  return r.value;
}

/**
 * An example as format 1 described it: its own display, texts and synthesis,
 * written as a format-1 file without an `electrical` section, so format 1's
 * current sink at 100 V under 19-die strings. Tests written against that
 * circuit keep checking it.
 */
export function exampleFormat1(name: string): Project {
  const { electrical: _electrical, schema: _schema, ...rest } = JSON.parse(exampleText(name)) as Record<string, unknown>;
  return makeProject(rest);
}

/** A three-state seven-segment project ("1", "7", "8") as file text, for command tests. */
export const ONE_SEVEN_EIGHT_TEXT = JSON.stringify({
  schema: "diodeloom/project@1",
  title: "One seven",
  counter: { states: 3 },
  display: {},
  show: ["1", "7", "8"],
});
