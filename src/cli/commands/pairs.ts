import { analysePairs, type PairsData, type PairsInput } from '../../core/pairsAnalysis';
import { InputError, inputProblem, type InputProblem } from '../../core/inputProblem';
import { pairsFromCsvStream, type PairsRead } from '../../methods/pairs/pairsFromCsv';
import { pairsReportText, pairsResultJson, PAIRS_CAUTION } from '../../methods/pairs/text';
import type { CliIo } from '../cliIo';
import type { LurkCommand } from '../defineCommand';
import { choiceOption, numberListOption, numberOption, type OptionKinds } from '../parseOptions';
import { UsageError } from '../usageError';
import { defineCommand } from '../defineCommand';

const OPTIONS: OptionKinds = {
  file: { type: 'string', short: 'f' },
  treated: { type: 'string' },
  control: { type: 'string' },
  diff: { type: 'string' },
  discordant: { type: 'string' },
  'outcome-type': { type: 'string' },
  test: { type: 'string' },
  gamma: { type: 'string' },
  alpha: { type: 'string' },
  alternative: { type: 'string' },
  method: { type: 'string' },
  'continuity-correction': { type: 'boolean' },
  json: { type: 'boolean' },
};

const HELP = `lurk pairs — Rosenbaum bounds for a matched-pairs study: how large a hidden bias Γ would have to be before
the finding stops being significant, and how the effect estimate widens with Γ. Γ is the largest factor by which
two matched units may differ in their odds of treatment because of an unmeasured covariate.

  lurk pairs --file data.csv --treated COLUMN --control COLUMN [options]
  lurk pairs --file data.csv --diff COLUMN [options]
  lurk pairs --discordant A,B [options]

Data:
  --file F            a CSV file (comma, semicolon or tab separated) with a header row, one row per pair;
                      rows with a missing value (empty, NA, ...) are left out and counted
  --treated, --control  the treated unit's and the control unit's outcome columns (difference = treated − control);
                      two columns holding only 0 and 1 are read as a binary outcome
  --diff COLUMN       or one column of treated − control differences
  --discordant A,B    a binary outcome: A pairs where only the treated unit had the event, B where only the control did
  --outcome-type T    auto (default), numeric, or binary (insist on 0/1 columns)

Analysis:
  --test T            signrank (Wilcoxon signed-rank, default) or sign (sign test; McNemar for binary outcomes)
  --alternative A     greater (treatment raises the outcome, default) or less (lowers it); one-sided
  --alpha A           significance level, between 0 and 1 (default 0.05)
  --gamma G1,G2,...   the Γ values to tabulate, each 1 or more (default: from 1 to just past the tipping point)
  --method M          exact or normal (default: exact up to 1,000 non-zero pairs, normal beyond)
  --continuity-correction  subtract ½ from the statistic in the normal approximation
  --json              print one JSON object (n, sensitivityValue, rows of {gamma, pUpper, pLower}, estimates, ...)

${PAIRS_CAUTION}
`;

/** Input fields → the options a person typed, for messages. */
function optionFor(field: string, discordant: boolean): string {
  if (field === 'difference') return '--diff';
  if (field === 'outcome') return '--outcome-type';
  if (field === 'treated' || field === 'control' || field === 'file' || field === 'test' || field === 'alternative' || field === 'method' || field === 'alpha') {
    return `--${field}`;
  }
  if (field.startsWith('gammas')) return '--gamma';
  if (field.startsWith('data')) return discordant ? '--discordant' : '--file';
  return field;
}

function renamed(error: unknown, discordant: boolean): unknown {
  if (!(error instanceof InputError)) return error;
  return new InputError(error.problems.map((p: InputProblem) => ({ ...p, field: optionFor(p.field, discordant) })));
}

/** `lurk pairs`: Rosenbaum bounds, tipping Γ, estimate range and amplification for matched pairs. */
export const command: LurkCommand = defineCommand({
  name: 'pairs',
  summary: 'Rosenbaum bounds for matched pairs: tipping Γ, p-value bounds, estimate range, amplification',
  help: HELP,
  options: OPTIONS,
  async run({ values, positionals }, io) {
    let discordantInput = false;
    try {
      if (positionals.length > 0) throw new UsageError(positionals[0], 'is not an option of this command (see --help)');
      discordantInput = values.discordant !== undefined;
      const test = choiceOption(values.test, '--test', ['signrank', 'sign'] as const);
      const alternative = choiceOption(values.alternative, '--alternative', ['greater', 'less'] as const);
      const method = choiceOption(values.method, '--method', ['exact', 'normal'] as const);
      const outcomeType = choiceOption(values['outcome-type'], '--outcome-type', ['auto', 'numeric', 'binary'] as const);
      const alpha = numberOption(values.alpha, '--alpha');
      const gammas = numberListOption(values.gamma, '--gamma');

      let data: PairsData;
      let read: PairsRead | null = null;
      if (values.discordant !== undefined) {
        if (values.file !== undefined) throw new UsageError('--discordant', 'give either --discordant or --file, not both');
        const counts = numberListOption(values.discordant, '--discordant')!;
        if (counts.length !== 2) throw new UsageError('--discordant', `needs two counts A,B (only treated had the event, only control had it), got ${counts.length}`);
        data = { kind: 'discordant', treatedOnly: counts[0], controlOnly: counts[1] };
      } else {
        if (typeof values.file !== 'string') throw new UsageError('--file', 'give a CSV file of pairs (or --discordant A,B for a binary outcome)');
        const spec = {
          treated: typeof values.treated === 'string' ? values.treated : undefined,
          control: typeof values.control === 'string' ? values.control : undefined,
          difference: typeof values.diff === 'string' ? values.diff : undefined,
          outcome: outcomeType,
        };
        read = await readPairsFile(values.file, spec, io);
        data = read.data;
      }
      const input: PairsInput = {
        data,
        test,
        alternative,
        alpha,
        gammas,
        method,
        continuityCorrection: values['continuity-correction'] === true,
        droppedRows: read?.droppedRows ?? 0,
      };
      const result = analysePairs(input);
      const readWarnings = read ? [...read.warnings] : [];
      if (values.json) {
        const json = pairsResultJson(result);
        json.warnings = [...readWarnings, ...result.warnings];
        json.caution = PAIRS_CAUTION;
        io.out(JSON.stringify(json, null, 2) + '\n');
      } else {
        const report = pairsReportText(result);
        io.out(readWarnings.map((w) => `Note: ${w}\n`).join('') + report);
      }
      return 0;
    } catch (error) {
      throw renamed(error, discordantInput);
    }
  },
});

async function readPairsFile(path: string, spec: Parameters<typeof pairsFromCsvStream>[1], io: CliIo): Promise<PairsRead> {
  let stream;
  try {
    stream = io.openStream(path);
  } catch {
    throw new InputError([inputProblem('file', 'unreadable', `cannot read "${path}"`)]);
  }
  try {
    return await pairsFromCsvStream(stream, spec);
  } catch (error) {
    if (error instanceof InputError) throw error;
    const code = (error as { code?: string }).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a file' : 'cannot be read';
    throw new InputError([inputProblem('file', 'unreadable', `"${path}": ${reason}`)]);
  }
}

