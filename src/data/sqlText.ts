import { inputProblem, type InputProblem } from '../core/inputProblem';

/**
 * Pieces of standard SQL text shared by the queries Lurk prints for a user's own database (SQL:1992 §5.2
 * delimited identifiers and character literals); tested on DuckDB and PostgreSQL.
 */

/** A delimited identifier: in double quotes, with any " doubled. */
export function quoteSqlIdentifier(name: string): string {
  return `"${name.replace(/"/g, '""')}"`;
}

/** A character literal: in single quotes, with any ' doubled. */
export function quoteSqlString(text: string): string {
  return `'${text.replace(/'/g, "''")}'`;
}

/**
 * The parts of a table name as typed: `research.visits` is a schema and a table; a part in double quotes keeps
 * its dots and spaces (`"my.table"`, `research."2024 visits"`), with "" standing for one quote inside it.
 * Returns the parts, or a problem naming `field` when the text is empty or a quote is not closed.
 */
export function readTableName(text: string, field = 'table'): { parts: string[]; problem: InputProblem | null } {
  const parts: string[] = [];
  let i = 0;
  const s = text.trim();
  if (s === '') return { parts, problem: inputProblem(field, 'required', 'needs the name of the table (or view) that holds the data') };
  while (i < s.length) {
    let part = '';
    if (s[i] === '"') {
      i++;
      for (;;) {
        if (i >= s.length) return { parts, problem: inputProblem(field, 'unclosed-quote', `has a double quote that is not closed: ${s}`) };
        if (s[i] === '"' && s[i + 1] === '"') {
          part += '"';
          i += 2;
        } else if (s[i] === '"') {
          i++;
          break;
        } else part += s[i++];
      }
    } else {
      while (i < s.length && s[i] !== '.') part += s[i++];
      part = part.trim();
    }
    if (part === '') return { parts, problem: inputProblem(field, 'empty-part', `has an empty part: ${s}`) };
    parts.push(part);
    while (i < s.length && s[i] === ' ') i++;
    if (i < s.length) {
      if (s[i] !== '.') return { parts, problem: inputProblem(field, 'bad-name', `must be a name or schema.name, got ${s}`) };
      i++;
      while (i < s.length && s[i] === ' ') i++;
      if (i >= s.length) return { parts, problem: inputProblem(field, 'empty-part', `has an empty part: ${s}`) };
    }
  }
  return { parts, problem: null };
}

/** A table name quoted part by part: ["research", "visits"] → "research"."visits". */
export function quoteTableName(parts: readonly string[]): string {
  return parts.map(quoteSqlIdentifier).join('.');
}

/**
 * A one-row query result as pasted by a user or returned by a driver: a JSON object (or a one-element array of
 * one), or CSV text with a header line and one data line (comma, semicolon or tab separated). Keys are
 * lower-cased. Throws nothing: returns null when the text is neither.
 */
export function readResultRow(text: string): Record<string, unknown> | null {
  const s = text.trim();
  if (s === '') return null;
  if (s.startsWith('{') || s.startsWith('[')) {
    try {
      let json: unknown = JSON.parse(s);
      if (Array.isArray(json) && json.length === 1) json = json[0];
      if (json === null || typeof json !== 'object' || Array.isArray(json)) return null;
      return Object.fromEntries(Object.entries(json as Record<string, unknown>).map(([k, v]) => [k.trim().toLowerCase(), v]));
    } catch {
      return null;
    }
  }
  const lines = s.split(/\r?\n/).filter((l) => l.trim() !== '' && !/^[-+| ]+$/.test(l));
  if (lines.length < 2) return null;
  const separator = [',', ';', '\t', '|'].find((c) => lines[0].includes(c)) ?? ',';
  const cells = (line: string) => line.split(separator).map((c) => c.trim().replace(/^"(.*)"$/, '$1'));
  const header = cells(lines[0]).map((h) => h.toLowerCase());
  const values = cells(lines[1]);
  return Object.fromEntries(header.map((h, i) => [h, values[i] ?? null]));
}
