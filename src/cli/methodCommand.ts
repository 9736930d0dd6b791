import { InputError, inputProblem } from '../methods/problems';
import type { MethodModule } from '../methods/methodModule';
import type { CliIo } from './cliIo';
import { defineCommand, type LurkCommand } from './defineCommand';
import { fileSourceOf } from './fileSource';

/**
 * A method's sub-command, made from its module: parse the options → the method's form → its request reader and
 * runner (`command.run`) → the report (text, or JSON with --json). Bad input is one line naming the option.
 */
export function methodCommand(method: MethodModule): LurkCommand {
  const { command } = method;
  return defineCommand({
    name: command.name,
    summary: command.summary,
    help: command.help,
    options: { ...command.options, json: { type: 'boolean' } },
    async run({ values, positionals }, io: CliIo) {
      if (positionals.length > 0) {
        throw new InputError([inputProblem(positionals[0], 'usage', `is not an option of lurk ${command.name} (options start with --; see --help)`)]);
      }
      try {
        const form = command.formFromOptions(values);
        const report = await command.run(form, values, { open: (path) => fileSourceOf(path, io) });
        io.out(values.json ? JSON.stringify(report.json, null, 2) + '\n' : report.text);
        return 0;
      } catch (error) {
        if (!(error instanceof InputError)) throw error;
        // Problems are named by form field; on the command line they name the option that holds the field.
        throw new InputError(error.problems.map((p) => ({ ...p, field: p.field.startsWith('-') ? p.field : command.optionOf(p.field) })));
      }
    },
  });
}
