import type { CliIo } from './cliIo';

import type { LurkCommand } from './defineCommand';
import { methodCommand } from './methodCommand';

// Each command lives in its own module under ./commands and is loaded only when used.
const commands: Record<string, () => Promise<LurkCommand>> = {
  evalue: () => import('./commands/evalue').then((m) => m.command),
  pairs: () => import('../methods/pairs/method').then((m) => methodCommand(m.pairsMethod)),
  ovb: () => import('./commands/ovb').then((m) => m.command),
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
  const load = commands[name];
  if (!load) {
    io.err(`lurk: "${name}" is not a command. Commands: ${Object.keys(commands).join(', ')}. See lurk --help.\n`);
    return 2;
  }
  return (await load()).run(rest, io);
}

async function overview(): Promise<string> {
  const lines = ['lurk — how strong would a hidden confounder have to be to overturn this finding?', '', 'Commands:'];
  for (const [name, load] of Object.entries(commands)) lines.push(`  lurk ${name.padEnd(8)} ${(await load()).summary}`);
  lines.push('', 'Run lurk COMMAND --help for its options.', '', CAUTION);
  return lines.join('\n');
}
