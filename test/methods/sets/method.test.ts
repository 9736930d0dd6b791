import { describe, expect, test } from 'vitest';
import { InputError } from '../../../src/core/inputProblem';
import { methodByCommand, methodById } from '../../../src/methods/registry';
import { setsFormFromOptions, setsMethod, setsOptionOf } from '../../../src/methods/sets/method';
import { emptySetsForm, normaliseSetsForm, type SetsFormInputs } from '../../../src/methods/sets/request';
import { planSets } from '../../../src/methods/sets/runner';
import { expectClose } from '../../support/expectClose';
import { matchedSetsCsv } from '../../support/matchedSetsCsv';
import { readReferenceJson } from '../../support/reference';
import { memoryCommandContext } from '../../support/memoryCommandContext';

const reference = readReferenceJson('matched_sets.json');
const dsD = reference.continuous.find((d: { name: string }) => d.name === 'fictional_d_large_effect');
const { command } = setsMethod;

const contextOf = memoryCommandContext;

async function problemsOf(run: () => unknown): Promise<{ field: string; option: string; message: string }[]> {
  try {
    await run();
  } catch (error) {
    if (error instanceof InputError) return error.problems.map((p) => ({ field: p.field, option: setsOptionOf(p.field), message: p.message }));
    throw error;
  }
  return [];
}

const page = (patch: Partial<SetsFormInputs>) => normaliseSetsForm({ ...emptySetsForm(), ...patch });
const csv = matchedSetsCsv(dsD, { header: ['stratum', 'z', 'score'] });

/** The page's outcome for a form and the text of its file. */
function onPage(form: SetsFormInputs, text: string) {
  const plan = planSets(form, { file: new Blob([text]), fileText: text }, true);
  if (plan.kind !== 'done') throw new Error('expected an outcome at once');
  return plan.outcome;
}

describe('registry', () => {
  test('the method is found by its id and its command', () => {
    expect(methodById('sets')).toBe(setsMethod);
    expect(methodByCommand('sets')).toBe(setsMethod);
    expect(setsMethod.view.element).toBe('lurk-sets');
    expect(setsMethod.title).toBe('Matched sets');
  });
});

