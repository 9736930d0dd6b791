import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { duckDbEngine, postgresEngine, type SqlEngine } from '../support/sqlEngines';
import { spawnSync } from 'node:child_process';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';
import { expectClose } from '../support/expectClose';
import { readReferenceJson, readReferenceText, referencePath } from '../support/reference';
import { buildCliForTest } from '../support/builtCli';

const reference = readReferenceJson('rosenbaum.json');

async function lurk(args: string[], files: Record<string, string> = {}) {
  const io = memoryIo(files);
  const code = await runLurk(args, io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

describe('lurk pairs --json against the reference', () => {
  test('n = 40 differences: rows, sensitivity value and n', async () => {
    // R 4.2.2 reference, test/reference/rosenbaum.json (exact signed-rank, alternative treated > control)
    const { code, stdout, stderr } = await lurk([
      'pairs', '--file', referencePath('rosenbaum_n40.csv'), '--diff', 'd', '--gamma', reference.gammas.join(','), '--json',
    ]);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const json = JSON.parse(stdout);
    const ds = reference.datasets.n40;
    expect(json.n).toBe(40);
    expectClose(json.sensitivityValue, ds.sensitivity_value.wilcoxon_exact, { rel: 1e-8 });
    json.rows.forEach((row: any, i: number) => {
      expect(Object.keys(row)).toEqual(['gamma', 'pUpper', 'pLower']);
      expectClose(row.pUpper, ds.by_gamma[i].wilcoxon_upper_exact, { rel: 1e-11 });
      expectClose(row.pLower, ds.by_gamma[i].wilcoxon_lower_exact, { rel: 1e-11 });
    });
    expect(json.estimates).toHaveLength(reference.gammas.length);
    expect(json.tailMethod).toBe('exact');
  });

  test('sign test, normal approximation with continuity correction', async () => {
    // R 4.2.2 reference, rosenbaum.json: sign_upper_normal_cc and its sensitivity value
    const { code, stdout } = await lurk([
      'pairs', '--file', referencePath('rosenbaum_small_n15.csv'), '--diff', 'd', '--test', 'sign', '--method', 'normal',
      '--continuity-correction', '--gamma', '1,2', '--json',
    ]);
    expect(code).toBe(0);
    const json = JSON.parse(stdout);
    const ds = reference.datasets.small_n15;
    expectClose(json.rows[1].pUpper, ds.by_gamma[3].sign_upper_normal_cc, { rel: 1e-11 });
    expectClose(json.sensitivityValue, ds.sensitivity_value.sign_normal_cc, { rel: 1e-8 });
  });

  test('discordant counts', async () => {
    // Same as the sign test of small_n15: S = 12 of D = 15 (R 4.2.2 pbinom reference)
    const { code, stdout } = await lurk(['pairs', '--discordant', '12,3', '--json']);
    expect(code).toBe(0);
    const json = JSON.parse(stdout);
    expect(json.test).toBe('sign');
    expectClose(json.sensitivityValue, reference.datasets.small_n15.sensitivity_value.sign_exact, { rel: 1e-8 });
  });

  test('treated and control columns, with a missing row dropped and counted', async () => {
    const csv = 'pair;treated;control\r\n1;5,1;4,2\r\n2;6,0;5,5\r\n3;NA;4,9\r\n4;7,2;6,1\r\n5;5,5;5,0\r\n6;6,6;5,1\r\n7;3,9;3,2\r\n8;5,0;4,1\r\n9;6,2;5,9\r\n';
    const { code, stdout } = await lurk(['pairs', '--file', 'p.csv', '--treated', 'treated', '--control', 'control', '--json'], { 'p.csv': '\ufeff' + csv });
    expect(code).toBe(0);
    const json = JSON.parse(stdout);
    expect(json.n).toBe(8);
    expect(json.droppedRows).toBe(1);
    expect(json.warnings.join(' ')).toMatch(/1 of 9 rows were left out/);
    // All 8 differences positive: exact p at Γ = 1 is 2⁻⁸ (Wilcoxon 1945: only one sign pattern reaches T = 36)
    expectClose(json.pValue, 2 ** -8, { rel: 1e-13 });
  });
});

describe('readable report', () => {
  test('names the tipping Γ, the table, the reading and the caution', async () => {
    const { code, stdout } = await lurk(['pairs', '--file', referencePath('rosenbaum_small_n15.csv'), '--diff', 'd']);
    expect(code).toBe(0);
    expect(stdout).toMatch(/Tipping Γ \(sensitivity value\): 1\.611/);
    expect(stdout).toMatch(/worst-case p/);
    expect(stdout).toMatch(/by a factor of more than 1\.611/);
    expect(stdout).toMatch(/does not prove causation/);
    expect(stdout).not.toMatch(/NaN|undefined|Infinity/);
  });
  test('--help lists the options', async () => {
    const { code, stdout } = await lurk(['pairs', '--help']);
    expect(code).toBe(0);
    expect(stdout).toMatch(/--discordant/);
    expect(stdout).toMatch(/--continuity-correction/);
  });
});

describe('bad input exits 2 with one line naming the option', () => {
  const file = { 'p.csv': 'd,t,c\n1,2,1\n2,3,1\nx,4,1\n', 'z.csv': 'd\n0\n0\n1\n', 'e.csv': '' };
  test.each([
    [['pairs', '--file', 'p.csv', '--diff', 'd'], /^lurk pairs: --diff: column "d" has "x" in row 3, which is not a number\n$/],
    [['pairs', '--file', 'z.csv', '--diff', 'd'], /^lurk pairs: --file: needs at least two pairs whose outcomes differ/],
    [['pairs', '--file', 'p.csv', '--diff', 'q'], /^lurk pairs: --diff: no column named "q" \(columns: d, t, c\)\n$/],
    [['pairs', '--file', 'p.csv', '--treated', 't', '--control', 'c', '--gamma', '1,0.5'], /^lurk pairs: --gamma: must be 1 or more/],
    [['pairs', '--file', 'p.csv', '--treated', 't', '--control', 'c', '--alpha', '1.2'], /^lurk pairs: --alpha: must be between 1e-12 and 0\.5/],
    [['pairs', '--file', 'p.csv', '--treated', 't'], /^lurk pairs: --control: name the control-outcome column/],
    [['pairs', '--file', 'e.csv', '--diff', 'd'], /^lurk pairs: --file: the file is empty\n$/],
    [['pairs', '--file', 'missing.csv', '--diff', 'd'], /^lurk pairs: --file: "missing.csv": no such file\n$/],
    [['pairs', '--discordant', '3'], /^lurk pairs: --discordant: needs two counts/],
    [['pairs', '--discordant', '1,0'], /^lurk pairs: --discordant: needs at least two discordant pairs/],
    [['pairs', '--discordant', '2.5,4'], /^lurk pairs: --discordant: must be a whole number/],
    [['pairs', '--discordant', '5,1', '--test', 'median'], /^lurk pairs: --test: must be one of signrank, sign/],
    [['pairs', '--discordant', '5,1', '--frobnicate'], /^lurk pairs: --frobnicate: is not an option/],
    [['pairs'], /^lurk pairs: --file: give a CSV file of pairs/],
    [['pairs', '--discordant', '5,1', '--diff', 'd'], /^lurk pairs: --discordant: give either --discordant or --diff, not both/],
    [['pairs', '--file', 'p.csv', '--diff', 'd', '--treated', 't', '--control', 'c'], /^lurk pairs: --diff: give either --diff or --treated and --control, not both/],
    [['pairs', '--discordant', '5,1', '--alpha', '1,200'], /^lurk pairs: --alpha: "1,200" could be 1\.2 \(decimal comma\) or 1200/],
  ])('%j', async (args, message) => {
    const { code, stderr, stdout } = await lurk(args as string[], file);
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr).toMatch(message);
    expect(stderr.trim().split('\n')).toHaveLength(1);
  });
});

describe('the built command', () => {
  test('node lurk.js pairs prints JSON and exits 0; bad input exits 2', async () => {
    const cli = await buildCliForTest();
    const built = cli.lurk;
    const ok = spawnSync('node', [built, 'pairs', '--file', referencePath('rosenbaum_small_n15.csv'), '--diff', 'd', '--json'], { encoding: 'utf8' });
    expect(ok.status).toBe(0);
    // R 4.2.2 reference sensitivity value (exact signed-rank), rosenbaum.json
    expectClose(JSON.parse(ok.stdout).sensitivityValue, reference.datasets.small_n15.sensitivity_value.wilcoxon_exact, { rel: 1e-8 });
    const bad = spawnSync('node', [built, 'pairs', '--discordant', '1,-4'], { encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/^lurk pairs: --discordant: /);
    expect(readReferenceText('rosenbaum_small_n15.csv').length).toBeGreaterThan(0);
    cli.remove();
  }, 120_000);
});

describe('lurk pairs --sql / --summary: the pairs stay in the database', () => {
  // Fictional pairs: halves (exact in binary, so the database's exact ties and the file's tolerance agree), with
  // ties, zero differences and missing values. Reference: the file path with --method normal on the same data.
  const control = Array.from({ length: 240 }, (_, i) => 50 + ((i * 37) % 11) * 0.5);
  const treated: Array<number | null> = control.map((c, i) => (i % 29 === 3 ? null : i % 13 === 0 ? c : c + (((i * 7919) % 15) - 5) * 0.5));
  const csv = 'treated,control\n' + treated.map((t, i) => `${t === null ? 'NA' : t},${control[i]}`).join('\n') + '\n';

  describe.each([
    ['DuckDB', duckDbEngine],
    ['PostgreSQL', postgresEngine],
  ] as const)('on %s', (_name, open) => {
    let engine: SqlEngine;
    beforeAll(async () => {
      engine = await open();
      await engine.table(['trial', 'pairs'], [
        { name: 'treated', type: 'DOUBLE PRECISION', values: treated },
        { name: 'control', type: 'DOUBLE PRECISION', values: control },
      ]);
    }, 120_000);
    afterAll(async () => engine?.close());

    test('the pasted result gives the table, tipping Γ, sign-test value and amplification of --method normal on the file (to 1e-9)', async () => {
      const printed = await lurk(['pairs', '--sql', 'trial.pairs', '--treated', 'treated', '--control', 'control', '--json']);
      expect(printed.code).toBe(0);
      const { query } = JSON.parse(printed.stdout);
      const row = await engine.row(query);
      for (const [pasted, files] of [
        [JSON.stringify(row), {}],
        ['result.csv', { 'result.csv': Object.keys(row).join(',') + '\n' + Object.values(row).join(',') + '\n' }],
      ] as const) {
        const fromSummary = await lurk(['pairs', '--summary', pasted, '--gamma', '1,1.5,2,3', '--json'], files);
        expect(fromSummary.stderr).toBe('');
        const fromFile = await lurk(['pairs', '--file', 'pairs.csv', '--treated', 'treated', '--control', 'control', '--method', 'normal', '--gamma', '1,1.5,2,3', '--json'], { 'pairs.csv': csv });
        const s = JSON.parse(fromSummary.stdout);
        const f = JSON.parse(fromFile.stdout);
        expect([s.n, s.droppedRows, s.zeroDifferences, s.nonZero, s.favourable]).toEqual([f.n, f.droppedRows, f.zeroDifferences, f.nonZero, f.favourable]);
        expect(f.zeroDifferences).toBeGreaterThan(0);
        s.rows.forEach((r: any, i: number) => {
          expectClose(r.pUpper, f.rows[i].pUpper, { rel: 1e-9 });
          expectClose(r.pLower, f.rows[i].pLower, { rel: 1e-9 });
        });
        expectClose(s.sensitivityValue, f.sensitivityValue, { rel: 1e-9 });
        expect(s.signTestSensitivityValue).toBe(f.signTestSensitivityValue);
        s.amplification.forEach((a: any, i: number) => expectClose(a.delta, f.amplification[i].delta, { rel: 1e-9 }));
        expect(s.estimates).toEqual([]);
        expect(s.warnings.join(' ')).toMatch(/need the differences themselves/);
      }
    });

    test('a difference column and the alternative "less" agree too', async () => {
      await engine.run('DROP TABLE IF EXISTS diffs');
      await engine.run('CREATE TABLE diffs AS SELECT treated - control AS "diff" FROM trial.pairs');
      const { stdout } = await lurk(['pairs', '--sql', 'diffs', '--diff', 'diff']);
      const row = await engine.row(stdout);
      const s = JSON.parse((await lurk(['pairs', '--summary', JSON.stringify(row), '--alternative', 'less', '--json'])).stdout);
      const f = JSON.parse((await lurk(['pairs', '--file', 'p.csv', '--treated', 'treated', '--control', 'control', '--alternative', 'less', '--method', 'normal', '--json'], { 'p.csv': csv })).stdout);
      s.rows.forEach((r: any, i: number) => expectClose(r.pUpper, f.rows[i].pUpper, { rel: 1e-9 }));
    });
  });

  test('bad results: one message naming the column, or the other query', async () => {
    const good = { lurk_query: 'lurk-pairs-signed-ranks', rows_read: 5, pairs: 5, zeros: 1, non_zero: 4, positive: 3, rank_sum_positive: 8, rank_sum: 10, rank_sum_squares: 30 };
    const bad = async (row: Record<string, unknown>) => {
      const { code, stderr } = await lurk(['pairs', '--summary', JSON.stringify(row)]);
      expect(code).toBe(2);
      return stderr;
    };
    expect(await bad({ ...good, rank_sum: undefined })).toMatch(/--summary: column rank_sum is missing/);
    expect(await bad({ ...good, positive: 'many' })).toMatch(/--summary: column positive must be a whole number/);
    expect(await bad({ ...good, zeros: -1 })).toMatch(/--summary: column zeros must be a whole number of 0 or more/);
    expect(await bad({ ...good, rank_sum_squares: 0 })).toMatch(/--summary: column rank_sum_squares must lie between/);
    expect(await bad({ lurk_query: 'lurk-2x2-counts', a: 1, b: 2, c: 3, d: 4 })).toMatch(/--summary: is the result of another query/);
    expect(await bad({ lurk_query: 'lurk-regression-summary', n: 9, m_1: 2 })).toMatch(/another query/);
    const { code, stderr } = await lurk(['pairs', '--summary', 'none.json']);
    expect(code).toBe(2);
    expect(stderr).toMatch(/--summary: cannot read "none.json"/);
    expect((await lurk(['pairs', '--sql', 'x', '--file', 'f.csv', '--diff', 'd'])).stderr).toMatch(/--sql: cannot be combined with --file/);
    expect((await lurk(['pairs', '--summary', 'r.json', '--diff', 'd'])).stderr).toMatch(/--diff: goes with --file or --sql/);
  });
  test('the built command reads the result from standard input with --summary -', async () => {
    const cli = await buildCliForTest();
    const row = { lurk_query: 'lurk-pairs-signed-ranks', rows_read: 5, pairs: 5, zeros: 1, non_zero: 4, positive: 3, rank_sum_positive: 8, rank_sum: 10, rank_sum_squares: 30 };
    const run = spawnSync(process.execPath, [cli.lurk, 'pairs', '--summary', '-', '--json'], { input: Object.keys(row).join(',') + '\n' + Object.values(row).join(',') + '\n', encoding: 'utf8' });
    cli.remove();
    expect(run.stderr).toBe('');
    expect(JSON.parse(run.stdout).statistic).toBe(8);
  }, 120_000);
});
