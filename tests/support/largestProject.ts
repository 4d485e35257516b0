/**
 * The largest projects the format allows (see src/core/project/limits.ts):
 * 256 states on 8 positions, of a 32-segment custom cell with 62 glyphs of
 * random segments, or of seven-segment hex digits. Random from a fixed seed
 * (mulberry32), so every run tests the same file. Invented data, for tests.
 */
import { LIMITS } from "../../src/core/project/limits.ts";
import type { Project } from "../../src/core/project/project.ts";
import { makeProject } from "./projects.ts";

/** mulberry32: a small, well-known 32-bit generator; the same seed gives the same numbers. */
function generator(seed: number): () => number {
  let a = seed | 0;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return (t ^ (t >>> 14)) >>> 0;
  };
}

const CHARS = [..."0123456789abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ"];

/** The project file's fields (before `schema`) of the largest custom-cell project. */
export function largestCustomFields(seed = 20261203, timeLimitMs = 20_000): Record<string, unknown> {
  const rnd = generator(seed);
  const segments = Array.from({ length: LIMITS.customSegments }, (_, i) => `s${i}`);
  const glyphs = Object.fromEntries(CHARS.map((c) => [c, segments.filter(() => rnd() % 2 === 0)]));
  const positions = LIMITS.positions.max;
  const show = Array.from({ length: LIMITS.states.max }, () =>
    Array.from({ length: positions }, () => CHARS[rnd() % CHARS.length]).join(""),
  );
  return {
    title: "Largest custom project",
    counter: { states: LIMITS.states.max },
    display: { positions, cell: "custom", segments },
    glyphs,
    show,
    synthesis: { timeLimitMs },
  };
}

/** The largest custom-cell project, validated. */
export function largestCustomProject(seed?: number, timeLimitMs?: number): Project {
  return makeProject(largestCustomFields(seed, timeLimitMs));
}

/** 256 states of 8 random hex digits on seven-segment cells, validated. */
export function largestHexProject(seed = 20261204, timeLimitMs = 20_000): Project {
  const rnd = generator(seed);
  const hex = [..."0123456789AbCdEF"];
  const positions = LIMITS.positions.max;
  const show = Array.from({ length: LIMITS.states.max }, () => Array.from({ length: positions }, () => hex[rnd() % 16]).join(""));
  return makeProject({
    title: "Largest hex project",
    counter: { states: LIMITS.states.max },
    display: { positions, cell: "seg7" },
    show,
    synthesis: { timeLimitMs },
  });
}