describe('the command gives what the page gives for the same text', () => {
  test('fictional_d: the same numbers on both surfaces, and those of the R base reference', async () => {
    const values = { file: 'sets.csv', set: 'stratum', treated: 'z', outcome: 'score', gamma: '1,1.25,1.5,2,3' };
    const form = command.formFromOptions(values);
    expect(form).toEqual(page({ fileName: 'sets.csv', setColumn: 'stratum', treatedColumn: 'z', outcomeColumn: 'score', gammas: '1,1.25,1.5,2,3' }));
    const report = await command.run(form, values, contextOf({ 'sets.csv': csv }));
    const json = report.json as { sensitivityValue: number; rows: { gamma: number; pUpper: number }[] };
    const result = onPage(form, csv).result!;
    expect(json.sensitivityValue).toBe(result.sensitivityValue);
    expect(json.rows.map((r) => r.pUpper)).toEqual(result.rows.map((r) => r.pUpper));
    // test/reference/matched_sets.json (R 4.2.2, base only; generator test/reference/generators/matched_sets.R)
    expectClose(json.sensitivityValue, dsD.sensitivity_value, { rel: 1e-6 });
    dsD.rows.forEach((row: { p_upper: number }, i: number) => expectClose(json.rows[i].pUpper, row.p_upper, { rel: 1e-8 }));
  });

  test('every option fills its form field as typed; options not given keep the page’s defaults', () => {
    const form = setsFormFromOptions({ file: 'f.csv', set: 's', treated: 't', outcome: 'y', gamma: '1;2', alpha: '5%', alternative: 'less', trim: '1.5', 'outcome-kind': 'binary', tail: 'normal' });
    expect(form).toEqual({ fileName: 'f.csv', setColumn: 's', treatedColumn: 't', outcomeColumn: 'y', gammas: '1;2', alpha: '5%', alternative: 'less', trim: '1.5', outcomeKind: 'binary', tail: 'normal' });
    expect(setsFormFromOptions({ file: 'f.csv' })).toEqual({ ...emptySetsForm(), fileName: 'f.csv' });
  });

  test('bad settings: the same messages on both surfaces, each named by its option on the command line', async () => {
    const bad = { alpha: 'abc', trim: '0', gammas: '1, 0.5', alternative: 'up' };
    const values = { file: 'sets.csv', set: 'stratum', treated: 'z', outcome: 'score', alpha: bad.alpha, trim: bad.trim, gamma: bad.gammas, alternative: bad.alternative };
    const cli = await problemsOf(() => command.run(command.formFromOptions(values), values, contextOf({ 'sets.csv': csv })));
    // The page's selects cannot hold an unknown choice, but a form restored without normalising could: read it as is.
    const pageProblems = onPage({ ...emptySetsForm(), setColumn: 'stratum', treatedColumn: 'z', outcomeColumn: 'score', fileName: 'sets.csv', ...bad }, csv).problems;
    expect(cli.map((p) => p.message)).toEqual(pageProblems.map((p) => p.message));
    expect(cli.map((p) => p.option)).toEqual(['--alternative', '--alpha', '--trim', '--gamma']);
  });

  test('a bad file: the same problem on both surfaces, named --outcome on the command line', async () => {
    const text = 'stratum,z,score\na,1,5\na,0,lots\nb,1,4\nb,0,2\n';
    const values = { file: 'sets.csv', set: 'stratum', treated: 'z', outcome: 'score' };
    const cli = await problemsOf(() => command.run(command.formFromOptions(values), values, contextOf({ 'sets.csv': text })));
    const pageProblems = onPage(command.formFromOptions(values), text).problems;
    expect(cli).toEqual([{ field: 'outcomeColumn', option: '--outcome', message: 'column "score" has a value that is not a number (row 2 "lots"); leave a missing outcome empty or write NA' }]);
    expect(pageProblems.map((p) => p.message)).toEqual(cli.map((p) => p.message));
  });

  test('a set without a control is named on both surfaces', async () => {
    const text = 'stratum,z,score\na,1,5\na,0,3\nb,1,4\nc,1,7\nc,0,1\n';
    const values = { file: 'sets.csv', set: 'stratum', treated: 'z', outcome: 'score' };
    const cli = await problemsOf(() => command.run(command.formFromOptions(values), values, contextOf({ 'sets.csv': text })));
    expect(cli.map((p) => `${p.option}: ${p.message}`)).toEqual([expect.stringMatching(/^--treated: 1 set has no control \(set b\)/)]);
    expect(onPage(command.formFromOptions(values), text).problems.map((p) => p.message)).toEqual(cli.map((p) => p.message));
  });

  test('no file, a missing file, and columns not given are named', async () => {
    expect((await problemsOf(() => command.run(command.formFromOptions({ set: 's', treated: 't', outcome: 'y' }), {}, contextOf({})))).map((p) => p.option)).toEqual(['--file']);
    const missing = await problemsOf(() => command.run(command.formFromOptions({ file: 'nope.csv', set: 's', treated: 't', outcome: 'y' }), {}, contextOf({})));
    expect(missing).toEqual([{ field: 'file', option: '--file', message: '"nope.csv": no such file' }]);
    const columns = await problemsOf(() => command.run(command.formFromOptions({ file: 'sets.csv' }), {}, contextOf({ 'sets.csv': csv })));
    expect(columns.map((p) => p.option)).toEqual(['--set', '--treated', '--outcome']);
  });
});

describe('workspace', () => {
  test('a file’s rows are never saved, so the saved summary stands in', () => {
    expect(setsMethod.workspace.needsData(emptySetsForm())).toBe(true);
    expect(setsMethod.workspace.summaryFromForm(emptySetsForm())).toBeNull();
    expect(setsMethod.form.rawDataFields).toEqual([]);
  });
});
