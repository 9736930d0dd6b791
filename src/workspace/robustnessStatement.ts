import type { Appraisal } from './appraisal';
import { currentSummaries } from './currentSummaries';
import { labelsOfFinding } from '../format/studyLabels';
import { escapeHtml, escapeLatex, escapeMarkdown } from '../format/markup';

/**
 * The robustness statement: a paragraph per finding appraised, named after it, ready to paste into the sensitivity-analysis section
 * of a paper, with the numbers, the assumptions and conventions each analysis relied on, and full references.
 * Built once as plain Unicode text from the appraisal's inputs (see `currentSummaries`), then written as
 * Markdown, LaTeX or HTML.
 */
export interface RobustnessStatement {
  readonly title: string;
  /** One section per finding with a result, in the appraisal's order: its name and its paragraph. */
  readonly sections: readonly StatementSection[];
  /** The closing caution, or null when nothing has been computed. */
  readonly caution: string | null;
  /** Every paragraph in order: each section's, then the caution (or the note that nothing has been computed). */
  readonly paragraphs: readonly string[];
  /** Every convention and assumption of the analyses shown, one sentence each. */
  readonly assumptions: readonly string[];
  readonly references: readonly string[];
}

/** One finding's part of the statement. */
export interface StatementSection {
  /** The finding's id in the appraisal. */
  readonly findingId: string;
  /** The finding's name (or its method and place when it has none). */
  readonly heading: string;
  readonly paragraph: string;
}

export type StatementFormat = 'md' | 'tex' | 'html';

export const STATEMENT_CAUTION =
  'These analyses bound how strong unmeasured confounding would have to be to change the conclusions; they do not ' +
  'show that such confounding is absent, nor do they address other sources of bias such as selection, measurement ' +
  'error or model misspecification. Whether a confounder of the strength described is plausible is a judgement for ' +
  'subject-matter experts.';

/** The statement's only paragraph while no finding has a result. */
export const NOTHING_COMPUTED = 'No sensitivity analysis has been computed yet: fill in at least one finding.';

/**
 * Writes the statement from an appraisal: a section per finding (findings without a result are left out), the
 * assumptions and references gathered once (each listed once, numbered in order of first citation).
 */
export function buildRobustnessStatement(appraisal: Appraisal): RobustnessStatement {
  const study = appraisal.study;
  const references: string[] = [];
  const cite = (ref: string) => {
    if (!references.includes(ref)) references.push(ref);
    return `[${references.indexOf(ref) + 1}]`;
  };
  const sections: StatementSection[] = [];
  const assumptions: string[] = [];
  for (const { finding, heading, method, summary, from } of currentSummaries(appraisal)) {
    const part = method.workspace.statement(summary, labelsOfFinding(study, finding.labels), cite);
    if (!part) continue;
    sections.push(Object.freeze({ findingId: finding.id, heading, paragraph: part.paragraph }));
    if (from === 'saved-file-result') {
      const note = `The numbers of “${heading}” come from the result saved with the data file named in the appraisal; the file's rows are not part of the appraisal.`;
      if (!assumptions.includes(note)) assumptions.push(note);
    }
    for (const a of part.assumptions) if (!assumptions.includes(a)) assumptions.push(a);
  }
  const caution = sections.length > 0 ? STATEMENT_CAUTION : null;
  const paragraphs = [...sections.map((s) => s.paragraph), caution ?? NOTHING_COMPUTED];
  const finding = study.finding.trim();
  return Object.freeze({
    title: finding ? `Sensitivity to unmeasured confounding: ${finding}` : 'Sensitivity to unmeasured confounding',
    sections: Object.freeze(sections),
    caution,
    paragraphs: Object.freeze(paragraphs),
    assumptions: Object.freeze(assumptions),
    references: Object.freeze(references),
  });
}

/** Writes the statement as Markdown, LaTeX or HTML. */
export function renderRobustnessStatement(statement: RobustnessStatement, format: StatementFormat): string {
  const { assumptions, references, sections } = statement;
  const closing = statement.caution ?? NOTHING_COMPUTED;
  switch (format) {
    case 'md':
      return [
        `## ${escapeMarkdown(statement.title)}`,
        '',
        ...sections.flatMap((s) => [`### ${escapeMarkdown(s.heading)}`, '', escapeMarkdown(s.paragraph), '']),
        escapeMarkdown(closing),
        '',
        ...(assumptions.length ? ['### Assumptions and conventions', '', ...assumptions.map((a) => `- ${escapeMarkdown(a)}`), ''] : []),
        ...(references.length ? ['### References', '', ...references.map((r, i) => `${i + 1}. ${escapeMarkdown(r)}`), ''] : []),
      ].join('\n');
    case 'tex':
      return [
        `\\subsection*{${escapeLatex(statement.title)}}`,
        '',
        ...sections.flatMap((s) => [`\\paragraph{${escapeLatex(s.heading)}}`, escapeLatex(s.paragraph), '']),
        escapeLatex(closing),
        '',
        ...(assumptions.length
          ? ['\\paragraph{Assumptions and conventions}', '\\begin{itemize}', ...assumptions.map((a) => `  \\item ${escapeLatex(a)}`), '\\end{itemize}', '']
          : []),
        ...(references.length ? ['\\begin{enumerate}', ...references.map((r) => `  \\item ${escapeLatex(r)}`), '\\end{enumerate}', ''] : []),
      ].join('\n');
    case 'html':
      return [
        '<section class="lurk-robustness-statement">',
        `  <h2>${escapeHtml(statement.title)}</h2>`,
        ...sections.flatMap((s) => [`  <h3>${escapeHtml(s.heading)}</h3>`, `  <p>${escapeHtml(s.paragraph)}</p>`]),
        `  <p>${escapeHtml(closing)}</p>`,
        ...(assumptions.length ? ['  <h3>Assumptions and conventions</h3>', '  <ul>', ...assumptions.map((a) => `    <li>${escapeHtml(a)}</li>`), '  </ul>'] : []),
        ...(references.length ? ['  <h3>References</h3>', '  <ol>', ...references.map((r) => `    <li>${escapeHtml(r)}</li>`), '  </ol>'] : []),
        '</section>',
        '',
      ].join('\n');
  }
}
