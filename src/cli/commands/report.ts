import { readAppraisal, type Appraisal } from '../../workspace/appraisal';
import { findingsWithoutResult } from '../../workspace/currentSummaries';
import { buildRobustnessStatement, renderRobustnessStatement, type StatementFormat } from '../../workspace/robustnessStatement';
import { buildBottomLine } from '../../workspace/bottomLine';
import { InputError, inputProblem } from '../../methods/problems';
import type { LurkCommand } from '../defineCommand';
import { choiceOption, type OptionKinds } from '../parseOptions';
import { EXIT_WITH_PROBLEMS, UsageError } from '../usageError';
import { readFileArgument } from '../readFileArgument';
import { defineCommand } from '../defineCommand';
import { printableLines } from '../../data/printable';

const OPTIONS: OptionKinds = {
  format: { type: 'string' },
  'bottom-line': { type: 'boolean' },
  'keep-going': { type: 'boolean' },
};

const HELP = `lurk report — the robustness statement of a saved appraisal, ready to paste into a paper.

  lurk report APPRAISAL.json [--format md|tex|html] [--bottom-line] [--keep-going]

APPRAISAL.json is a file saved from the Lurk page ("Save appraisal"). The statement gives the numbers of each
finding appraised (a part per finding, named after it), the assumptions each method makes, and full references to
the published methods.

  --format       md (Markdown, default), tex (LaTeX) or html
  --bottom-line  print the plain-language bottom line for decision-makers instead
  --keep-going   exit with status 0 even when some findings of the appraisal give no result

APPRAISAL.json "-" is standard input. Every field of the file is checked against the appraisal schema; a file
that breaks it is refused with the path of the field. The numbers are computed again from the saved inputs.

Exit status: 0 the statement is printed; 2 bad input (options, or a file that is not a valid appraisal);
3 the statement is printed, but a finding that had a result when saved gives none now (its inputs have
problems, or its saved result of a file that is not kept cannot be read); it is named on standard error
and left out of the statement (unless --keep-going, which exits 0).

A sensitivity analysis bounds how strong hidden confounding would have to be; it does not prove causation.
Decisions about health or safety defer to domain experts, local guidance and licensed practice.
`;

export const command: LurkCommand = defineCommand({
  name: 'report',
  summary: 'the robustness statement (Markdown, LaTeX or HTML) of a saved appraisal',
  help: HELP,
  options: OPTIONS,
  async run({ values, positionals }, io) {
    if (positionals.length !== 1) throw new UsageError('APPRAISAL', 'give exactly one appraisal file (JSON)');
    const format: StatementFormat = choiceOption(values.format, '--format', ['md', 'tex', 'html'] as const) ?? 'md';
    const text = await readFileArgument(io, positionals[0], 'APPRAISAL');
    let json: unknown;
    try {
      json = JSON.parse(text.replace(/^\uFEFF/, ''));
    } catch {
      throw new InputError([inputProblem('APPRAISAL', 'not-json', 'is not a JSON file')]);
    }
    const read = readAppraisal(json);
    if (read.appraisal === null) {
      const first = read.problems[0];
      throw new InputError([inputProblem('APPRAISAL', first.code, `${first.field} ${first.message}`)]);
    }
    const missing = findingsNowWithoutResult(read.appraisal);
    const done = (): number => {
      if (missing.length === 0 || values['keep-going']) return 0;
      io.err(`lurk report: ${missing.join(', ')}: had a result when saved but gives none now; left out (--keep-going exits 0)\n`);
      return EXIT_WITH_PROBLEMS;
    };
    if (values['bottom-line']) {
      const line = buildBottomLine(read.appraisal);
      const out = line.empty
        ? ['No finding in this appraisal has a result yet.']
        : [
            'How strong would a hidden confounder have to be?',
            ...line.howStrong.map((s) => `  - ${s}`),
            ...(line.comparedWithMeasured.length ? ['Compared with measured factors:', ...line.comparedWithMeasured.map((s) => `  - ${s}`)] : []),
            ...(line.wouldChange.length ? ['What would change the conclusion:', ...line.wouldChange.map((s) => `  - ${s}`)] : []),
            ...(line.wouldNotChange.length ? ['What would not:', ...line.wouldNotChange.map((s) => `  - ${s}`)] : []),
          ];
      out.push('', line.caution, '');
      io.out(printableLines(out.join('\n')));
      return done();
    }
    io.out(printableLines(renderRobustnessStatement(buildRobustnessStatement(read.appraisal), format)));
    return done();
  },
});

/** Findings saved with a result (a summary) that give none now, by name and field path (`finding "Mortality" (findings[1])`). */
function findingsNowWithoutResult(appraisal: Appraisal): string[] {
  const lost = new Set(findingsWithoutResult(appraisal));
  return appraisal.findings.flatMap((f, i) => (lost.has(f) ? [`finding ${JSON.stringify(f.name || f.method)} (findings[${i}])`] : []));
}
