import { InputError } from '../methods/problems';
import type { MethodModule } from '../methods/methodModule';
import type { CliIo } from './cliIo';
import { defineCommand, type LurkCommand } from './defineCommand';
import { fileSourceOf } from './fileSource';
import { argumentName } from './parseOptions';
import { UsageError } from './usageError';
import { FIGURE_OPTIONS, figureHelp, figureSvg, readFigureRequest } from './figureOutput';
import { printable, printableLines } from '../data/printable';

/**
 * A method's sub-command, made from its module: parse the options → the method's form → its request reader and
 * runner (`command.run`) → the report (text, or JSON with --json). Bad input is one line naming the option.
 */
export function methodCommand(method: MethodModule): LurkCommand {
  const { command } = method;
  const figureOptions = command.figures.length > 0 ? FIGURE_OPTIONS : {};
  const options = { ...command.options, ...figureOptions, json: { type: 'boolean' } } as const;
  const isOption = (name: string): boolean => /^--[\w-]+$/.test(name) && Object.hasOwn(options, name.slice(2));
  return defineCommand({
    name: command.name,
    summary: command.summary,
    help: withFigures(withJsonNullNote(command.help), command.name, command.figures),
    options,
    async run({ values, positionals }, io: CliIo) {
      if (positionals.length > 0) {
        throw new UsageError(argumentName(positionals[0]), `is not an option of lurk ${command.name} (options start with --; see --help)`);
      }
      // The figure is checked before the analysis runs, so a wrong name costs nothing.
      const figure = command.figures.length > 0 ? readFigureRequest(values, command.figures) : null;
      const opened: string[] = [];
      try {
        const form = command.formFromOptions(values);
        const report = await command.run(form, values, {
          open: (path) => {
            opened.push(path);
            return fileSourceOf(path, io);
          },
        });
        if (figure) io.out(figureSvg(report, figure));
        else io.out(values.json ? JSON.stringify(report.json, null, 2) + '\n' : printableLines(report.text));
        return 0;
      } catch (error) {
        if (!(error instanceof InputError)) throw error;
        // Problems are named by form field; on the command line they name the option that holds the field. A field
        // that is no option (a column of a file read) is named inside the message, after the option of the file.
        const first = error.problems[0] ?? { field: '--', message: 'gives no result; see --help' };
        const option = first.field.startsWith('-') ? first.field : command.optionOf(first.field);
        if (isOption(option)) throw new UsageError(option, first.message);
        const fileOption = Object.keys(values).find((name) => opened.includes(String(values[name])) && isOption(`--${name}`));
        if (fileOption) throw new UsageError(`--${fileOption}`, `${printable(first.field, 40)} ${first.message}`);
        throw new UsageError(`"${printable(first.field, 40)}"`, first.message);
      }
    },
  });
}

/** What every method's --json output promises about missing numbers (added to each method's --help). */
export const JSON_NULL_NOTE =
  'JSON (--json): a number that does not apply or cannot be computed (an interval that was not given, a bound that\n' +
  'does not exist, an E-value too large to represent, a sensitivity value beyond the range searched) is null, never\n' +
  'NaN or Infinity; so is a text field that does not apply (e.g. the interval limit used when there is no interval).\n' +
  'The plain-language reading is the field reading: {text, sentences} (the sentences in order, and as one text).\n' +
  'Exit status: 0 done; 2 bad input (one line on standard error naming the option).\n';

/** The help text with the figures section ({@link figureHelp}) before the JSON note (or its closing caution). */
function withFigures(help: string, command: string, figures: MethodModule['command']['figures']): string {
  if (figures.length === 0) return help;
  const at = help.indexOf(JSON_NULL_NOTE);
  const section = `${figureHelp(command, figures)}\n`;
  return at < 0 ? `${help.replace(/\n*$/, '\n\n')}${section}` : `${help.slice(0, at)}${section}${help.slice(at)}`;
}

/** The help text with {@link JSON_NULL_NOTE} before its closing caution (or at its end). */
function withJsonNullNote(help: string): string {
  const at = help.lastIndexOf('A sensitivity analysis bounds');
  const note = `${JSON_NULL_NOTE}\n`;
  return at < 0 ? `${help.replace(/\n*$/, '\n\n')}${note}` : `${help.slice(0, at)}${note}${help.slice(at)}`;
}
