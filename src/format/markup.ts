/**
 * Escaping of plain Unicode text for the three markups Lurk writes (statement, bottom line, exports). Text a
 * user typed (labels, covariate names) passes through here, so nothing in it becomes live markup: no HTML tag,
 * no Markdown link or image, no LaTeX command.
 */

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

/**
 * Markdown: escape what would start emphasis, code, a link or image (`[`, `]`, `!`), a raw HTML tag or an
 * autolink (`<` before a letter, `/`, `!` or `?`). A `<` before a space or a digit ("p < 0.001") is left plain.
 */
export function escapeMarkdown(text: string): string {
  return text
    .replace(/([\\`*[\]])/g, '\\$1')
    .replace(/!(?=\\\[)/g, '\\!')
    .replace(/<(?=[A-Za-z/!?])/g, '\\<')
    .replace(/(^|\s)_/g, '$1\\_');
}

const LATEX_SYMBOLS: Readonly<Record<string, string>> = {
  'Γ': '$\\Gamma$',
  'Λ': '$\\Lambda$',
  'Δ': '$\\Delta$',
  'α': '$\\alpha$',
  'τ': '$\\tau$',
  'σ': '$\\sigma$',
  'ψ': '$\\psi$',
  '²': '$^2$',
  '·': '$\\cdot$',
  '≤': '$\\leq$',
  '≥': '$\\geq$',
  '<': '$<$',
  '>': '$>$',
  '≈': '$\\approx$',
  '×': '$\\times$',
  '−': '$-$',
  '–': '--',
  '—': '---',
  '‘': '`',
  '’': "'",
  '“': '``',
  '”': "''",
  '…': '\\ldots{}',
  '%': '\\%',
  '&': '\\&',
  '$': '\\$',
  '#': '\\#',
  _: '\\_',
  '{': '\\{',
  '}': '\\}',
  '~': '\\textasciitilde{}',
  '^': '\\textasciicircum{}',
  '\\': '\\textbackslash{}',
  '|': '\\textbar{}',
};

/**
 * LaTeX: escape special characters, write Greek letters, comparison signs and the minus sign in math mode
 * (a hyphen-minus directly before a digit is a minus sign: "−0.4" and "-0.4" both print as $-$0.4).
 */
export function escapeLatex(text: string): string {
  return [...text.replace(/(^|[\s(=,;])-(?=\.?\d)/g, '$1\u2212')]
    .map((c) => LATEX_SYMBOLS[c] ?? c)
    .join('')
    .replace(/\$\$/g, '');
}
