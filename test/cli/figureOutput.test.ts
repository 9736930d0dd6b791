// --svg FIGURE and --svg-width on every calculator command (src/cli/figureOutput.ts): the figures the page draws,
// as SVG sized in inches for a journal width; refusals name the option and the choices, with exit status 2.
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { memoryIo } from '../../src/cli/cliIo';
import { runLurk } from '../../src/cli/main';
import { fileSourceOf } from '../../src/cli/fileSource';
import { parseOptions } from '../../src/cli/parseOptions';
import { figureTextBoxes, overlappingTextPairs } from '../../src/plot/figureLayout';
import { layoutFor } from '../../src/plot/svgString';
import { METHODS } from '../../src/methods/registry';
import { buildCliForTest } from '../support/builtCli';
import { readReferenceText, referencePath } from '../support/reference';

const setsPath = fileURLToPath(new URL('../files/matched-sets-fictional.csv', import.meta.url));

/** A command with arguments that give a result having every one of its figures, and the figures' names. */
const COMMANDS: { command: string; args: string[]; figures: string[] }[] = [
  {
    command: 'evalue',
    // VanderWeele & Ding 2017 worked example (RR 3.9, 1.8–8.7) with two made-up reference confounders.
    args: ['--measure', 'rr', '--estimate', '3.9', '--lower', '1.8', '--upper', '8.7', '--reference-confounders', 'smoking:2:3;age:1.5:1.5'],
    figures: ['strengths'],
  },
  { command: 'pairs', args: ['--file', referencePath('rosenbaum_small_n15.csv'), '--diff', 'd'], figures: ['p-value', 'estimate', 'amplification'] },
  { command: 'sets', args: ['--file', setsPath, '--set', 'matched_set', '--treated', 'treated', '--outcome', 'outcome'], figures: ['p-value', 'estimate', 'amplification'] },
  { command: 'ovb', args: ['--file', referencePath('swiss.csv'), '--outcome', 'Fertility', '--treatment', 'Education'], figures: ['estimate', 't', 'extreme'] },
  { command: 'weighting', args: ['--file', referencePath('weighting_mtcars.csv'), '--treatment', 'am', '--outcome', 'mpg', '--bootstrap', '40'], figures: ['bounds', 'overlap', 'weights'] },
];

