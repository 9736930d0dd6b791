// Option parsing, file reading and messages shared by every command: one line naming the right option, exit
// status 2 for bad input (3 for batch/report with problems), never a stack trace, never a terminal escape.
import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';
import { parseOptions } from '../../src/cli/parseOptions';
import { buildCliForTest } from '../support/builtCli';

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

describe('the built command', () => {
  let cli: { lurk: string; remove(): void };
  beforeAll(async () => {
    cli = await buildCliForTest();
  }, 120_000);
  afterAll(() => cli?.remove());

  it('a missing file is one line and exit 2, never a stack trace (with or without the columns named)', () => {
    for (const args of [['pairs', '--file', 'missing.csv'], ['pairs', '--file', 'missing.csv', '--treated', 'a', '--control', 'b'], ['ovb', '--file', 'missing.csv', '--outcome', 'y', '--treatment', 't']]) {
      const run = spawnSync(process.execPath, [cli.lurk, ...args], { encoding: 'utf8' });
      expect(run.status, run.stderr).toBe(2);
      expect(run.stderr.trim().split('\n'), run.stderr).toHaveLength(1);
      expect(run.stderr).not.toMatch(/at |node:|Error/);
    }
  });
});
