// Option parsing, file reading and messages shared by every command: one line naming the right option, exit
// status 2 for bad input (3 for batch/report with problems), never a stack trace, never a terminal escape.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';
import { parseOptions } from '../../src/cli/parseOptions';
import { buildCliForTest } from '../support/builtCli';
import { referencePath } from '../support/reference';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const setsPath = fileURLToPath(new URL('../files/matched-sets-fictional.csv', import.meta.url));
const batchPath = fileURLToPath(new URL('../files/batch-findings.csv', import.meta.url));
const appraisalPath = fileURLToPath(new URL('../files/appraisal-reference.json', import.meta.url));
/** A made-up 2×2 table as one row per person (fictional): exposure e, outcome o. */
const people = 'e,o\n' + [...Array(30).fill('1,1'), ...Array(20).fill('1,0'), ...Array(10).fill('0,1'), ...Array(40).fill('0,0')].join('\n') + '\n';

async function lurk(args: string[], files: Record<string, string> = {}) {
  const io = memoryIo(files);
  const code = await runLurk(args, io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

describe('parseOptions', () => {
  const kinds = { estimate: { type: 'string', short: 'e' }, lower: { type: 'string' }, file: { type: 'string' }, json: { type: 'boolean' } } as const;
  it('takes the next argument as the value of an option that needs one, whatever it starts with', () => {
    expect(parseOptions(['-e', '-0.4', '--lower', '-Infinity', '--file', '-x'], kinds).values).toEqual({ estimate: '-0.4', lower: '-Infinity', file: '-x' });
    expect(parseOptions(['-e-0.4', '--lower=-1'], kinds).values).toEqual({ estimate: '-0.4', lower: '-1' });
    expect(parseOptions(['-', '--', '--json'], kinds).positionals).toEqual(['-', '--json']);
  });
  it('refuses an option followed by another option, a value for a flag, and unknown options, naming each', () => {
    expect(() => parseOptions(['--estimate', '--json'], kinds)).toThrow('--estimate: needs a value');
    expect(() => parseOptions(['--json=yes'], kinds)).toThrow('--json: takes no value');
    expect(() => parseOptions(['--bogus'], kinds)).toThrow('--bogus: is not an option');
    expect(() => parseOptions(['-z'], kinds)).toThrow('-z: is not an option');
  });
});

describe('messages name the right option, on one line', () => {
  it.each([
    [['evalue', '-m', 'rr', '-e', '-0.4'], /^lurk evalue: --estimate: must be greater than 0/],
    [['evalue', '-m', 'rr', '-e', '2', '--lower', '-Infinity', '--upper', '3'], /^lurk evalue: --lower: must be a number, got "-Infinity"/],
    [['ovb', 'estimate', '4.18'], /^lurk ovb: argument "estimate": is not an option of lurk ovb/],
    [['ovb', '--json', 'yes'], /^lurk ovb: argument "yes": is not an option/],
    [['ovb', ''], /^lurk ovb: argument "": is not an option/],
    [['ovb', '--estimate', '2', '--se', '0.5', '--df', '100', '--alpha', '1e-300'], /^lurk ovb: --alpha: must be between 1e-12 and 0\.5 \(/],
    [['evalue', '--measure', 'rr', '--estimate', '2', '--target', '1.79e308'], /^lurk evalue: --target: must be between 1e-300 and 1e\+300 in size/],
    [['pairs', '--discordant', '10,5', '--gamma', '1e300'], /^lurk pairs: --gamma: item 1 is 1e\+300; each Γ must be at most 1,000,000/],
    [['ovb', '--summary', 's.csv', '--outcome', 'y', '--treatment', 'd', '--covariates', 'a'], /^lurk ovb: --summary: column n is missing from the query result/],
    [['batch', 'empty.csv'], /^lurk batch: FILE: /],
    [['pairs', '--file', 'esc.csv', '--treated', 'x', '--control', 'y'], /^lurk pairs: --treated: .*\\x1b\[31m/],
  ])('%j', async (args, message) => {
    const { code, stdout, stderr } = await lurk(args as string[], {
      's.csv': 'sum_y,sum_d\n1,2\n',
      'empty.csv': 'measure,estimate\n',
      'esc.csv': '\u001b[31mred,y\n1,2\n',
    });
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr).toMatch(message);
    expect(stderr.trim().split('\n')).toHaveLength(1);
    expect(stderr).not.toMatch(/\u001b/);
  });
});

describe('files and standard input', () => {
  it('"-" reads standard input', async () => {
    const batch = await lurk(['batch', '-', '--keep-going'], { '-': 'measure,estimate,lower,upper\nrr,3.9,1.8,8.7\n' });
    expect(batch.code).toBe(0);
    // VanderWeele & Ding 2017 worked example: RR 3.9 (1.8–8.7) → E-values 7.26 and 3.00.
    expect(batch.stdout).toMatch(/7\.26\s+3\.00/);
    const pairs = await lurk(['pairs', '--file', '-', '--diff', 'd'], { '-': 'd\n1\n2\n3\n-1\n4\n5\n' });
    expect(pairs.code).toBe(0);
  });

  it('batch exits 3 when a row has a problem, 0 with --keep-going; report exits 3 when a saved result is gone', async () => {
    const rows = 'measure,estimate\nrr,2\nzz,1\n';
    expect((await lurk(['batch', 'b.csv'], { 'b.csv': rows })).code).toBe(3);
    expect((await lurk(['batch', 'b.csv', '--keep-going'], { 'b.csv': rows })).code).toBe(0);
    const appraisal = {
      format: 'lurk-appraisal',
      version: 1,
      savedAt: '2026-01-02T03:04:05Z',
      study: { finding: 'Fictional', exposure: 'e', outcome: 'o', units: '', source: 'invented' },
      calculators: {
        regression: {
          inputs: { source: 'reported', estimate: 'oops', se: '1', df: '10' },
          summary: { kind: 'regression', estimate: 2, se: 1, t: 2, df: 10, q: 1, alpha: 0.05, direction: 'toward-zero', partialR2: 0.29, rv: 0.46, rvAlpha: 0, benchmarks: [] },
        },
      },
    };
    const report = await lurk(['report', 'a.json'], { 'a.json': JSON.stringify(appraisal) });
    expect(report.code).toBe(3);
    // A version-1 file: its regression entry is read as one finding named after the method.
    expect(report.stderr).toMatch(/^lurk report: finding "Regression" \(findings\[0\]\): had a result when saved but gives none now/);
    expect((await lurk(['report', 'a.json', '--keep-going'], { 'a.json': JSON.stringify(appraisal) })).code).toBe(0);
  });
});

/** Every `reading` anywhere in a JSON value. */
function readingsIn(value: unknown): unknown[] {
  if (Array.isArray(value)) return value.flatMap(readingsIn);
  if (value === null || typeof value !== 'object') return [];
  return Object.entries(value).flatMap(([key, v]) => (key === 'reading' ? [v, ...readingsIn(v)] : readingsIn(v)));
}

describe('one JSON shape: reading is {text, sentences} in every command', () => {
  it.each([
    ['evalue', ['--measure', 'rr', '--estimate', '3.9', '--lower', '1.8', '--upper', '8.7']],
    ['pairs', ['--file', referencePath('rosenbaum_small_n15.csv'), '--diff', 'd']],
    ['pairs', ['--discordant', '30,12']],
    ['sets', ['--file', setsPath, '--set', 'matched_set', '--treated', 'treated', '--outcome', 'outcome']],
    ['ovb', ['--estimate', '4.18', '--se', '1', '--df', '783']],
    ['weighting', ['--file', referencePath('weighting_mtcars.csv'), '--treatment', 'am', '--outcome', 'mpg', '--bootstrap', '40']],
  ])('lurk %s --json', async (command, args) => {
    const { code, stdout } = await lurk([command, ...(args as string[]), '--json']);
    expect(code).toBe(0);
    const json = JSON.parse(stdout);
    const reading = json.reading;
    expect(Object.keys(reading).slice(0, 2)).toEqual(['text', 'sentences']);
    expect(reading.sentences.length).toBeGreaterThan(0);
    for (const sentence of reading.sentences) expect(typeof sentence).toBe('string');
    expect(reading.text).toBe(reading.sentences.join(' '));
    expect(readingsIn(json)).toHaveLength(1);
  });

  it('the E-value keeps its estimate and interval sentences beside them', async () => {
    const json = JSON.parse((await lurk(['evalue', '--measure', 'rr', '--estimate', '3.9', '--lower', '1.8', '--upper', '8.7', '--json'])).stdout);
    // VanderWeele & Ding 2017 worked example: E-values 7.26 and 3.00.
    expect(json.reading.estimate).toMatch(/at least 7\.26 each/);
    expect(json.reading.interval).toMatch(/at least 3\.00 each/);
    expect(json.reading.sentences).toEqual([json.reading.estimate, json.reading.interval]);
  });

  it('batch --json has no reading of its own, and none of another shape', async () => {
    const json = JSON.parse((await lurk(['batch', batchPath, '--json', '--keep-going'])).stdout);
    expect(readingsIn(json)).toEqual([]);
  });
});

describe('the built command', () => {
  let cli: { lurk: string; remove(): void };
  beforeAll(async () => {
    cli = await buildCliForTest();
  }, 120_000);
  afterAll(() => cli?.remove());

  const run = (args: string[], input?: string) => spawnSync(process.execPath, [cli.lurk, ...args], { encoding: 'utf8', input });

  // Every option that reads a file reads standard input for "-": the same output as the file by its path.
  it.each([
    ['evalue --file', ['evalue', '--exposure', 'e', '--outcome', 'o', '--json'], '--file', null],
    ['pairs --file', ['pairs', '--diff', 'd', '--json'], '--file', referencePath('rosenbaum_small_n15.csv')],
    ['sets --file', ['sets', '--set', 'matched_set', '--treated', 'treated', '--outcome', 'outcome', '--json'], '--file', setsPath],
    ['ovb --file', ['ovb', '--outcome', 'Fertility', '--treatment', 'Education', '--json'], '--file', referencePath('swiss.csv')],
    ['weighting --file', ['weighting', '--treatment', 'am', '--outcome', 'mpg', '--bootstrap', '40', '--json'], '--file', referencePath('weighting_mtcars.csv')],
    ['batch FILE', ['batch', '--json', '--keep-going'], '', batchPath],
    ['report FILE', ['report'], '', appraisalPath],
  ] as const)('%s -: standard input', (_name, args, option, path) => {
    const text = path === null ? people : readFileSync(path, 'utf8');
    const where = (file: string) => (option ? [option, file] : [file]);
    const fromStdin = run([...args, ...where('-')], text);
    expect(fromStdin.stderr).toBe('');
    expect(fromStdin.status).toBe(0);
    const dir = mkdtempSync(join(tmpdir(), 'lurk-stdin-'));
    try {
      const file = join(dir, 'data');
      writeFileSync(file, text);
      const fromFile = run([...args, ...where(file)]);
      expect(fromFile.status).toBe(0);
      expect(fromStdin.stdout).toBe(fromFile.stdout.split(file).join('standard input'));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('--summary - reads the query result from standard input (evalue; pairs is checked in pairs.test.ts)', () => {
    const result = run(['evalue', '--summary', '-', '--json'], 'lurk_query,a,b,c,d,rows_missing\nlurk-2x2-counts,30,70,10,90,2\n');
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    expect(JSON.parse(result.stdout).table.counts).toEqual({ a: 30, b: 70, c: 10, d: 90 });
  });

  it('exit status: 2 for bad input on every command, one line on standard error', () => {
    for (const args of [
      ['evalue', '--measure', 'rr', '--estimate', '-1'],
      ['pairs', '--discordant', '30'],
      ['sets', '--file', setsPath, '--set', 'nope', '--treated', 'treated', '--outcome', 'outcome'],
      ['ovb', '--estimate', '1', '--se', '0', '--df', '10'],
      ['weighting', '--file', referencePath('weighting_mtcars.csv'), '--treatment', 'am', '--outcome', 'mpg', '--lambda', '0.5'],
      ['batch', 'missing.csv'],
      ['report', 'missing.json'],
      ['nonsense'],
    ]) {
      const r = run(args);
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stdout, args.join(' ')).toBe('');
      expect(r.stderr.trimEnd().split('\n'), r.stderr).toHaveLength(1);
    }
  });

  it('exit status: 3 when batch rows or report calculators have problems, 0 with --keep-going', () => {
    const rows = 'measure,estimate\nrr,2\nzz,1\n';
    const batch = run(['batch', '-'], rows);
    expect(batch.status).toBe(3);
    expect(batch.stdout).toMatch(/Problems:/);
    expect(batch.stderr).toMatch(/^lurk batch: 1 of 2 rows have problems/);
    expect(run(['batch', '-', '--keep-going'], rows).status).toBe(0);
    const appraisal = JSON.parse(readFileSync(appraisalPath, 'utf8'));
    const broken = JSON.stringify({ ...appraisal, calculators: { ...appraisal.calculators, regression: { inputs: { source: 'reported', estimate: 'oops', se: '1', df: '10' }, summary: { kind: 'regression', estimate: 2, se: 1, t: 2, df: 10, q: 1, alpha: 0.05, direction: 'toward-zero', partialR2: 0.29, rv: 0.46, rvAlpha: 0, benchmarks: [] } } } });
    const report = run(['report', '-'], broken);
    expect(report.status).toBe(3);
    expect(report.stderr).toMatch(/^lurk report: finding "Regression" \(findings\[\d+\]\): had a result when saved but gives none now/);
    expect(run(['report', '-', '--keep-going'], broken).status).toBe(0);
    expect(run(['report', '-'], readFileSync(appraisalPath, 'utf8')).status).toBe(0);
  });

  it('a missing file is one line and exit 2, never a stack trace (with or without the columns named)', () => {
    for (const args of [['pairs', '--file', 'missing.csv'], ['pairs', '--file', 'missing.csv', '--treated', 'a', '--control', 'b'], ['ovb', '--file', 'missing.csv', '--outcome', 'y', '--treatment', 't']]) {
      const run = spawnSync(process.execPath, [cli.lurk, ...args], { encoding: 'utf8' });
      expect(run.status, run.stderr).toBe(2);
      expect(run.stderr.trim().split('\n'), run.stderr).toHaveLength(1);
      expect(run.stderr).not.toMatch(/at |node:|Error/);
    }
  });
});
