import { readFileSync } from "node:fs";
import { parseProject } from "../../src/core/project/projectSchema.ts";
import type { Project } from "../../src/core/project/project.ts";

/** Builds and validates a project from a few fields; throws on a bad test fixture. */
export function makeProject(fields: Record<string, unknown>): Project {
  const r = parseProject(JSON.stringify({ schema: "diodeloom/project@1", ...fields }));
  if (!r.ok) throw new Error(`bad fixture: ${JSON.stringify(r.error)}`);
  return r.value;
}

/** A seg7 project that shows the given texts, one per state. */
export function showing(texts: readonly string[], positions = 1, extra: Record<string, unknown> = {}): Project {
  return makeProject({ counter: { states: texts.length }, display: { positions, cell: "seg7" }, show: texts, ...extra });
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

/** A three-state seven-segment project ("1", "7", "8") as file text, for command tests. */
export const ONE_SEVEN_EIGHT_TEXT = JSON.stringify({
  schema: "diodeloom/project@1",
  title: "One seven",
  counter: { states: 3 },
  display: {},
  show: ["1", "7", "8"],
});
