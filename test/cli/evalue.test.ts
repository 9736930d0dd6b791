import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { memoryIo } from '../../src/cli/cliIo';
import { runLurk } from '../../src/cli/main';
import { expectClose } from '../support/expectClose';
import { buildCliForTest } from '../support/builtCli';
import { duckDbEngine, postgresEngine, type SqlEngine } from '../support/sqlEngines';

async function lurk(args: string[], files: Record<string, string> = {}) {
  const io = memoryIo(files);
  const code = await runLurk(['evalue', ...args], io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

async function lurkJson(args: string[], files: Record<string, string> = {}) {
  const { code, stdout, stderr } = await lurk([...args, '--json'], files);
  expect(stderr).toBe('');
  expect(code).toBe(0);
  return JSON.parse(stdout);
}

/** Runs a bad input and returns its one error line. */
async function errorLine(args: string[], files: Record<string, string> = {}): Promise<string> {
  const { code, stdout, stderr } = await lurk(args, files);
  expect(code).toBe(2);
  expect(stdout).toBe('');
  expect(stderr.trim().split('\n')).toHaveLength(1);
  return stderr.trim();
}

describe('lurk evalue: published example', () => {
  it('RR 3.9 (1.8 to 8.7) prints E-values 7.26 and 3.00', async () => {
    // VanderWeele & Ding 2017, Ann Intern Med 167:268–274: 7.26 and 3.0
    const json = await lurkJson(['--measure', 'rr', '--estimate', '3.9', '--lower', '1.8', '--upper', '8.7']);
    expectClose(json.eValueEstimate, 7.263034344160047, { rel: 1e-13 }); // R 4.2.2, evalues.json case rr_published
    expect(json.eValueInterval).toBe(3);
    expect(json.riskRatioScale).toEqual({ estimate: 3.9, lower: 1.8, upper: 8.7, target: 1 });
    expect(json.intervalLimitUsed).toBe('lower');
    expect(json.conversion.kind).toBe('none');
    expect(json.caution).toMatch(/does not prove causation/);

    const { code, stdout } = await lurk(['--measure', 'rr', '--estimate', '3.9', '--lower', '1.8', '--upper', '8.7']);
    expect(code).toBe(0);
    expect(stdout).toMatch(/E-value, estimate +7\.26/);
    expect(stdout).toMatch(/E-value, interval +3\.00 +\(from the lower limit\)/);
    expect(stdout).toMatch(/at least 7\.26 each/);
    expect(stdout).toMatch(/does not prove causation/);
    expect(stdout).not.toMatch(/NaN|undefined|Infinity/);
  });
});

describe('lurk evalue: reported estimates', () => {
  it('a common-outcome odds ratio is converted and says so', async () => {
    // R 4.2.2: evalues.json case or_2.5_common
    const json = await lurkJson(['--measure', 'or', '--estimate', '2.5', '--lower', '1.6', '--upper', '3.9', '--outcome-prevalence', 'common']);
    expectClose(json.riskRatioScale.estimate, 1.5811388300841898, { rel: 1e-14 });
    expectClose(json.eValueEstimate, 2.5397112946980083, { rel: 1e-13 });
    expectClose(json.eValueInterval, 1.8437797330525096, { rel: 1e-13 });
    expect(json.conversion.note).toMatch(/√OR/);
  });

  it('a standardized mean difference with an SE', async () => {
    // R 4.2.2: evalues.json case smd_0.5_se_0.1 (estimate); the interval with 0.91·z·SE at every level:
    // test/reference/smd_evalues.json (R base, d 0.5, SE 0.1, level 0.95)
    const json = await lurkJson(['--measure', 'smd', '--estimate', '0.5', '--se', '0.1']);
    expectClose(json.eValueEstimate, 2.5291419818612693, { rel: 1e-13 });
    expectClose(json.eValueInterval, 1.9669727803707331, { rel: 1e-13 });
    expect(json.intervalSource).toBe('standard-error');
  });

  it('no interval gives a null interval E-value; a target shifts the comparison', async () => {
    const pointOnly = await lurkJson(['--measure', 'rr', '--estimate', '10']);
    expect(pointOnly.eValueInterval).toBeNull();
    expect(pointOnly.riskRatioScale.lower).toBeNull();
    // R 4.2.2: evalues.json case rr_3.9_true_1.5
    const target = await lurkJson(['--measure', 'rr', '--estimate', '3.9', '--lower', '1.8', '--upper', '8.7', '--target', '1.5']);
    expectClose(target.eValueEstimate, 4.639607805437114, { rel: 1e-13 });
    expectClose(target.eValueInterval, 1.6898979485566354, { rel: 1e-13 });
  });

  it('takes negative numbers as option values', async () => {
    const json = await lurkJson(['--measure', 'smd', '--estimate', '-0.4', '--lower', '-0.7', '--upper', '-.1']);
    expect(json.riskRatioScale.estimate).toBeCloseTo(Math.exp(-0.364), 14);
    expect(json.direction).toBe('below-target');
  });

  it('reads a decimal comma', async () => {
    const json = await lurkJson(['--measure', 'rr', '--estimate', '3,9', '--lower', '1,8', '--upper', '8,7']);
    expect(json.riskRatioScale.estimate).toBe(3.9);
  });

  it('compares reference confounders', async () => {
    const json = await lurkJson(['--measure', 'rr', '--estimate', '3.9', '--lower', '1.8', '--upper', '8.7', '--reference-confounders', 'age:4:4;income:20:5']);
    expect(json.referenceConfounders.map((c: { name: string; explainsEstimate: boolean }) => [c.name, c.explainsEstimate])).toEqual([
      ['age', false],
      ['income', true],
    ]);
    expect(json.referenceConfounders[0].sentence).toMatch(/^A hidden confounder as strong as age/);
  });
});

describe('lurk evalue: counts and files', () => {
  it('--counts gives the risk ratio with a Wald interval', async () => {
    // hand computation: RR = (10/100)/(5/100) = 2, E = 2 + √2
    const json = await lurkJson(['--counts', '10,90,5,95']);
    expect(json.source).toBe('counts');
    expectClose(json.riskRatioScale.estimate, 2, { rel: 1e-15 });
    expectClose(json.eValueEstimate, 2 + Math.SQRT2, { rel: 1e-15 });
    expect(json.table.zeroCellCorrection).toBe(false);
  });

  it('a zero cell is corrected with a visible warning', async () => {
    const { stdout } = await lurk(['--counts', '0,20,5,15', '--measure', 'or', '--outcome-prevalence', 'rare']);
    expect(stdout).toMatch(/Warning: A cell of the table is zero, so 0\.5 was added to every cell/);
  });

  it('--file counts the table from two columns', async () => {
    const files = { 'people.csv': 'id;smoker;cancer\r\n1;yes;1\r\n2;yes;0\r\n3;no;1\r\n4;no;0\r\n5;no;0\r\n6;yes;1\r\n7;NA;1\r\n' };
    const json = await lurkJson(['--file', 'people.csv', '--exposure', 'smoker', '--outcome', 'cancer'], files);
    expect(json.table.counts).toEqual({ a: 2, b: 1, c: 1, d: 2 });
    expect(json.file.rowsMissing).toBe(1);
    expect(json.warnings.join(' ')).toMatch(/1 row was left out/);
    const named = await lurkJson(
      ['--file', 'people.csv', '--exposure', 'smoker', '--outcome', 'cancer', '--exposed-values', 'no', '--outcome-values', '0'],
      files,
    );
    expect(named.table.counts).toEqual({ a: 2, b: 1, c: 1, d: 2 });
  });
});

describe('lurk evalue: bad input exits 2 with one line naming the field', () => {
  it('an estimate outside its interval', async () => {
    expect(await errorLine(['--measure', 'rr', '--estimate', '9', '--lower', '1.8', '--upper', '8.7'])).toBe(
      'lurk evalue: --estimate: must lie within its interval (1.8 to 8.7)',
    );
  });

  it('reversed limits', async () => {
    expect(await errorLine(['--measure', 'rr', '--estimate', '3', '--lower', '8.7', '--upper', '1.8'])).toMatch(/^lurk evalue: --lower: must not exceed the upper limit/);
  });

  it('a non-positive ratio', async () => {
    expect(await errorLine(['--measure', 'hr', '--estimate', '-2', '--outcome-prevalence', 'rare'])).toMatch(/^lurk evalue: --estimate: must be greater than 0/);
    expect(await errorLine(['--measure', 'rr', '--estimate=0'])).toMatch(/^lurk evalue: --estimate: must be greater than 0/);
  });

  it('text where a number belongs', async () => {
    // The one number reader's message (the same as on the page).
    expect(await errorLine(['--measure', 'rr', '--estimate', 'two'])).toBe('lurk evalue: --estimate: must be a number, got "two"');
    expect(await errorLine(['--measure', 'rr', '--estimate', '1,200'])).toMatch(/^lurk evalue: --estimate: "1,200" could be 1\.2 \(decimal comma\) or 1200/);
  });

  it('a missing SD, a missing prevalence, a missing measure', async () => {
    expect(await errorLine(['--measure', 'md', '--estimate', '3'])).toBe('lurk evalue: --sd: is required');
    expect(await errorLine(['--measure', 'or', '--estimate', '3'])).toMatch(/^lurk evalue: --outcome-prevalence: is required for odds ratios/);
    expect(await errorLine(['--estimate', '3'])).toMatch(/^lurk evalue: --measure: is required/);
  });

  it('negative or non-integer counts, and the wrong number of counts', async () => {
    expect(await errorLine(['--counts', '-1,2,3,4'])).toBe('lurk evalue: --counts: count a (exposed, had the outcome) must be a whole number of people, 0 or more');
    expect(await errorLine(['--counts', '1,2.5,3,4'])).toMatch(/^lurk evalue: --counts: count b \(exposed, no outcome\) must be a whole number/);
    expect(await errorLine(['--counts', '1,2,3'])).toMatch(/^lurk evalue: --counts: needs four counts/);
    // Each count is read by the one number reader as a whole number, and the message names the cell.
    expect(await errorLine(['--counts', '1,x,3,4'])).toBe('lurk evalue: --counts: count b (exposed, no outcome) must be a number, got "x"');
  });

  it('counts may carry thousands separators when separated by ";" or spaces', async () => {
    const json = await lurkJson(['--counts', '1,200; 8,800; 600; 9,400']);
    expect(json.table.counts).toEqual({ a: 1200, b: 8800, c: 600, d: 9400 });
  });

  it('an empty CSV, an unknown column, a missing file', async () => {
    expect(await errorLine(['--file', 'empty.csv', '--exposure', 'e', '--outcome', 'o'], { 'empty.csv': '' })).toBe('lurk evalue: --file: the file is empty');
    expect(await errorLine(['--file', 'd.csv', '--exposure', 'x', '--outcome', 'o'], { 'd.csv': 'e,o\n1,0\n0,1\n' })).toBe(
      'lurk evalue: --exposure: no column named "x" (columns: e, o)',
    );
    expect(await errorLine(['--file', '/nonexistent/lurk.csv', '--exposure', 'e', '--outcome', 'o'])).toMatch(/^lurk evalue: --file: cannot read .*no such file/);
  });

  it('conflicting sources and options of another source', async () => {
    expect(await errorLine(['--estimate', '2', '--counts', '1,2,3,4'])).toMatch(/^lurk evalue: --counts: cannot be combined with --estimate/);
    expect(await errorLine(['--counts', '1,2,3,4', '--se', '0.2'])).toMatch(/^lurk evalue: --se: goes with --estimate/);
    expect(await errorLine(['--measure', 'rr', '--estimate', '2', '--wobble'])).toMatch(/^lurk evalue: --wobble: is not an option/);
    expect(await errorLine([])).toMatch(/^lurk evalue: --estimate: is required/);
  });

  it('a bad reference confounder', async () => {
    expect(await errorLine(['--measure', 'rr', '--estimate', '2', '--reference-confounders', 'age:0:2'])).toMatch(
      /^lurk evalue: --reference-confounders: item 1 \("age:0:2"\): the risk ratio with the exposure must be greater than 0/,
    );
  });
});

describe('lurk evalue --help', () => {
  it('prints the usage and exits 0', async () => {
    const { code, stdout } = await lurk(['--help']);
    expect(code).toBe(0);
    expect(stdout).toMatch(/--outcome-prevalence/);
    const overview = memoryIo();
    await runLurk(['--help'], overview);
    expect(overview.stdout).toMatch(/lurk evalue/);
  });
});

describe('the built command', () => {
  let cli: Awaited<ReturnType<typeof buildCliForTest>>;
  let outDir = '';
  beforeAll(async () => {
    cli = await buildCliForTest();
    outDir = dirname(cli.lurk);
  }, 120_000);
  afterAll(() => cli?.remove());

  it('node lurk.js evalue prints JSON and exits 0; bad input exits 2', async () => {
    const run = promisify(execFile);
    const { stdout } = await run('node', [join(outDir, 'lurk.js'), 'evalue', '--measure', 'rr', '--estimate', '3.9', '--lower', '1.8', '--upper', '8.7', '--json']);
    expect(JSON.parse(stdout).eValueInterval).toBe(3);
    const failed = await run('node', [join(outDir, 'lurk.js'), 'evalue', '--measure', 'rr', '--estimate', 'x']).catch((e) => e);
    expect(failed.code).toBe(2);
    expect(failed.stderr).toBe('lurk evalue: --estimate: must be a number, got "x"\n');
  });
});

describe('lurk evalue --sql / --summary: the rows stay in the database', () => {
  // Fictional cohort: text exposure (yes/no), numeric outcome, missing cells (NULL in the database, NA in the
  // file). Reference: the file path (--file) on the same rows.
  const n = 400;
  const exposure = Array.from({ length: n }, (_, i) => (i % 31 === 7 ? null : i % 3 === 0 ? 'yes' : 'no'));
  const outcome = Array.from({ length: n }, (_, i) => (i % 37 === 11 ? null : (i * 7919) % 10 < (i % 3 === 0 ? 4 : 2) ? 1 : 0));
  const csv = 'smoker,cancer\n' + exposure.map((e, i) => `${e ?? 'NA'},${outcome[i] ?? 'NA'}`).join('\n') + '\n';

  for (const [engineName, open] of [
    ['DuckDB', duckDbEngine],
    ['PostgreSQL', postgresEngine],
  ] as const) {
    describe(engineName, () => {
      let engine: SqlEngine;
      beforeAll(async () => {
        engine = await open();
        await engine.table(['cohort', 'people'], [
          { name: 'smoker', type: 'VARCHAR', values: exposure },
          { name: 'cancer', type: 'INTEGER', values: outcome },
        ]);
      }, 120_000);
      afterAll(async () => engine?.close());

      it('gives the same E-values as --file, for a risk ratio and an odds ratio, as JSON and as CSV', async () => {
        const { query } = await lurkJson(['--sql', 'cohort.people', '--exposure', 'smoker', '--outcome', 'cancer']);
        const row = await engine.row(query);
        const asCsv = Object.keys(row).join(',') + '\n' + Object.values(row).join(',') + '\n';
        for (const measure of [['--measure', 'rr'], ['--measure', 'or', '--outcome-prevalence', 'common']]) {
          const fromFile = await lurkJson(['--file', 'people.csv', '--exposure', 'smoker', '--outcome', 'cancer', ...measure], { 'people.csv': csv });
          for (const pasted of [JSON.stringify(row), asCsv]) {
            const fromSummary = await lurkJson(['--summary', pasted, ...measure]);
            expect(fromSummary.eValueEstimate).toBe(fromFile.eValueEstimate);
            expect(fromSummary.eValueInterval).toBe(fromFile.eValueInterval);
            expect(fromSummary.table ?? fromSummary.counts).toEqual(fromFile.table ?? fromFile.counts);
            expect(fromSummary.warnings.join(' ')).toMatch(/left out because the exposure or the outcome was missing/);
          }
        }
      });

      it('with the values that mean yes given', async () => {
        const { query } = await lurkJson(['--sql', 'cohort.people', '--exposure', 'smoker', '--outcome', 'cancer', '--exposed-values', 'no', '--outcome-values', '0']);
        const fromSummary = await lurkJson(['--summary', JSON.stringify(await engine.row(query))]);
        const fromFile = await lurkJson(['--file', 'p.csv', '--exposure', 'smoker', '--outcome', 'cancer', '--exposed-values', 'no', '--outcome-values', '0'], { 'p.csv': csv });
        expect(fromSummary.eValueEstimate).toBe(fromFile.eValueEstimate);
      });
    });
  }

  it('bad results: one line naming the column, or the other query', async () => {
    const good = { lurk_query: 'lurk-2x2-counts', a: 3, b: 7, c: 1, d: 9, rows_missing: 0 };
    expect(await errorLine(['--summary', JSON.stringify({ ...good, c: undefined })])).toMatch(/^lurk evalue: --summary: column c is missing/);
    expect(await errorLine(['--summary', JSON.stringify({ ...good, a: 'x' })])).toMatch(/--summary: column a must be a whole number/);
    expect(await errorLine(['--summary', JSON.stringify({ ...good, b: -2 })])).toMatch(/--summary: column b must be a whole number of 0 or more/);
    expect(await errorLine(['--summary', JSON.stringify({ lurk_query: 'lurk-pairs-signed-ranks', pairs: 4 })])).toMatch(/--summary: is the result of another query/);
    expect(await errorLine(['--summary', '{"n": 10, "m_1": 3}'])).toMatch(/--summary: looks like the result of another calculator/);
    expect(await errorLine(['--summary', 'no-such-result.csv'])).toMatch(/--summary: cannot read/);
    expect(await errorLine(['--sql', 't', '--exposure', 'e'])).toMatch(/--outcome: needs the name of the outcome column/);
    expect(await errorLine(['--summary', JSON.stringify(good), '--exposure', 'e'])).toMatch(/--exposure: goes with --file or --sql/);
  });
});
