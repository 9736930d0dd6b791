/** A convention as a method's summary keeps it (plain JSON): the core's id and text. */
export type SummaryConvention = { readonly id: string; readonly text: string };

/** The conventions of a result, as plain JSON for a summary. */
export function summaryConventions(conventions: readonly { readonly id: string; readonly text: string }[]): SummaryConvention[] {
  return conventions.map((c) => ({ id: c.id, text: c.text }));
}

/** Conventions read back from a file: each {id, text} of strings; anything else is left out (older files: none). */
export function readConventions(value: unknown): SummaryConvention[] {
  if (!Array.isArray(value)) return [];
  return value
    .filter((c): c is Record<string, unknown> => c !== null && typeof c === 'object' && typeof (c as Record<string, unknown>).id === 'string' && typeof (c as Record<string, unknown>).text === 'string')
    .map((c) => ({ id: c.id as string, text: c.text as string }));
}
