/**
 * CSV text as RFC 4180 writes it: fields separated by commas, records ended
 * by CRLF, a field quoted when it holds a comma, quote, CR or LF, quotes
 * inside doubled.
 */

/** One field, quoted only when it must be. */
export function csvField(value: string | number): string {
  const s = String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Whole CSV text from records; every record ends in CRLF. */
export function csvText(records: readonly (readonly (string | number)[])[]): string {
  return records.map((r) => r.map(csvField).join(",") + "\r\n").join("");
}
