/** Longest text {@link printable} keeps before cutting it (characters). */
export const PRINTABLE_MAX_LENGTH = 80;

/**
 * Makes text from a file safe to quote in a message shown in a terminal or a page: control characters are
 * escaped, and very long text is cut.
 *
 * **Method.** C0 controls (U+0000–U+001F), DEL (U+007F) and C1 controls (U+0080–U+009F) become `\xNN`
 * (so an ESC sequence prints as `\x1b[31m` instead of colouring the terminal); the bidirectional
 * embedding, override and isolate marks (U+202A–U+202E, U+2066–U+2069), which can reorder what a reader
 * sees, and lone UTF-16 surrogates become `\u{NNNN}`. A text longer than `maxLength` characters after
 * escaping is cut to `maxLength − 1` characters followed by "…".
 *
 * **Special cases.** An empty text stays empty. Ordinary letters in any script, accents and emoji are kept.
 *
 * @param text any text (a column name, a cell)
 * @param maxLength the longest result, at least 2 (default {@link PRINTABLE_MAX_LENGTH})
 */
export function printable(text: string, maxLength = PRINTABLE_MAX_LENGTH): string {
  const limit = Math.max(2, Math.floor(maxLength));
  // Only the start of a huge text can be shown: escape no more than needed (an escape is at most 8 characters).
  const head = text.length > limit * 2 + 2 ? text.slice(0, limit * 2 + 2) : text;
  let out = '';
  let cut = head.length < text.length;
  for (let i = 0; i < head.length; i++) {
    const c = head.charCodeAt(i);
    let piece: string;
    if (c < 0x20 || (c >= 0x7f && c <= 0x9f)) piece = `\\x${c.toString(16).padStart(2, '0')}`;
    else if ((c >= 0x202a && c <= 0x202e) || (c >= 0x2066 && c <= 0x2069)) piece = `\\u{${c.toString(16)}}`;
    else if (c >= 0xd800 && c <= 0xdbff) {
      const next = head.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) {
        piece = head.slice(i, i + 2);
        i++;
      } else if (i + 1 >= head.length && cut) piece = '';
      else piece = `\\u{${c.toString(16)}}`;
    } else if (c >= 0xdc00 && c <= 0xdfff) piece = `\\u{${c.toString(16)}}`;
    else piece = head[i];
    if (out.length + piece.length > limit) {
      cut = true;
      break;
    }
    out += piece;
  }
  if (!cut) return out;
  // Room for the ellipsis; never split a surrogate pair or an escape.
  while (out.length > limit - 1) out = dropLastPiece(out);
  return `${out}…`;
}

/** Removes the last character, surrogate pair or escape written by {@link printable}. */
function dropLastPiece(out: string): string {
  const escape = /\\(x[0-9a-f]{2}|u\{[0-9a-f]+\})$/.exec(out);
  if (escape) return out.slice(0, escape.index);
  const last = out.charCodeAt(out.length - 1);
  return out.slice(0, last >= 0xdc00 && last <= 0xdfff && out.length >= 2 ? -2 : -1);
}

/**
 * A list of names for a message: each made {@link printable} (and quoted unless `quote` is false), at most
 * `maxItems` of them, then "and N more". Keeps a message about a file with 100,000 columns short.
 */
export function printableList(names: readonly string[], maxItems = 20, quote = true): string {
  const shown = names.slice(0, maxItems).map((name) => (quote ? `"${printable(name)}"` : printable(name)));
  const rest = names.length - shown.length;
  return rest > 0 ? `${shown.join(', ')} and ${rest.toLocaleString('en')} more` : shown.join(', ');
}

/**
 * A whole report made safe for a terminal: like {@link printable}, control characters (other than line feed and
 * tab), bidirectional marks and lone surrogates are escaped, but nothing is cut and lines stay lines.
 *
 * @param text any text (a report that quotes file contents or typed names)
 */
export function printableLines(text: string): string {
  return text.replace(
    // eslint-disable-next-line no-control-regex
    /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g,
    (c) => {
      const code = c.charCodeAt(0);
      return code < 0xa0 ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u{${code.toString(16)}}`;
    },
  );
}
