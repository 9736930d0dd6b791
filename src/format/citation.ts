/**
 * A reference as the core writes it — "Authors (Year). Title. Journal Volume(Issue):pages." — in the style of the
 * robustness statement: "Authors. Title. Journal. Year;Volume(Issue):pages." A note in parentheses at the end
 * (such as "recalled from memory") stays at the end. Text in another shape keeps its words, with the year moved
 * after them.
 */
export function statementCitation(reference: string): string {
  const head = /^(.+?) \((\d{4})\)\.? (.+)$/.exec(reference.trim());
  if (!head) return reference.trim();
  const [, authors, year, rest] = head;
  // Title. Journal Volume(Issue):pages, then any note ("(the model) — recalled from memory").
  const journal = /^(.*?)\. ([^.]+?) (\d+(?:\(\d+\))?:[\w–-]+)(.*?)\.?$/.exec(rest);
  if (journal) {
    const [, title, source, volume, note] = journal;
    return `${authors}. ${title}. ${source}. ${year};${volume}.${note ? ` ${note.trim().replace(/^— /, '')}` : ''}`;
  }
  return `${authors}. ${rest.replace(/\.$/, '')}. ${year}.`;
}
