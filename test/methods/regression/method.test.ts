import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/inputProblem';
import { regressionMethod } from '../../../src/methods/regression/method';
import { emptyOvbForm, evaluateOvbForm } from '../../../src/methods/regression/request';
import type { FileSource } from '../../../src/methods/methodModule';
import { runLurk } from '../../../src/cli/main';
import { memoryIo } from '../../../src/cli/cliIo';
import { expectClose } from '../../support/expectClose';
import { readReferenceJson } from '../../support/reference';

const ovb = readReferenceJson('ovb.json');
const { command, form, workspace } = regressionMethod;
const noFiles = { open: (path: string): FileSource => ({ name: path, size: null, text: async () => '', bytes: () => [] as never }) };

async function problemsOf(values: Record<string, string>) {
  try {
    await command.run(command.formFromOptions(values), values, noFiles);
    return [];
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return error.problems.map((p) => `${p.field}:${p.code}:${p.message}`);
  }
}

async function lurk(args: string[]) {
  const io = memoryIo();
  const code = await runLurk(['ovb', ...args], io);
  return { code, out: io.stdout, err: io.stderr };
}

describe('the regression method module', () => {
  it('gives the published example from options as from the page form', async () => {
    // Cinelli & Hazlett 2020, JRSS-B 82(1):39–67: t = 4.18, df = 783 → RV 13.9%
    const values = { estimate: '4.18', se: '1', df: '783' };
    const report = await command.run(command.formFromOptions(values), values, noFiles);
    const page = evaluateOvbForm({ ...emptyOvbForm(), estimate: '4.18', se: '1', df: '783' }, null);
    expectClose((report.json as { rv: number }).rv, ovb.published_example.RV_1, { rel: 1e-12 });
    expect((report.json as { rv: number }).rv).toBe(page.result!.rv);
  });

  it('reads df, n and coefficients as whole numbers: "1,200" is 1200 degrees of freedom, not 1.2', async () => {
    const values = { estimate: '4.18', se: '1', df: '1,200', json: '' };
    const json = (await command.run(command.formFromOptions(values), values, noFiles)).json as { df: number };
    expect(json.df).toBe(1200);
    const byN = { estimate: '4.18', se: '1', n: '1 207', parameters: '7' };
    expect(((await command.run(command.formFromOptions(byN), byN, noFiles)).json as { df: number }).df).toBe(1200);
    const page = evaluateOvbForm({ ...emptyOvbForm(), estimate: '4.18', se: '1', df: '1,200' }, null);
    expect(page.result!.df).toBe(1200);
    const { out } = await lurk(['--estimate', '4.18', '--se', '1', '--df', '1,200', '--json']);
    expect(JSON.parse(out).df).toBe(1200);
    expect((await lurk(['--estimate', '4.18', '--se', '1', '--df', '783.5'])).err).toMatch(/^lurk ovb: --df: must be a whole number/);
  });

  it('reads partial R², q and α as fractions, also typed as percentages', async () => {
    const values = { estimate: '4.18', se: '1', df: '783', q: '50%', alpha: '10%', r2dz: '5%', r2yz: '0.1' };
    const json = (await command.run(command.formFromOptions(values), values, noFiles)).json as { q: number; alpha: number; scenario: { r2dz: number } };
    expect(json.q).toBe(0.5);
    expect(json.alpha).toBeCloseTo(0.1, 15);
    expect(json.scenario.r2dz).toBeCloseTo(0.05, 15);
  });

  it('gives the same message, named by option, as the page gives by field', async () => {
    const page = evaluateOvbForm({ ...emptyOvbForm(), estimate: '1,500', se: '1', df: '10' }, null).problems;
    const cli = await problemsOf({ estimate: '1,500', se: '1', df: '10' });
    expect(cli).toEqual(page.map((p) => `${p.field}:${p.code}:${p.message}`));
    expect(cli[0]).toMatch(/^estimate:ambiguous-number:/);
    expect(await problemsOf({ estimate: '1', se: '1', df: '10', direction: 'UP' })).toEqual(['direction:not-a-choice:must be one of toward-zero, away-from-zero, got "UP"']);
    expect(await problemsOf({ estimate: '1', se: '1', df: '10', direction: 'Away-From-Zero' })).toEqual([]);
    expect(command.optionOf('covariateTs[2].outcomeT')).toBe('--covariate-t');
    expect(command.optionOf('covariateR2s[0].outcomeR2')).toBe('--covariate-r2');
    expect(command.optionOf('summaryResult')).toBe('--summary');
    expect(command.optionOf('df')).toBe('--df');
  });

  it('refuses mixes of sources naming the option', () => {
    expect(() => command.formFromOptions({ estimate: '1', file: 'a.csv' })).toThrow(InputError);
    try {
      command.formFromOptions({ sql: 't', summary: 'r.csv' });
    } catch (error) {
      expect((error as InputError).problems[0].field).toBe('--sql');
    }
  });

  it('gives the summary-statistics query as a JSON object with --json', async () => {
    const { code, out } = await lurk(['--sql', 'visits', '--outcome', 'y', '--treatment', 'd', '--covariates', 'a,b', '--json']);
    expect(code).toBe(0);
    const json = JSON.parse(out);
    expect(json.query).toMatch(/SELECT/);
    expect(json).toMatchObject({ table: 'visits', outcome: 'y', treatment: 'd', covariates: ['a', 'b'] });
  });

  it('summarises, reads back and writes the statement and bottom line of a result', () => {
    const outcome = evaluateOvbForm({ ...emptyOvbForm(), estimate: '4.18', se: '1', df: '783' }, null);
    const summary = workspace.summarise(outcome)!;
    expect(summary.kind).toBe('regression');
    expect(workspace.readSummary(JSON.parse(JSON.stringify(summary)))).toEqual(summary);
    expect(workspace.readSummary({ kind: 'evalue' })).toBeNull();
    const study = { finding: '', exposure: 'smoking', outcome: 'weight', units: '', source: '' };
    const statement = workspace.statement(summary, study, () => '[1]')!;
    expect(statement.paragraph).toMatch(/robustness value is 13\.9%/);
    expect(statement.assumptions.length).toBeGreaterThan(0);
    expect(workspace.bottomLine(summary, study).howStrong[0]).toMatch(/13\.9%/);
    expect(workspace.needsData({ ...emptyOvbForm(), source: 'file' })).toBe(true);
    expect(form.normalise({ estimate: 3.9, df: 41 }).estimate).toBe('3.9');
  });
});
