/** Cell texts that mean "missing" (trimmed, any case), besides an empty cell. "." is a common export form. */
export const MISSING_CELL_TEXTS: readonly string[] = Object.freeze(['NA', 'N/A', 'NAN', '.', 'NULL', '#N/A']);
const MISSING_SET = new Set(MISSING_CELL_TEXTS);

/** A cell is missing when empty or one of {@link MISSING_CELL_TEXTS}. Fast for the common case of a number. */
export function isMissingCell(text: string): boolean {
  if (text.length === 0) return true;
  if (text.length > 6) return text.trim() === '';
  const t = text.trim();
  return t === '' || MISSING_SET.has(t.toUpperCase());
}
