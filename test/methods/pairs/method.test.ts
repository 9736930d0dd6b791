import { describe, expect, test } from 'vitest';
import { InputError } from '../../../src/core/inputProblem';
import { pairsMethod } from '../../../src/methods/pairs/method';
import { emptyPairsForm, normalisePairsForm, type PairsFormInputs } from '../../../src/methods/pairs/request';
import { analysePairsForm, needsWorker, planPairs, WORKER_DISCORDANT_PAIRS } from '../../../src/methods/pairs/runner';
import { pairsFromCsvText } from '../../../src/methods/pairs/pairsFromCsv';
import { expectClose } from '../../support/expectClose';
import { readReferenceJson } from '../../support/reference';
import { memoryCommandContext } from '../../support/memoryCommandContext';

const reference = readReferenceJson('rosenbaum.json');
const { command } = pairsMethod;

const contextOf = memoryCommandContext;

async function problemsOf(run: () => unknown): Promise<{ field: string; message: string }[]> {
  try {
    await run();
  } catch (error) {
    if (error instanceof InputError) return error.problems.map((p) => ({ field: p.field, message: p.message }));
    throw error;
  }
  return [];
}

const page = (patch: Partial<PairsFormInputs>) => normalisePairsForm({ ...emptyPairsForm(), ...patch });

describe('the command gives what the page gives for the same text', () => {
  test('discordant counts: the same sensitivity value on both surfaces', async () => {
    // Sign test with S = 12 of D = 15: R 4.2.2 pbinom reference, test/reference/rosenbaum.json (small_n15.sign_exact)
    const values = { discordant: '12,3', gamma: '1, 1.5, 2' };
    const report = await command.run(command.formFromOptions(values), values, contextOf({}));
    const onPage = planPairs(page({ source: 'discordant', treatedOnly: '12', controlOnly: '3', test: 'sign', gammas: '1, 1.5, 2' }), { file: null, fileText: null }, true);
    expect(onPage.kind).toBe('done');
    const pageResult = onPage.kind === 'done' ? onPage.outcome.result! : null;
    const json = report.json as { sensitivityValue: number; rows: { gamma: number; pUpper: number }[] };
    expectClose(json.sensitivityValue, reference.datasets.small_n15.sensitivity_value.sign_exact, { rel: 1e-8 });
    expect(json.sensitivityValue).toBe(pageResult!.sensitivityValue);
    expect(json.rows.map((r) => r.pUpper)).toEqual(pageResult!.rows.map((r) => r.pUpper));
  });

  test('a file with a difference column: the same result as the page reading the same text', async () => {
    const csv = 'd\n1.5\n-0.5\n2\n3.25\n0.75\n1\n-1\n2.5\n';
    const values = { file: 'p.csv', diff: 'd', alpha: '5%', gamma: '1;1,5;2' };
    const report = await command.run(command.formFromOptions(values), values, contextOf({ 'p.csv': csv }));
    const form = page({ source: 'file', columnsBy: 'difference', differenceColumn: 'd', alpha: '5%', gammas: '1;1,5;2' });
    const onPage = analysePairsForm(form, pairsFromCsvText(csv, { difference: 'd' }));
    expect(onPage.problems).toEqual([]);
    const json = report.json as { alpha: number; rows: { gamma: number }[]; pValue: number };
    expect(json.alpha).toBe(0.05);
    expect(json.rows.map((r) => r.gamma)).toEqual([1, 1.5, 2]);
    expect(json.pValue).toBe(onPage.result!.pValue);
  });

  test.each([
    [{ alpha: '1,5' }, 'alpha'],
    [{ alpha: 'five' }, 'alpha'],
    [{ gammas: '1, x' }, 'gammas'],
    [{ test: 'median' }, 'test'],
    [{ alternative: 'sideways' }, 'alternative'],
    [{ treatedOnly: '2.5' }, 'treatedOnly'],
  ] as const)('%j: the same message on the command line and the page', async (patch, field) => {
    const option: Record<string, string> = { alpha: 'alpha', gammas: 'gamma', test: 'test', alternative: 'alternative' };
    const counts = { treatedOnly: '12', controlOnly: '3', ...patch };
    const values: Record<string, string> = { discordant: `${counts.treatedOnly};${counts.controlOnly}` };
    for (const [key, text] of Object.entries(patch)) if (option[key]) values[option[key]] = text;
    const cli = await problemsOf(() => command.run(command.formFromOptions(values), values, contextOf({})));
    // The form as typed (not completed by normalise, which drops unknown choices of a saved form).
    const onPage = analysePairsForm(Object.freeze({ ...emptyPairsForm(), source: 'discordant' as const, ...counts }), null).problems;
    expect(cli[0].field).toBe(field);
    expect(cli[0].message).toBe(onPage.find((p) => p.field === field)!.message);
    expect(command.optionOf(field)).toBe(field === 'treatedOnly' ? '--discordant' : `--${option[field]}`);
  });

  test('whole counts take thousands separators on both surfaces ("1 200" is 1200)', async () => {
    const values = { discordant: '1 200; 1 000' };
    const report = await command.run(command.formFromOptions(values), values, contextOf({}));
    expect((report.json as { n: number }).n).toBe(2200);
  });

  test('choices are not case-sensitive', async () => {
    const values = { discordant: '12,3', test: 'SIGN', alternative: 'Greater', method: 'Exact' };
    const report = await command.run(command.formFromOptions(values), values, contextOf({}));
    expect((report.json as { tailMethod: string }).tailMethod).toBe('exact');
  });
});

describe('mixes of data sources are refused with one message naming both options', () => {
  test.each([
    [{ discordant: '12,3', diff: 'd' }, '--discordant', /give either --discordant or --diff, not both/],
    [{ discordant: '12,3', file: 'p.csv' }, '--discordant', /give either --discordant or --file, not both/],
    [{ discordant: '12,3', file: 'p.csv', treated: 't', control: 'c' }, '--discordant', /--discordant or --file and --treated and --control/],
    [{ file: 'p.csv', diff: 'd', treated: 't' }, '--diff', /give either --diff or --treated, not both/],
  ])('%j', async (values, field, message) => {
    const problems = await problemsOf(() => command.formFromOptions(values));
    expect(problems).toHaveLength(1);
    expect(problems[0].field).toBe(field);
    expect(problems[0].message).toMatch(message);
  });
});

describe('the runner', () => {
  test('large discordant counts are sent to the Web Worker; small ones are analysed at once', () => {
    const big = { kind: 'discordant' as const, treatedOnly: WORKER_DISCORDANT_PAIRS, controlOnly: 1 };
    expect(needsWorker({ data: big })).toBe(true);
    expect(needsWorker({ data: { kind: 'discordant', treatedOnly: 12, controlOnly: 3 } })).toBe(false);
    const plan = planPairs(page({ source: 'discordant', treatedOnly: '1,000,000', controlOnly: '5' }), { file: null, fileText: null }, true);
    expect(plan.kind).toBe('worker');
  });

  test('a file source without a chosen file asks for it again by name', () => {
    const plan = planPairs(page({ source: 'file', fileName: 'pairs.csv' }), { file: null, fileText: null }, false);
    expect(plan.kind === 'done' && plan.outcome.problems[0]).toMatchObject({ field: 'file', message: 'choose pairs.csv again' });
  });
});
