import { readAppraisal } from '../../workspace/appraisal';
import { buildRobustnessStatement, renderRobustnessStatement, type StatementFormat } from '../../workspace/robustnessStatement';
import { buildBottomLine } from '../../workspace/bottomLine';
import { InputError, inputProblem } from '../../methods/problems';
import type { LurkCommand } from '../defineCommand';
import { choiceOption, type OptionKinds } from '../parseOptions';
import { UsageError } from '../usageError';
import { readFileArgument } from '../readFileArgument';
import { defineCommand } from '../defineCommand';

const OPTIONS: OptionKinds = {
  format: { type: 'string' },
  'bottom-line': { type: 'boolean' },
};

const HELP = `lurk report — the robustness statement of a saved appraisal, ready to paste into a paper.

  lurk report APPRAISAL.json [--format md|tex|html] [--bottom-line]

APPRAISAL.json is a file saved from the Lurk page ("Save appraisal"). The statement gives the numbers of each
calculator used, the assumptions each method makes, and full references to the published methods.

  --format       md (Markdown, default), tex (LaTeX) or html
  --bottom-line  print the plain-language bottom line for decision-makers instead

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
    if (values['bottom-line']) {
      const line = buildBottomLine(read.appraisal);
      const out = line.empty
        ? ['No calculator in this appraisal has a result yet.']
        : [
            'How strong would a hidden confounder have to be?',
            ...line.howStrong.map((s) => `  - ${s}`),
            ...(line.comparedWithMeasured.length ? ['Compared with measured factors:', ...line.comparedWithMeasured.map((s) => `  - ${s}`)] : []),
            ...(line.wouldChange.length ? ['What would change the conclusion:', ...line.wouldChange.map((s) => `  - ${s}`)] : []),
            ...(line.wouldNotChange.length ? ['What would not:', ...line.wouldNotChange.map((s) => `  - ${s}`)] : []),
          ];
      out.push('', line.caution, '');
      io.out(out.join('\n'));
      return 0;
    }
    io.out(renderRobustnessStatement(buildRobustnessStatement(read.appraisal), format));
    return 0;
  },
});
