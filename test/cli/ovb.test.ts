import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { duckDbEngine, postgresEngine, type SqlEngine, type TestColumn } from '../support/sqlEngines';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';
import { expectClose } from '../support/expectClose';
import { readReferenceJson, readReferenceText, referencePath } from '../support/reference';
import { buildCliForTest } from '../support/builtCli';

const ovb = readReferenceJson('ovb.json');
const swiss = ovb.swiss;
const swissPath = referencePath('swiss.csv');

async function lurk(args: string[], files: Record<string, string> = {}) {
  const io = memoryIo(files);
  const code = await runLurk(['ovb', ...args], io);
  return { code, out: io.stdout, err: io.stderr };
}

describe('lurk ovb', () => {
  it('reproduces the published example from reported numbers', async () => {
    // Cinelli & Hazlett 2020, JRSS-B 82(1):39–67: t = 4.18, df = 783 → 2.2%, 13.9%, 7.6%
    const { code, out } = await lurk(['--estimate', '4.18', '--se', '1', '--df', '783']);
    expect(code).toBe(0);
    expect(out).toMatch(/2\.2%/);
    expect(out).toMatch(/13\.9%/);
    expect(out).toMatch(/7\.6%/);
    expect(out).toMatch(/does not prove causation/);
    expect(out).not.toMatch(/NaN|undefined|Infinity/);
  });

  it('prints the specified JSON fields for reported numbers', async () => {
    const { code, out } = await lurk(['--estimate', '4.18', '--se', '1', '--n', '790', '--parameters', '7', '--json']);
    expect(code).toBe(0);
    const json = JSON.parse(out);
    for (const key of ['estimate', 'se', 't', 'df', 'partialR2', 'rv', 'rvAlpha']) expect(json).toHaveProperty(key);
    expect(json.df).toBe(783);
    // R 4.2.2 (ovb.json published_example)
    expectClose(json.rv, ovb.published_example.RV_1, { rel: 1e-12 });
    expectClose(json.rvAlpha, ovb.published_example['RV_1_0.05'], { rel: 1e-10 });
  });

  it('uses covariate t-statistics from a paper as benchmarks', async () => {
    const b = swiss.benchmarks.Agriculture;
    const { code, out } = await lurk([
      '--estimate', String(swiss.estimate), '--se', String(swiss.se), '--df', String(swiss.df),
      '--covariate-t', `Agriculture=${b.t_in_main_model}:${b.t_in_D_model},Catholic=${swiss.benchmarks.Catholic.t_in_main_model}`,
      '--json',
    ]);
    expect(code).toBe(0);
    const json = JSON.parse(out);
    const row = json.benchmarks.find((r: any) => r.covariate === 'Agriculture' && r.k === 1);
    // R 4.2.2 on datasets::swiss; bound formulas from memory, re-derived (ovb.json)
    expectClose(row.r2dz, b.bounds[0].r2dz, { rel: 1e-12 });
    expectClose(row.correctedEstimate, b.bounds[0].adjusted_estimate_toward_zero, { rel: 1e-11 });
    const catholic = json.benchmarks.find((r: any) => r.covariate === 'Catholic');
    expect(catholic.correctedEstimate).toBeNull();
    expect(catholic.unavailable).toMatch(/treatment/);
    const chosen = await lurk(['--estimate', '-0.87', '--se', '0.183', '--df', '41', '--covariate-t', 'a=2:1,b=1', '--benchmark', 'a', '--k', '1', '--json']);
    expect(JSON.parse(chosen.out).benchmarks.map((r: any) => r.covariate)).toEqual(['a']);
    // partial R²s given directly (R 4.2.2, ovb.json swiss: R²dxj and R²yxj of Agriculture)
    const byR2 = await lurk(['--estimate', String(swiss.estimate), '--se', String(swiss.se), '--df', '41', '--covariate-r2', `Agriculture=${b.R2yxj}:${100 * b.R2dxj}%`, '--json']);
    expectClose(JSON.parse(byR2.out).benchmarks[0].r2yz, b.bounds[0].r2yz, { rel: 1e-12 });
    expect((await lurk(['--estimate', '1', '--se', '1', '--df', '41', '--covariate-r2', 'a=1.5'])).err).toMatch(/^lurk ovb: --covariate-r2: must be a partial R² in \[0, 1\)/);
    const unknown = await lurk(['--estimate', '-0.87', '--se', '0.183', '--df', '41', '--covariate-t', 'a=2:1', '--benchmark', 'c']);
    expect(unknown.err).toMatch(/^lurk ovb: --benchmark: "c" is not among the --covariate-t entries \(a\)/);
  });

  it('analyses the swiss CSV like R lm, with benchmark bounds for k = 1, 2, 3', async () => {
    const { code, out, err } = await lurk(['--file', swissPath, '--outcome', 'Fertility', '--treatment', 'Education', '--json']);
    expect(err).toBe('');
    expect(code).toBe(0);
    const json = JSON.parse(out);
    // R 4.2.2: lm(Fertility ~ ., swiss) (ovb.json swiss)
    expectClose(json.estimate, swiss.estimate, { rel: 1e-9 });
    expectClose(json.se, swiss.se, { rel: 1e-9 });
    expectClose(json.t, swiss.t, { rel: 1e-9 });
    expect(json.df).toBe(41);
    expectClose(json.partialR2, swiss.R2yd, { rel: 1e-9 });
    expectClose(json.rv, swiss.RV_1, { rel: 1e-9 });
    expectClose(json.rvAlpha, swiss['RV_1_0.05'], { rel: 1e-9 });
    expect(json.benchmarks).toHaveLength(12);
    for (const row of json.benchmarks) {
      expect(Object.keys(row)).toEqual(expect.arrayContaining(['covariate', 'k', 'r2dz', 'r2yz', 'correctedEstimate', 'correctedSe', 'correctedT']));
      const ref = swiss.benchmarks[row.covariate].bounds.find((x: any) => x.kd === row.k);
      if (!ref.valid) {
        expect(row.r2dz).toBeNull();
        continue;
      }
      expectClose(row.r2dz, ref.r2dz, { rel: 1e-9 }, `${row.covariate} ${row.k}`);
      expectClose(row.r2yz, ref.r2yz, { rel: 1e-9 }, `${row.covariate} ${row.k}`);
      expectClose(row.correctedEstimate, ref.adjusted_estimate_toward_zero, { rel: 1e-9 });
      if (ref.adjusted_se > 0) expectClose(row.correctedSe, ref.adjusted_se, { rel: 1e-9 });
    }
  });

  it('takes covariates, benchmarks, k, q, α and a confounder strength', async () => {
    const { code, out } = await lurk([
      '--file', swissPath, '--outcome', 'Fertility', '--treatment', 'Education',
      '--covariates', 'Agriculture,Examination,Catholic,Infant.Mortality',
      '--benchmark', 'Agriculture,Catholic+Infant.Mortality', '--k', '0.5,1', '--q', '0.5', '--alpha', '0.1',
      '--r2dz', '0.1', '--r2yz', '0.2',
    ]);
    expect(code).toBe(0);
    expect(out).toMatch(/Catholic \+ Infant\.Mortality/);
    expect(out).toMatch(/reduce the estimate by 50%/);
    expect(out).toMatch(/With a confounder's partial R² of 10\.0% with the treatment/);
    expect(out).toMatch(/47 rows used of 47/);
    const json = JSON.parse((await lurk(['--file', swissPath, '--outcome', 'Fertility', '--treatment', 'Education', '--q', '0.5', '--json'])).out);
    // R 4.2.2 (ovb.json swiss RV_0.5, RV_0.5_0.05)
    expectClose(json.rv, swiss['RV_0.5'], { rel: 1e-9 });
    expectClose(json.rvAlpha, swiss['RV_0.5_0.05'], { rel: 1e-9 });
  });

  it('prints the summary-statistics query and reads its result back', async () => {
    const args = ['--outcome', 'Fertility', '--treatment', 'Education', '--covariates', 'Agriculture,Examination,Catholic,Infant.Mortality'];
    const sql = await lurk(['--sql', 'swiss', ...args]);
    expect(sql.code).toBe(0);
    expect(sql.out).toMatch(/SELECT/);
    expect(sql.out).toMatch(/"Education"/);
    // the query's result computed here from the CSV (what a database would return)
    const { readCsvText } = await import('../../src/data/csv');
    const table = readCsvText((await import('node:fs')).readFileSync(swissPath, 'utf8'));
    const vars = ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality', 'Education', 'Fertility'];
    const cols = vars.map((v) => table.rows.map((r) => Number(r[table.columns.indexOf(v)])));
    const row: Record<string, number> = { n: table.rows.length };
    cols.forEach((c, i) => (row[`s_${i + 1}`] = c.reduce((a, b) => a + b, 0)));
    for (let i = 0; i < vars.length; i++) for (let j = i; j < vars.length; j++) row[`c_${i + 1}_${j + 1}`] = cols[i].reduce((a, x, r) => a + x * cols[j][r], 0);
    const fromJson = await lurk(['--summary', 'result.json', ...args, '--json'], { 'result.json': JSON.stringify(row) });
    expect(fromJson.err).toBe('');
    const json = JSON.parse(fromJson.out);
    // R 4.2.2 (ovb.json swiss); the cross-product path is less accurate than QR on raw rows
    expectClose(json.estimate, swiss.estimate, { rel: 1e-7 });
    expectClose(json.rv, swiss.RV_1, { rel: 1e-7 });
    const csv = Object.keys(row).join(',') + '\n' + Object.values(row).join(',') + '\n';
    const fromCsv = await lurk(['--summary', 'result.csv', ...args, '--json'], { 'result.csv': csv });
    expectClose(JSON.parse(fromCsv.out).rv, swiss.RV_1, { rel: 1e-7 });
  });

  it('exits 2 with one line naming the option for bad input', async () => {
    const cases: [string[], RegExp][] = [
      [['--estimate', '1', '--se', '1', '--df', '1'], /^lurk ovb: --df: must be greater than 1/],
      [['--estimate', '1', '--se', '0', '--df', '10'], /^lurk ovb: --se: /],
      [['--estimate', 'abc', '--se', '1', '--df', '10'], /^lurk ovb: --estimate: must be a number, got "abc"/],
      [['--se', '1', '--df', '10'], /^lurk ovb: --estimate: is required/],
      [['--estimate', '1', '--se', '1', '--df', '10', '--r2dz', '1', '--r2yz', '0.1'], /^lurk ovb: --confounder-treatment-r2: must be a partial R² in \[0, 1\)/],
      [['--estimate', '1', '--se', '1', '--df', '10', '--r2yz', '0.1'], /^lurk ovb: --confounder-treatment-r2: is needed/],
      [['--estimate', '1', '--se', '1', '--df', '10', '--k', '1,-1'], /^lurk ovb: --times: must be greater than 0/],
      [['--estimate', '1', '--se', '1', '--df', '10', '--direction', 'up'], /^lurk ovb: --direction: must be one of/],
      [['--estimate', '1', '--se', '1', '--df', '10', '--file', swissPath], /^lurk ovb: --estimate: gives reported numbers/],
      [['--estimate', '1', '--se', '1', '--df', '10', '--covariate-t', 'age'], /^lurk ovb: --covariate-t: item 1/],
      [['--file', swissPath, '--outcome', 'Fertility', '--treatment', 'Fertility'], /^lurk ovb: --treatment: .*outcome/],
      [['--file', swissPath, '--outcome', 'Fertility', '--treatment', 'Education', '--covariates', 'Agriculture,Agriculture'], /^lurk ovb: --covariates: .*twice/],
      [['--file', swissPath, '--outcome', 'Fertility', '--treatment', 'Nope'], /^lurk ovb: --treatment: there is no column named "Nope"/],
      [['--file', swissPath, '--outcome', 'Fertility', '--treatment', 'Education', '--benchmark', 'Age'], /^lurk ovb: --benchmark: "Age" is not one of the covariates/],
      [['--file', 'missing.csv', '--outcome', 'a', '--treatment', 'b'], /^lurk ovb: --file: cannot read "missing.csv"/],
      [['--file', 'const.csv', '--outcome', 'y', '--treatment', 'd'], /^lurk ovb: --treatment: "d" is constant/],
      [['--file', 'text.csv', '--outcome', 'y', '--treatment', 'd'], /^lurk ovb: /],
      [['--file', 'collinear.csv', '--outcome', 'y', '--treatment', 'd'], /^lurk ovb: --covariates: "z" is a linear combination of "x"/],
      [['--file', 'short.csv', '--outcome', 'y', '--treatment', 'd'], /^lurk ovb: --file: needs more rows than coefficients/],
      [['--file', 'df1.csv', '--outcome', 'y', '--treatment', 'd'], /^lurk ovb: --file: has too few complete rows for this model: 4 rows and 3 coefficients leave 1/],
      [['--wrong'], /^lurk ovb: --wrong: is not an option/],
    ];
    const files = {
      'const.csv': 'y,d,x\n1,2,3\n2,2,1\n4,2,7\n3,2,2\n5,2,9\n',
      'text.csv': 'y,d\n1,2\n2,x\n3,4\n5,1\n',
      'collinear.csv': 'y,d,x,z\n1,2,3,6\n2,1,1,2\n4,3,7,14\n3,5,2,4\n5,2,9,18\n6,1,1,2\n',
      'short.csv': 'y,d,x\n1,2,3\n2,1,1\n4,3,7\n',
      'df1.csv': 'y,d,x\n1,2,3\n2,1,1\n4,3,7\n3,5,2\n',
    };
    for (const [args, message] of cases) {
      const { code, err, out } = await lurk(args, files);
      expect(code, args.join(' ')).toBe(2);
      expect(out).toBe('');
      expect(err.trim().split('\n')).toHaveLength(1);
      expect(err, args.join(' ')).toMatch(message);
    }
  });

  it('reads awkward CSVs the same way: BOM, CRLF, semicolons with decimal commas, quoted headers, NA rows, huge magnitudes', async () => {
    const text = (await import('node:fs')).readFileSync(swissPath, 'utf8').trim();
    const [header, ...rows] = text.split(/\r?\n/);
    const reference = JSON.parse((await lurk(['--file', 'plain.csv', '--outcome', 'Fertility', '--treatment', 'Education', '--json'], { 'plain.csv': text })).out);
    const semicolons = [header.replace(/,/g, ';'), ...rows.map((r) => r.replace(/,/g, ';').replace(/\./g, ','))].join('\r\n');
    const withNa = [header, ...rows, '"NA",1,2,3,4,5', '70,,10,5,50,20'].join('\n');
    const huge = [header, ...rows.map((r) => r.split(',').map((v, i) => (i === 0 ? String(Number(v) * 1e150) : v)).join(','))].join('\n');
    const cases: Record<string, string> = { 'bom.csv': '\uFEFF' + text.replace(/\n/g, '\r\n'), 'semi.csv': semicolons, 'na.csv': withNa, 'huge.csv': huge };
    for (const name of ['bom.csv', 'semi.csv', 'na.csv', 'huge.csv']) {
      const { code, out, err } = await lurk(['--file', name, '--outcome', 'Fertility', '--treatment', 'Education', '--json'], cases);
      expect(err, name).toBe('');
      expect(code, name).toBe(0);
      const json = JSON.parse(out);
      // the robustness values are scale-free: multiplying the outcome by 1e150 leaves them unchanged
      expectClose(json.rv, reference.rv, { rel: 1e-9 }, name);
      expectClose(json.rvAlpha, reference.rvAlpha, { rel: 1e-9 }, name);
      if (name === 'na.csv') expect([json.rowsRead, json.rowsUsed, json.rowsDropped]).toEqual([49, 47, 2]);
    }
    const report = (await lurk(['--file', 'na.csv', '--outcome', 'Fertility', '--treatment', 'Education'], cases)).out;
    expect(report).toMatch(/47 rows used of 49 \(2 dropped for a missing value\)/);
  });

  it('dummy-codes a text covariate and names its reference level; a bad cell is named by column and row', async () => {
    const text = 'y,d,region\n1,2,north\n2,1,south\n4,3,east\n3,5,north\n5,2,south\n6,1,east\n2,4,north\n';
    const { code, out } = await lurk(['--file', 'r.csv', '--outcome', 'y', '--treatment', 'd'], { 'r.csv': text });
    expect(code).toBe(0);
    expect(out).toMatch(/region is categorical: reference level "east"/);
    expect(out).toMatch(/region  /); // the group of its dummies is one benchmark
    const bad = await lurk(['--file', 'b.csv', '--outcome', 'y', '--treatment', 'd'], { 'b.csv': 'y,d,x\n1,2,3\n2,1,1\n4,3,seven\n3,5,2\n5,2,9\n6,1,1\n' });
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^lurk ovb: /);
    expect(bad.err.split('\n').filter(Boolean)).toHaveLength(1);
  });

  it('prints a plot as SVG', async () => {
    for (const plot of ['estimate', 't', 'extreme']) {
      const { code, out } = await lurk(['--file', swissPath, '--outcome', 'Fertility', '--treatment', 'Education', '--svg', plot]);
      expect(code).toBe(0);
      expect(out.startsWith('<svg')).toBe(true);
      expect(out).not.toMatch(/NaN|undefined|Infinity/);
    }
    expect((await lurk(['--estimate', '1', '--se', '1', '--df', '9', '--svg', 'pie'])).err).toMatch(/--svg: must be one of estimate, t, extreme/);
  });

  it('prints help', async () => {
    const { code, out } = await lurk(['--help']);
    expect(code).toBe(0);
    expect(out).toMatch(/--covariate-t/);
  });

  it('runs as the built command', async () => {
    // Built from the current sources into a folder of its own (a stale or shared dist/ would test other code).
    const cli = await buildCliForTest();
    const built = cli.lurk;
    expect(existsSync(built)).toBe(true);
    const result = spawnSync('node', [built, 'ovb', '--estimate', '-4.18', '--se', '1', '--df', '783', '--json'], { encoding: 'utf8' });
    expect(result.status).toBe(0);
    expect(JSON.parse(result.stdout).rv).toBeCloseTo(0.1386, 4);
    const bad = spawnSync('node', [built, 'ovb', '--estimate', '1', '--se', '1', '--df', '0'], { encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--df/);
    cli.remove();
  }, 120_000);
});

describe('lurk ovb --sql / --summary with categorical covariates: levels query, summary query, analysis', () => {
  // Data: test/reference/swiss_regions.csv (R's swiss with a fictional region), plus a fictional numeric zone
  // code and one more missing region (missing: NULL in the database, empty or NA in the file). Reference: the CSV path (--file) on the same rows.
  const lines = readReferenceText('swiss_regions.csv').trim().split(/\r?\n/);
  const header = lines[0].split(',');
  const rows = lines.slice(1).map((l) => l.split(','));
  const zone = rows.map((_, i) => (i * 7) % 3 + 1);
  rows[5][header.indexOf('region')] = 'NA';
  const csv = [[...header, 'zone'].join(','), ...rows.map((r, i) => [...r, zone[i]].join(','))].join('\n') + '\n';
  const columns: TestColumn[] = [
    ...header.map((name, j): TestColumn =>
      name === 'region'
        ? { name, type: 'VARCHAR', values: rows.map((r) => (r[j] === 'NA' || r[j] === '' ? null : r[j])) }
        : { name, type: 'DOUBLE PRECISION', values: rows.map((r) => Number(r[j])) },
    ),
    { name: 'zone', type: 'INTEGER', values: zone },
  ];
  const model = ['--outcome', 'Fertility', '--treatment', 'Education', '--covariates', 'Agriculture,region,Catholic,zone', '--categorical', 'region,zone'];

  for (const [engineName, open] of [
    ['DuckDB', duckDbEngine],
    ['PostgreSQL', postgresEngine],
  ] as const) {
    describe(engineName, () => {
      let engine: SqlEngine;
      beforeAll(async () => {
        engine = await open();
        await engine.table(['survey', 'swiss regions'], columns);
      }, 120_000);
      afterAll(async () => engine?.close());

      it('equals the CSV path (estimate, se, robustness values, benchmark bounds) to 1e-9, from a schema-qualified table', async () => {
        const table = 'survey."swiss regions"';
        const first = await lurk(['--sql', table, ...model, '--json']);
        expect(first.err).toBe('');
        const levelsQuery = JSON.parse(first.out);
        expect(levelsQuery.stage).toBe('levels');
        expect(levelsQuery.query).toMatch(/SELECT DISTINCT/);
        const levelRows = await engine.rows(levelsQuery.query);
        const levelsCsv = 'lurk_query,column_name,level\n' + levelRows.map((r) => `${r.lurk_query},${r.column_name},${r.level}`).join('\n') + '\n';
        const second = await lurk(['--sql', table, ...model, '--levels', levelsCsv, '--json']);
        expect(second.err).toBe('');
        const summaryQuery = JSON.parse(second.out);
        expect(summaryQuery.stage).toBe('summary');
        const row = await engine.row(summaryQuery.query);
        const fromSummary = await lurk(['--summary', JSON.stringify(row), ...model, '--json']);
        expect(fromSummary.err).toBe('');
        const fromFile = await lurk(['--file', 'swiss.csv', ...model, '--json'], { 'swiss.csv': csv });
        expect(fromFile.err).toBe('');
        const s = JSON.parse(fromSummary.out);
        const f = JSON.parse(fromFile.out);
        for (const key of ['estimate', 'se', 'rv', 'rvAlpha', 'partialR2']) expectClose(s[key], f[key], { rel: 1e-9 }, key);
        expect(s.df).toBe(f.df);
        expect(s.benchmarks.map((b: any) => b.covariate)).toEqual(f.benchmarks.map((b: any) => b.covariate));
        s.benchmarks.forEach((b: any, i: number) => {
          expectClose(b.r2dz, f.benchmarks[i].r2dz, { rel: 1e-9, abs: 1e-15 });
          expectClose(b.r2yz, f.benchmarks[i].r2yz, { rel: 1e-9, abs: 1e-15 });
        });
        // The levels typed as a JSON object give the same summary query.
        const typed = JSON.stringify({ region: [...new Set(levelRows.filter((r) => r.column_name === 'region').map((r) => r.level))], zone: ['3', '1', '2'] });
        expect(JSON.parse((await lurk(['--sql', table, ...model, '--levels', typed, '--json'])).out).query).toBe(summaryQuery.query);
      });
    });
  }

  it('refuses levels of another query, one level, and a categorical column that is not a covariate', async () => {
    const base = ['--sql', 't', '--outcome', 'y', '--treatment', 'd', '--covariates', 'a,r', '--categorical', 'r'];
    expect((await lurk([...base, '--levels', '{"r": ["x"]}'])).err).toMatch(/--levels: "r" has only one level/);
    expect((await lurk([...base, '--levels', 'lurk_query,column_name,level\nlurk-2x2-counts,r,x\n'])).err).toMatch(/--levels: is the result of another query/);
    expect((await lurk(['--sql', 't', '--outcome', 'y', '--treatment', 'd', '--covariates', 'a', '--categorical', 'd'])).err).toMatch(/--categorical: "d" is not among the covariate columns/);
    const pairsRow = JSON.stringify({ lurk_query: 'lurk-pairs-signed-ranks', pairs: 3 });
    expect((await lurk(['--summary', pairsRow, '--outcome', 'y', '--treatment', 'd', '--covariates', 'a'])).err).toMatch(/--summary: is the result of another calculator's query/);
  });
});

describe('lurk ovb: self-explaining option names, with the earlier ones kept for one release', () => {
  const base = ['--estimate', '4.18', '--se', '1', '--df', '783', '--covariate-t', 'age=2:1.5'];
  it('--times, --fraction and --confounder-*-r2 give what --k, --q, --r2dz and --r2yz gave', async () => {
    // Cinelli & Hazlett 2020 published example (t = 4.18, df = 783) as the reported numbers.
    const now = JSON.parse((await lurk([...base, '--times', '1,2', '--fraction', '0.5', '--confounder-treatment-r2', '0.05', '--confounder-outcome-r2', '0.1', '--json'])).out);
    const before = JSON.parse((await lurk([...base, '--k', '1,2', '--q', '0.5', '--r2dz', '0.05', '--r2yz', '0.1', '--json'])).out);
    expect(now).toEqual(before);
  });
  it('an earlier name prints a note; both names at once are refused', async () => {
    expect((await lurk([...base, '--k', '1'])).out).toMatch(/Note: --k is the earlier name of --times/);
    const both = await lurk([...base, '--k', '1', '--times', '2']);
    expect(both.code).toBe(2);
    expect(both.err).toMatch(/^lurk ovb: --k: is the earlier name of --times: give one of them/);
  });
});
