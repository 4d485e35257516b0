/**
 * The allowed range of every electrical field: the schema enforces it at
 * both ends, and docs/project-format.md states the same ranges.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { ELECTRICAL_RANGES } from "../../../../src/core/project/electricalSchema.ts";
import { numberRuleText } from "../../../../src/core/project/fieldRules.ts";
import { LIMITS } from "../../../../src/core/project/limits.ts";
import { validateProject } from "../../../../src/core/project/projectSchema.ts";

const DOC = readFileSync(new URL("../../../../docs/project-format.md", import.meta.url), "utf8");
const base = { schema: "diodeloom/project@2", counter: { states: 2 }, display: {}, show: ["0", "1"] };

/** The cells of the table row whose first cell is `field` in backquotes, in the part of the file after `heading`. */
function docRow(field: string, heading = ""): string[] {
  const line = DOC.slice(DOC.indexOf(heading))
    .split("\n")
    .find((l) => l.startsWith(`| \`${field}\` |`));
  return line ? line.split("|").map((c) => c.trim()) : [];
}

/** An electrical section with one field set, by its path below `electrical`. */
function withField(path: string, value: number): Record<string, unknown> {
  const [a, b] = path.split(".") as [string, string | undefined];
  if (path === "driver.emitterResistors") return { driver: { emitterResistors: { "1a": value } } };
  if (path === "segment.seriesResistors") return { segment: { seriesResistors: { "1a": value } } };
  if (path === "tolerance.temperatureC") return { tolerance: { temperatureC: [value, value] } };
  return b === undefined ? { [a]: value } : { [a]: { [b]: value } };
}

/** Problems at `electrical.<path>` (cross-field rules elsewhere may object to an extreme; they are not this test's concern). */
function fieldProblems(path: string, value: number): string[] {
  const r = validateProject({ ...base, electrical: withField(path, value) });
  const at = `electrical.${path}`;
  return r.ok
    ? []
    : r.error.filter((p) => p.path === at || p.path.startsWith(`${at}.`) || p.path.startsWith(`${at}[`)).map((p) => p.message);
}

describe("ELECTRICAL_RANGES", () => {
  it.each(Object.keys(ELECTRICAL_RANGES))("%s: both ends pass its range, just outside each end is refused with it", (path) => {
    const rule = ELECTRICAL_RANGES[path as keyof typeof ELECTRICAL_RANGES];
    const rangeText = numberRuleText(rule);
    for (const x of [rule.min, rule.max]) expect(fieldProblems(path, x), `${path} = ${x}`).not.toContain(`got ${x}; ${rangeText}`);
    const step = (x: number): number => (rule.integer ? 1 : Math.max(Math.abs(x) * 1e-6, 1e-300));
    for (const x of [rule.min - step(rule.min), rule.max + step(rule.max)]) {
      expect(fieldProblems(path, x), `${path} = ${x}`).toContain(`got ${x}; ${rangeText}`);
    }
  });

  it("refuses the extremes that used to crash the budget (5e-324 A and 1e-300 A targets)", () => {
    expect(fieldProblems("segment.targetA", 5e-324)).toEqual(["got 5e-324; must be a number from 1e-6 to 10 A"]);
    expect(fieldProblems("segment.targetA", 1e-300)).toEqual(["got 1e-300; must be a number from 1e-6 to 10 A"]);
  });

  it("is the table in docs/project-format.md", () => {
    for (const [path, rule] of Object.entries(ELECTRICAL_RANGES)) {
      const stated = docRow(path, "### Allowed ranges")[2] ?? "";
      const expected = numberRuleText(rule).replace(/^must be an? (whole )?number from /, "");
      expect(stated.startsWith(expected), `${path}: docs say "${stated}", the schema "${expected}"`).toBe(true);
    }
  });
});

describe("LIMITS in docs/project-format.md", () => {
  it("states the limits the schema enforces", () => {
    const range = (r: { min: number; max: number }): string => `${r.min}-${r.max}`;
    expect(docRow("counter.states")[2]).toBe(range(LIMITS.states));
    expect(docRow("display.positions")[2]).toBe(range(LIMITS.positions));
    expect(DOC).toContain(`| \`synthesis.maxDepth\` (\`--depth-limit\`) | ${range(LIMITS.depthLimit)} |`);
    expect(DOC).toContain(`| \`synthesis.timeLimitMs\` (\`--time-limit\`) | ${range(LIMITS.timeLimitMs)} |`);
    expect(DOC).toContain(`| \`synthesis.seed\` (\`--seed\`) | ${range(LIMITS.seed)} |`);
    expect(DOC).toContain(`at most 1 MiB (${LIMITS.fileBytes} bytes)`);
    expect(DOC).toContain(`| \`title\` | at most ${LIMITS.titleChars} characters |`);
  });
});
