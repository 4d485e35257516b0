/**
 * The limits of a project, in one place: the schema checks them, the
 * command line and the app read them for their own checks, hints and form
 * fields, and docs/project-format.md states them.
 *
 * They keep every valid project small enough to synthesize, draw and solve
 * within its time limit; none is a physical limit of a real matrix.
 */
import type { Problem } from "../result/result.ts";

/** An inclusive range of whole numbers. */
export interface WholeRange {
  readonly min: number;
  readonly max: number;
}

export const LIMITS = {
  /** Largest project file, bytes (1 MiB): the biggest real project is a few tens of kilobytes. */
  fileBytes: 1024 * 1024,
  /** Deepest nesting of arrays and objects in the file; a project needs 4 (`electrical.tolerance.temperatureC`). */
  nesting: 32,
  /** Counter states N. */
  states: { min: 2, max: 256 } as WholeRange,
  /**
   * Stages of a `custom` counter code (the length of each code string). A
   * Johnson counter has N/2 stages and a binary one ceil(log2 N), so the
   * state limit bounds those.
   */
  codeStages: { min: 1, max: 16 } as WholeRange,
  /** Display positions D. */
  positions: { min: 1, max: 8 } as WholeRange,
  /** Most diodes on any path (`synthesis.maxDepth`, in code `depthLimit`). */
  depthLimit: { min: 1, max: 3 } as WholeRange,
  /** Time limit of the exact optimizer, milliseconds (up to one hour). */
  timeLimitMs: { min: 1, max: 3_600_000 } as WholeRange,
  /** Seed of the randomised steps: a non-negative 31-bit integer. */
  seed: { min: 0, max: 2 ** 31 - 1 } as WholeRange,
  /** Longest title, characters (UTF-16 code units, as an HTML text field counts them). */
  titleChars: 200,
  /** Most segments of a custom cell. */
  customSegments: 32,
  /** Decoders of an instrument (a file with `decoders`); each is synthesized, solved and drawn in turn. */
  decoders: { min: 1, max: 16 } as WholeRange,
  /** Longest decoder name, characters: it titles the decoder's sheets and sections. */
  decoderNameChars: 40,
} as const;

/**
 * The problem with a file of `bytes` bytes, or undefined when its size is
 * allowed. The command line and the app ask this before reading a file.
 *
 * @example
 * fileSizeProblem(2_000_000);
 * // { path: "", message: "the file is larger than 1 MiB (2000000 bytes; the limit is 1048576); a project needs far less" }
 */
export function fileSizeProblem(bytes: number): Problem | undefined {
  if (bytes <= LIMITS.fileBytes) return undefined;
  return {
    path: "",
    message: `the file is larger than 1 MiB (${bytes} bytes; the limit is ${LIMITS.fileBytes}); a project needs far less`,
  };
}
