/**
 * Writes a table as CSV (RFC 4180 quoting, CRLF line ends) that is safe to open in a spreadsheet: a text cell
 * beginning with =, +, -, @, a tab or a carriage return would be run as a formula, so it gets a leading
 * apostrophe (the OWASP "CSV injection" advice). Numbers are written as plain numbers; missing values as empty.
 */
export function toSafeCsv(columns: readonly string[], rows: ReadonlyArray<ReadonlyArray<string | number | null | undefined>>): string {
  const lines = [columns.map((c) => quote(neutraliseFormula(c))).join(',')];
  for (const row of rows) lines.push(row.map(cell).join(','));
  return lines.join('\r\n') + '\r\n';
}

function cell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  return quote(neutraliseFormula(value));
}

/** A text that a spreadsheet would evaluate gets a leading apostrophe; a plain number stays as it is. */
export function neutraliseFormula(text: string): string {
  if (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text)) return text;
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

function quote(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