async function lurk(args: string[], files: Record<string, string> = {}) {
  const io = memoryIo(files);
  const code = await runLurk(args, io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

/** Whether every start tag of the document has its end tag, in order (no DOM in this test project). */
function wellFormed(svg: string): boolean {
  const open: string[] = [];
  for (const [, end, name, self] of svg.matchAll(/<(\/?)([A-Za-z][\w:-]*)(?:\s[^<>]*?)?(\/?)>/g)) {
    if (self) continue;
    if (!end) open.push(name);
    else if (open.pop() !== name) return false;
  }
  return open.length === 0 && !/<(?![A-Za-z/])/.test(svg.replace(/<!\[CDATA\[[\s\S]*?\]\]>/g, ''));
}

/** Checks one printed figure: a whole SVG document sized in inches, text at least 7 pt at that size. */
function expectPrintSvg(out: string, inches: number): void {
  expect(out.slice(0, 4)).toBe('<svg');
  expect(out.trimEnd().endsWith('</svg>')).toBe(true);
  expect(wellFormed(out)).toBe(true);
  expect(/NaN|Infinity|undefined/.exec(out)?.[0] ?? 'none').toBe('none');
  const size = /^<svg[^>]* viewBox="0 0 ([\d.]+) ([\d.]+)" width="([\d.]+)in" height="([\d.]+)in"/.exec(out);
  expect(size, out.slice(0, 300)).not.toBeNull();
  const [viewWidth, viewHeight, width, height] = size!.slice(1).map(Number);
  expect(width).toBe(inches);
  // One drawing unit is one point (1/72 in): the height in inches is the viewBox height over 72, to rounding.
  expect(viewWidth).toBeCloseTo(inches * 72, 6);
  expect(height).toBeCloseTo(viewHeight / 72, 2);
  const sizes = [...out.matchAll(/<text[^>]* font-size="([\d.]+)"/g)].map((m) => Number(m[1]));
  expect(sizes.length).toBeGreaterThan(3);
  // Text at least 7 pt at print size: common journal artwork requirement (common practice, no source).
  expect(Math.min(...sizes)).toBeGreaterThanOrEqual(7);
  expect(out).toMatch(/<title id="[^"]+">[^<]+<\/title>/);
}

describe('--svg prints every figure of every calculator command', { timeout: 60_000 }, () => {
  it('the commands here are every command of the registry, with the figures each declares', () => {
    expect(COMMANDS.map((c) => c.command).sort()).toEqual(METHODS.map((m) => m.command.name).sort());
    for (const { command, figures } of COMMANDS) expect(METHODS.find((m) => m.command.name === command)!.command.figures.map((f) => f.name)).toEqual(figures);
  });

  for (const { command, args, figures } of COMMANDS) {
    for (const figure of figures) {
      it(`lurk ${command} --svg ${figure}: one column (default) and two columns`, async () => {
        const column = await lurk([command, ...args, '--svg', figure]);
        expect(column.stderr).toBe('');
        expect(column.code).toBe(0);
        expectPrintSvg(column.stdout, 3.5);
        const wide = await lurk([command, ...args, '--svg', figure, '--svg-width', 'two-columns']);
        expect(wide.code).toBe(0);
        expectPrintSvg(wide.stdout, 7);
      });
    }
  }

  it.each(COMMANDS)('lurk $command: at both journal widths no two texts of a figure touch', async ({ command, args, figures }) => {
    const method = METHODS.find((m) => m.command.name === command)!;
    const values = parseOptions(args, method.command.options).values;
    const report = await method.command.run(method.command.formFromOptions(values), values, { open: (path) => fileSourceOf(path, memoryIo()) });
    for (const name of figures) {
      const spec = report.figures![name]()!;
      for (const print of ['column', 'two-columns'] as const) {
        const clashes = overlappingTextPairs(figureTextBoxes(layoutFor(spec, { print, includeTitle: true })));
        expect(clashes.map(([a, b]) => `${name} ${print}: "${a.text}" × "${b.text}"`)).toEqual([]);
      }
    }
  });

  it('figure names and widths are not case-sensitive, as every choice', async () => {
    const { code, stdout } = await lurk(['pairs', '--discordant', '30,12', '--svg', 'P-Value', '--svg-width', 'COLUMN']);
    expect(code).toBe(0);
    expectPrintSvg(stdout, 3.5);
  });
});

describe('--svg is refused with one line naming the option, exit status 2', () => {
  const refusals = COMMANDS.flatMap(({ command, args, figures }) => [
    { args: [command, ...args, '--svg', 'pie'], line: new RegExp(`^lurk ${command}: --svg: must be one of ${figures.join(', ')}, got "pie"$`) },
    { args: [command, ...args, '--svg', figures[0], '--json'], line: new RegExp(`^lurk ${command}: --svg: cannot be combined with --json`) },
    { args: [command, ...args, '--svg', figures[0], '--svg-width', 'a4'], line: new RegExp(`^lurk ${command}: --svg-width: must be one of column, two-columns, got "a4"$`) },
    { args: [command, ...args, '--svg-width', 'column'], line: new RegExp(`^lurk ${command}: --svg-width: needs --svg FIGURE`) },
    { args: [command, ...args, '--svg', ''], line: new RegExp(`^lurk ${command}: --svg: needs a figure: one of ${figures.join(', ')}$`) },
  ]);
  it.each(refusals)('$args', async ({ args, line }) => {
    const { code, stdout, stderr } = await lurk(args);
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(stderr.trimEnd()).toMatch(line);
  });

  it('a figure this result has none of is refused saying when there is none', async () => {
    // Discordant counts give the sign test, which has no Hodges–Lehmann estimate.
    const signTest = await lurk(['pairs', '--discordant', '30,12', '--svg', 'estimate']);
    expect(signTest.code).toBe(2);
    expect(signTest.stderr).toMatch(/^lurk pairs: --svg: this result has no estimate figure \(none when there is no estimate, as with the sign test/);
    // No tipping Γ: the data do not support the finding even at Γ = 1 (made-up differences, half each way).
    const noTipping = await lurk(['pairs', '--file', 'd.csv', '--diff', 'd', '--svg', 'amplification'], { 'd.csv': 'd\n1\n-1\n2\n-2\n3\n-3\n0.5\n' });
    expect(noTipping.code).toBe(2);
    expect(noTipping.stderr).toMatch(/^lurk pairs: --svg: this result has no amplification figure \(none when there is no tipping Γ\)/);
    // A 0/1 outcome in matched sets: the test counts events and gives no estimate (made-up sets).
    const binary = 'set,treated,outcome\n' + Array.from({ length: 8 }, (_, i) => `s${i},1,1\ns${i},0,${i % 3 === 0 ? 1 : 0}\ns${i},0,0\n`).join('');
    const sets = await lurk(['sets', '--file', 'b.csv', '--set', 'set', '--treated', 'treated', '--outcome', 'outcome', '--svg', 'estimate'], { 'b.csv': binary });
    expect(sets.code).toBe(2);
    expect(sets.stderr).toMatch(/^lurk sets: --svg: this result has no estimate figure \(none when the outcome is 0\/1/);
  });

  it('options that print a query (--sql) draw no figure', async () => {
    const { code, stdout, stderr } = await lurk(['evalue', '--sql', 'research.cohort', '--exposure', 'smoker', '--outcome', 'cancer', '--svg', 'strengths']);
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr).toMatch(/^lurk evalue: --svg: these options print no analysis/);
  });
});

describe('--help of every calculator command lists its figures', () => {
  it.each(COMMANDS)('lurk $command --help', async ({ command, figures }) => {
    const { code, stdout } = await lurk([command, '--help']);
    expect(code).toBe(0);
    expect(stdout).toMatch(new RegExp(`--svg FIGURE +one of ${figures.join(', ')}:`));
    for (const figure of figures) expect(stdout).toMatch(new RegExp(`^ {6}${figure} +\\S`, 'm'));
    expect(stdout).toMatch(/--svg-width W +column \(3\.5 in\) or two-columns \(7 in\)/);
    expect(stdout).toMatch(/> figure\.svg/);
  });
});

describe('the built command writes the SVG to standard output', () => {
  let cli: { lurk: string; remove(): void };
  beforeAll(async () => {
    cli = await buildCliForTest();
  }, 120_000);
  afterAll(() => cli?.remove());

  it('cat pairs.csv | lurk pairs --file - --diff d --svg p-value', () => {
    const run = spawnSync(process.execPath, [cli.lurk, 'pairs', '--file', '-', '--diff', 'd', '--svg', 'p-value'], { encoding: 'utf8', input: readReferenceText('rosenbaum_small_n15.csv') });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expectPrintSvg(run.stdout, 3.5);
  });

  it('a wrong figure name exits 2 with one line', () => {
    const run = spawnSync(process.execPath, [cli.lurk, 'ovb', '--estimate', '4.18', '--se', '1', '--df', '783', '--svg', 'contour'], { encoding: 'utf8' });
    expect(run.status).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toBe('lurk ovb: --svg: must be one of estimate, t, extreme, got "contour"\n');
  });
});
