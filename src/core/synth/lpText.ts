/**
 * Text of the LP format HiGHS reads, shared by the matrix and the coded
 * decoder models.
 */

/** Joins terms with + (a term may carry its own "- " or "+ "), ten to a line; no terms is "0". */
export function lpSum(terms: readonly string[]): string {
  if (terms.length === 0) return "0";
  const parts = terms.map((t, i) => (i === 0 || t.startsWith("- ") || t.startsWith("+ ") ? t : `+ ${t}`));
  const lines: string[] = [];
  for (let i = 0; i < parts.length; i += 10) lines.push(parts.slice(i, i + 10).join(" "));
  return lines.join("\n   ");
}

/** A list of column names as the lines of a section (Binaries, General), twelve to a line. */
export function lpNameLines(names: readonly string[]): string[] {
  const lines: string[] = [];
  for (let i = 0; i < names.length; i += 12) lines.push(` ${names.slice(i, i + 12).join(" ")}`);
  return lines;
}
