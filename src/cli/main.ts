import type { CliIo } from './cliIo';
import type { LurkCommand } from './defineCommand';
import { METHODS } from '../methods/registry';
import { methodCommand } from './methodCommand';

// Every method of the registry is a command; the workspace commands (batch, report) are loaded only when used.
const commands: Record<string, () => Promise<LurkCommand>> = {
  ...Object.fromEntries(METHODS.map((m) => [m.command.name, async () => methodCommand(m)])),
  batch: () => import('./commands/batch').then((m) => m.command),
  report: () => import('./commands/report').then((m) => m.command),
};

const CAUTION =
  'A sensitivity analysis bounds how strong hidden confounding would have to be; it does not prove causation.\n' +
  'Decisions about health or safety defer to domain experts, local guidance and licensed practice.\n';

export async function runLurk(argv: readonly string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.out(await overview());
    return 0;
  }
  if (name === '--version') {
    io.out('lurk 0.1.0\n');
    return 0;
  }
  const load = Object.hasOwn(commands, name) ? commands[name] : undefined;
  if (!load) {
    io.err(`lurk: "${printable(name)}" is not a command. Commands: ${Object.keys(commands).join(', ')}. See lurk --help.\n`);
    return 2;
  }
  return (await load()).run(rest, io);
}

async function overview(): Promise<string> {
  const lines = ['lurk — how strong would a hidden confounder have to be to overturn this finding?', '', 'Commands:'];
  for (const [name, load] of Object.entries(commands)) lines.push(`  lurk ${name.padEnd(10)} ${(await load()).summary}`);
  lines.push('', 'Run lurk COMMAND --help for its options.', '', CAUTION);
  return lines.join('\n');
}

/** A typed word as it may be echoed: control characters escaped, cut to 60 characters. */
function printable(text: string): string {
  const escaped = text.replace(/[\u0000-\u001f\u007f-\u009f]/g, (c) => `\\x${c.charCodeAt(0).toString(16).padStart(2, '0')}`);
  return escaped.length > 60 ? escaped.slice(0, 59) + '…' : escaped;
}
