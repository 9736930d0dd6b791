import type { Appraisal } from './appraisal';
import { currentSummaries } from './currentSummaries';
import { escapeHtml, escapeLatex, escapeMarkdown } from '../format/markup';

/**
 * The robustness statement: a paragraph per method used, ready to paste into the sensitivity-analysis section
 * of a paper, with the numbers, the assumptions and conventions each analysis relied on, and full references.
 * Built once as plain Unicode text from the appraisal's inputs (see `currentSummaries`), then written as
 * Markdown, LaTeX or HTML.
 */
export interface RobustnessStatement {
  readonly title: string;
  readonly paragraphs: readonly string[];
  /** Every convention and assumption of the analyses shown, one sentence each. */
  readonly assumptions: readonly string[];
  readonly references: readonly string[];
}

export type StatementFormat = 'md' | 'tex' | 'html';

export const STATEMENT_CAUTION =
  'These analyses bound how strong unmeasured confounding would have to be to change the conclusions; they do not ' +
  'show that such confounding is absent, nor do they address other sources of bias such as selection, measurement ' +
  'error or model misspecification. Whether a confounder of the strength described is plausible is a judgement for ' +
  'subject-matter experts.';

/** Writes the statement from an appraisal; methods without a result are left out. */
export function buildRobustnessStatement(appraisal: Appraisal): RobustnessStatement {
  const study = appraisal.study;
  const references: string[] = [];
  const cite = (ref: string) => {
    if (!references.includes(ref)) references.push(ref);
    return `[${references.indexOf(ref) + 1}]`;
  };
  const paragraphs: string[] = [];
  const assumptions: string[] = [];
  for (const { method, summary, from } of currentSummaries(appraisal)) {
    const part = method.workspace.statement(summary, study, cite);
    if (!part) continue;
    paragraphs.push(part.paragraph);
    if (from === 'saved-file-result') {
      assumptions.push(`The ${method.title.toLowerCase()} numbers come from the result saved with the data file named in the appraisal; the file's rows are not part of the appraisal.`);
    }
    for (const a of part.assumptions) if (!assumptions.includes(a)) assumptions.push(a);
  }
  if (paragraphs.length === 0) paragraphs.push('No sensitivity analysis has been computed yet: fill in at least one calculator.');
  else paragraphs.push(STATEMENT_CAUTION);
  const finding = study.finding.trim();
  return Object.freeze({
    title: finding ? `Sensitivity to unmeasured confounding: ${finding}` : 'Sensitivity to unmeasured confounding',
    paragraphs: Object.freeze(paragraphs),
    assumptions: Object.freeze(assumptions),
    references: Object.freeze(references),
  });
}

/** Writes the statement as Markdown, LaTeX or HTML. */
export function renderRobustnessStatement(statement: RobustnessStatement, format: StatementFormat): string {
  const { assumptions, references } = statement;
  switch (format) {
    case 'md':
      return [
        `## ${escapeMarkdown(statement.title)}`,
        '',
        ...statement.paragraphs.flatMap((p) => [escapeMarkdown(p), '']),
        ...(assumptions.length ? ['### Assumptions and conventions', '', ...assumptions.map((a) => `- ${escapeMarkdown(a)}`), ''] : []),
        ...(references.length ? ['### References', '', ...references.map((r, i) => `${i + 1}. ${escapeMarkdown(r)}`), ''] : []),
      ].join('\n');
    case 'tex':
      return [
        `\\subsection*{${escapeLatex(statement.title)}}`,
        '',
        ...statement.paragraphs.flatMap((p) => [escapeLatex(p), '']),
        ...(assumptions.length
          ? ['\\paragraph{Assumptions and conventions}', '\\begin{itemize}', ...assumptions.map((a) => `  \\item ${escapeLatex(a)}`), '\\end{itemize}', '']
          : []),
        ...(references.length ? ['\\begin{enumerate}', ...references.map((r) => `  \\item ${escapeLatex(r)}`), '\\end{enumerate}', ''] : []),
      ].join('\n');
    case 'html':
      return [
        '<section class="lurk-robustness-statement">',
        `  <h2>${escapeHtml(statement.title)}</h2>`,
        ...statement.paragraphs.map((p) => `  <p>${escapeHtml(p)}</p>`),
        ...(assumptions.length ? ['  <h3>Assumptions and conventions</h3>', '  <ul>', ...assumptions.map((a) => `    <li>${escapeHtml(a)}</li>`), '  </ul>'] : []),
        ...(references.length ? ['  <h3>References</h3>', '  <ol>', ...references.map((r) => `    <li>${escapeHtml(r)}</li>`), '  </ol>'] : []),
        '</section>',
        '',
      ].join('\n');
  }
}
