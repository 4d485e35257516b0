/**
 * Results already worked out, by glyph set (`rowKey` of core/compare): the
 * best figure known and the matrix that has it. The project's own exact run
 * and every row of an exact comparison leave their results here, so that
 * adopting a comparison row, or undoing back to glyphs worked out before,
 * shows the exact result at once instead of throwing it away. Matrices are
 * kept as the workers sent them; the page verifies one before it shows it.
 */
import { combineFigures, isBetter, type Figure } from "./figures.ts";

export interface KnownResult {
  readonly figure: Figure;
  /** The matrix with `figure.count` diodes, as plain data. */
  readonly matrix: unknown;
}

/** Glyph sets remembered; the least recently used one is forgotten first. */
export const KNOWN_CAPACITY = 64;

export class KnownResults {
  private readonly entries = new Map<string, KnownResult>();

  constructor(private readonly capacity = KNOWN_CAPACITY) {}

  /**
   * Adds what a run found for a glyph set, combined with what was known:
   * the smaller count keeps its matrix, the bounds combine. Returns true when
   * the known figure changed.
   *
   * @example known.remember(rowKey(project), { figure: matrixFigure(m), matrix: m });
   */
  remember(key: string, result: KnownResult): boolean {
    const old = this.entries.get(key);
    const figure = combineFigures([old?.figure, result.figure]) ?? result.figure;
    const next: KnownResult = { figure, matrix: !old || result.figure.count < old.figure.count ? result.matrix : old.matrix };
    this.entries.delete(key);
    this.entries.set(key, next);
    while (this.entries.size > this.capacity) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.entries.delete(oldest);
    }
    return !old || isBetter(figure, old.figure) || next.matrix !== old.matrix;
  }

  get(key: string): KnownResult | undefined {
    return this.entries.get(key);
  }

  /** Every glyph set with a proven figure, by key. */
  proven(): [string, Figure][] {
    return [...this.entries].filter(([, r]) => r.figure.status === "proven").map(([k, r]) => [k, r.figure]);
  }
}
