/**
 * Fuzzing the command line with broken project files: whatever the bytes,
 * `diodeloom synth` exits 2 with a one-line-per-problem message, prints no
 * stack trace and writes nothing.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { main } from "../../src/cli/main.ts";
import { projectDoc } from "../support/arbitraries.ts";
import { recordingIo } from "../support/recordingIo.ts";

const SEED = 7741;

/** Breaks a valid document: drops, retypes or adds a field somewhere in it. */
const mutation = fc.record({
  kind: fc.constantFrom("drop", "retype", "extra", "truncate", "garble", "negate"),
  pick: fc.nat(),
  junk: fc.oneof(fc.string(), fc.double(), fc.constant(null), fc.constant(Number.NaN), fc.array(fc.integer()), fc.boolean()),
  cut: fc.nat(),
});

function paths(value: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  if (typeof value !== "object" || value === null) return [prefix];
  const out: (string | number)[][] = [prefix];
  for (const [k, v] of Object.entries(value)) out.push(...paths(v, [...prefix, Array.isArray(value) ? Number(k) : k]));
  return out;
}

function mutate(doc: Record<string, unknown>, m: { kind: string; pick: number; junk: unknown; cut: number }): string {
  const text = JSON.stringify(doc);
  if (m.kind === "truncate") return text.slice(0, m.cut % text.length);
  if (m.kind === "garble") {
    const i = m.cut % text.length;
    return text.slice(0, i) + "}{,:" + text.slice(i + 1);
  }
  const copy = JSON.parse(text) as Record<string, unknown>;
  const all = paths(copy).filter((p) => p.length > 0);
  const path = all[m.pick % all.length] as (string | number)[];
  let parent: Record<string | number, unknown> = copy;
  for (const key of path.slice(0, -1)) parent = parent[key] as Record<string | number, unknown>;
  const last = path[path.length - 1] as string | number;
  if (m.kind === "drop") {
    if (Array.isArray(parent)) parent.splice(Number(last), 1);
    else delete parent[last];
  } else if (m.kind === "retype") parent[last] = m.junk;
  else if (m.kind === "negate") parent[last] = typeof parent[last] === "number" ? -1 - (parent[last] as number) : -1;
  else (parent as Record<string, unknown>)["zz_extra"] = m.junk;
  return JSON.stringify(copy).replace(/null/g, m.kind === "retype" && Number.isNaN(m.junk) ? "NaN" : "null");
}

describe("bad project files (fast-check seed 7741)", () => {
  it("always exit 2 with a message, never a crash", async () => {
    let rejected = 0;
    await fc.assert(
      fc.asyncProperty(projectDoc, mutation, async (doc, m) => {
        const io = recordingIo({ "p.json": mutate(doc as Record<string, unknown>, m) });
        const code = await main(["synth", "p.json", "--direct"], io);
        const err = io.stderr.join("");
        // Some mutations leave a valid project (dropping an optional field); those must succeed.
        expect([0, 2]).toContain(code);
        if (code === 2) {
          rejected++;
          expect(err).toMatch(/^p\.json: .+/);
          expect(err).not.toMatch(/\n\s+at |Error:|TypeError|undefined/);
          expect(io.stdout.join("")).toBe("");
        } else {
          expect(err).toBe("");
        }
        expect(io.written.size).toBe(0);
      }),
      { seed: SEED, numRuns: 300 },
    );
    expect(rejected).toBeGreaterThan(150);
  });

  it("reject random text that is not a project", async () => {
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.string(), fc.json()), async (text) => {
        const io = recordingIo({ "p.json": text });
        expect(await main(["synth", "p.json"], io)).toBe(2);
        expect(io.stderr.join("")).toMatch(/^p\.json: /);
      }),
      { seed: SEED, numRuns: 200 },
    );
  });
});
