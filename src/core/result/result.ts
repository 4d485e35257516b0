/**
 * Expected failures travel as values, never as exceptions.
 *
 * A `Problem` names where in the input the trouble is (a dotted path such as
 * `display.positions` or `show[3]`) and says what would fix it.
 */
export interface Problem {
  /** Dotted path into the input, `""` for the whole document. */
  readonly path: string;
  /** One sentence a person can act on. */
  readonly message: string;
}

export type Result<T, E = readonly Problem[]> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly error: E };

export function ok<T>(value: T): { readonly ok: true; readonly value: T } {
  return { ok: true, value };
}

export function fail<E>(error: E): { readonly ok: false; readonly error: E } {
  return { ok: false, error };
}

/** Formats problems one per line as `path: message`. */
export function formatProblems(problems: readonly Problem[]): string {
  return problems.map((p) => (p.path === "" ? p.message : `${p.path}: ${p.message}`)).join("\n");
}
