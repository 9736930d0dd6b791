import { describe, expect, it } from 'vitest';
import { InputError, type InputProblem } from '../../../src/core/inputProblem';
import { readCsvText } from '../../../src/data/csv';
import { evalueMethod } from '../../../src/methods/evalue/method';
import { emptyEValueForm, evaluateEValueForm, type EValueFormInputs } from '../../../src/methods/evalue/request';
import type { CommandContext, OptionValues } from '../../../src/methods/methodModule';
import { expectClose } from '../../support/expectClose';
import { readReferenceJson } from '../../support/reference';

const { command } = evalueMethod;

/** A command context whose files are the given texts. */
function filesContext(files: Record<string, string> = {}): CommandContext {
  return {
    open: (path) => ({
      name: path,
      size: null,
      text: async () => {
        if (!(path in files)) throw Object.assign(new Error('missing'), { code: 'ENOENT' });
        return files[path];
      },
      // The command streams a file: its bytes, or a rejected read for a missing file.
      bytes: () =>
        (async function* () {
          if (!(path in files)) throw Object.assign(new Error('missing'), { code: 'ENOENT' });
          yield new TextEncoder().encode(files[path]);
        })(),
    }),
  };
}

async function run(values: OptionValues, files: Record<string, string> = {}) {
  return command.run(command.formFromOptions(values), values, filesContext(files));
}

async function problemsOf(values: OptionValues, files: Record<string, string> = {}): Promise<readonly InputProblem[]> {
  try {
    await run(values, files);
  } catch (error) {
    if (error instanceof InputError) return error.problems;
    throw error;
  }
  throw new Error('expected bad input');
}

const page = (changes: Partial<EValueFormInputs>) => evaluateEValueForm({ ...emptyEValueForm(), ...changes }, null);

describe('evalueMethod.command: published example', () => {
  it('RR 3.9 (1.8 to 8.7) gives the E-values 7.26 and 3.00, as on the page', async () => {
    // VanderWeele & Ding 2017, Ann Intern Med 167:268–274: E-values 7.26 and 3.0
    const report = await run({ measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' });
    const json = report.json as { eValueEstimate: number; eValueInterval: number; source: string };
    expectClose(json.eValueEstimate, 7.26, { abs: 0.005 });
    expect(json.eValueInterval).toBe(3);
    expect(json.source).toBe('reported');
    expect(report.text).toMatch(/E-value, estimate +7\.26/);
    const onPage = page({ measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' });
    expect(json.eValueEstimate).toBe(onPage.result?.eValueEstimate);
  });
});

describe('evalueMethod.command: the same text gives the same value or message as the page', () => {
  it.each([
    ['a decimal comma', '3,9', null],
    ['an ambiguous grouping', '1,200', 'ambiguous-number'],
    ['a word', 'two', 'not-a-number'],
    ['a Unicode minus', '−2', 'not-positive'],
  ])('%s in the estimate', async (_what, text, code) => {
    const onPage = page({ measure: 'rr', estimate: text });
    if (code === null) {
      const report = await run({ measure: 'rr', estimate: text });
      expect((report.json as { estimate: number }).estimate).toBe(onPage.result?.input.estimate);
      return;
    }
    const problems = await problemsOf({ measure: 'rr', estimate: text });
    expect(problems[0]).toEqual(onPage.problems[0]);
    expect(problems[0].code).toBe(code);
  });

  it('the level as "95", "95%" or "0.95", and choices in any case', async () => {
    // VanderWeele & Ding 2017 example again, with the level typed three ways
    for (const level of ['95', '95%', '0.95']) {
      const report = await run({ measure: 'RR', estimate: '3.9', lower: '1.8', upper: '8.7', level });
      expect((report.json as { level: number }).level).toBe(0.95);
    }
    const or = await run({ measure: 'or', estimate: '2.5', lower: '1.6', upper: '3.9', 'outcome-prevalence': 'Common' });
    expect((or.json as { conversion: { kind: string } }).conversion.kind).toBe('odds-ratio-square-root');
  });

  it('counts: whole numbers with thousands separators, and the same cell problems as the page', async () => {
    // hand computation: (1200/10000)/(600/10000) = 2
    const report = await run({ counts: '1 200; 8 800; 600; 9 400' });
    expectClose((report.json as { riskRatioScale: { estimate: number } }).riskRatioScale.estimate, 2, { rel: 1e-14 });
    const problems = await problemsOf({ counts: '-1,2.5,3,4' });
    const onPage = page({ source: 'counts', counts: { a: '-1', b: '2.5', c: '3', d: '4' } });
    expect(problems.map((p) => [p.field, p.code])).toEqual(onPage.problems.map((p) => [p.field, p.code]));
    // On the command line the message names the cell, as one option holds all four.
    expect(problems[0].message).toBe(`count b (exposed, no outcome) ${onPage.problems[0].message}`);
  });

  it('reads a file through the context, with the page reader', async () => {
    const csv = 'smoker,cancer\n1,1\n1,1\n1,0\n0,1\n0,0\n0,0\nNA,1\n';
    const report = await run({ file: 'people.csv', exposure: 'smoker', outcome: 'cancer' }, { 'people.csv': csv });
    const onPage = evaluateEValueForm({ ...emptyEValueForm(), source: 'file', exposureColumn: 'smoker', outcomeColumn: 'cancer' }, readCsvText(csv, 'file'));
    expect((report.json as { table: { counts: unknown } }).table.counts).toEqual(onPage.csv?.counts);
    expect((await problemsOf({ file: 'gone.csv', exposure: 'e', outcome: 'o' }))[0]).toMatchObject({ field: 'file', message: 'cannot read "gone.csv": no such file' });
  });
});

describe('evalueMethod.command: options', () => {
  it('fills the form text unread', () => {
    const form = command.formFromOptions({ measure: 'hr', estimate: ' 1,5 ', se: '0.1', 'reference-confounders': 'age:2:3' });
    expect(form).toMatchObject({ source: 'reported', measure: 'hr', estimate: ' 1,5 ', intervalBy: 'se', se: '0.1' });
    expect(form.confounders).toEqual([{ name: 'age', rrExposure: '2', rrOutcome: '3' }]);
  });

  it('refuses two sources, options of another source and a malformed list, naming the option', () => {
    const refused = (values: OptionValues) => {
      try {
        command.formFromOptions(values);
      } catch (error) {
        if (error instanceof InputError) return error.problems[0];
        throw error;
      }
      throw new Error('expected a refusal');
    };
    expect(refused({ estimate: '2', counts: '1,2,3,4' }).field).toBe('--counts');
    expect(refused({ counts: '1,2,3,4', se: '0.2' }).field).toBe('--se');
    expect(refused({ estimate: '2', se: '0.2', lower: '1' }).field).toBe('--se');
    expect(refused({ counts: '1,2,3' }).message).toMatch(/needs four counts/);
    expect(refused({ estimate: '2', 'reference-confounders': 'age:2' }).message).toMatch(/item 1 \("age:2"\)/);
  });

  it('names the option of every form field', () => {
    expect(command.optionOf('counts.a')).toBe('--counts');
    expect(command.optionOf('estimate')).toBe('--estimate');
    expect(command.optionOf('outcomePrevalence')).toBe('--outcome-prevalence');
    expect(command.optionOf('tableMeasure')).toBe('--measure');
    expect(command.optionOf('confounders[2].rrOutcome')).toBe('--reference-confounders');
    expect(command.optionOf('exposedValues')).toBe('--exposed-values');
  });

  it('keeps every option of the command and states the number rule in its help', () => {
    for (const name of ['measure', 'estimate', 'lower', 'upper', 'se', 'level', 'outcome-prevalence', 'sd', 'target', 'counts', 'file', 'exposure', 'outcome', 'exposed-values', 'outcome-values', 'reference-confounders']) {
      expect(command.options[name]).toBeDefined();
    }
    expect(command.help).toMatch(/thousands separators/);
  });
});

describe('evalueMethod.form and workspace', () => {
  it('normalises numbers to their text and says when the numbers need a file', () => {
    expect(evalueMethod.form.normalise({ estimate: 3.9 }).estimate).toBe('3.9');
    expect(evalueMethod.workspace.needsData({ ...emptyEValueForm(), source: 'file' })).toBe(true);
    expect(evalueMethod.workspace.needsData(emptyEValueForm())).toBe(false);
  });

  it('a summary survives a round trip through JSON; other summaries are not read', () => {
    // VanderWeele & Ding 2017 worked example
    const outcome = page({ estimate: '3.9', lower: '1.8', upper: '8.7', confounders: [{ name: 'age', rrExposure: '4', rrOutcome: '4' }] });
    const summary = evalueMethod.workspace.summarise(outcome);
    expect(summary?.eValueInterval).toBe(3);
    expect(evalueMethod.workspace.readSummary(JSON.parse(JSON.stringify(summary)))).toEqual(summary);
    expect(evalueMethod.workspace.readSummary({ ...summary, kind: 'pairs' })).toBeNull();
    expect(evalueMethod.workspace.readSummary({ ...summary, eValueEstimate: 'big' })).toBeNull();
    expect(evalueMethod.workspace.readSummary(null)).toBeNull();
    expect(evalueMethod.workspace.summarise(page({}))).toBeNull();
  });
});

describe('evalueMethod.command: the table’s design, conventions and typed numbers', () => {
  const plainWords = readReferenceJson('plain_words_cases.json');
  it('a cohort table with a common outcome uses its own risk ratio, no √OR (R: RR 2, E-values 3.41 and 1.56)', async () => {
    const report = await run({ counts: '30,70,15,85', measure: 'or', 'outcome-prevalence': 'common', design: 'cohort' });
    const json = report.json as { measure: string; design: string; requestedMeasure: string; eValueEstimate: number; eValueInterval: number };
    expect(json).toMatchObject({ measure: 'rr', design: 'cohort', requestedMeasure: 'or' });
    expectClose(json.eValueEstimate, plainWords.cohort_table.eValueEstimate, { rel: 1e-12 });
    expectClose(json.eValueInterval, plainWords.cohort_table.eValueInterval, { rel: 1e-9 });
    expect(report.text).toMatch(/Design +cohort \(the table's own risk ratio is used\)/);
  });
  it('a case-control table refuses the risk ratio, naming --design; --design goes with a table, not an estimate', async () => {
    const problems = await problemsOf({ counts: '30,70,15,85', measure: 'rr', design: 'case-control' });
    expect(problems[0].field).toBe('design');
    expect(command.optionOf('design')).toBe('--design');
    expect(() => command.formFromOptions({ estimate: '2', design: 'cohort' })).toThrow(/goes with --counts or --file/);
  });
  it('the text and JSON reports list the conventions; the help states them and --design', async () => {
    const report = await run({ measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' });
    const json = report.json as { conventions: { id: string; text: string }[]; targetDirection: string };
    expect(json.conventions.map((c) => c.id)).toEqual(['confounder-strength', 'interval-limit', 'target-direction']);
    for (const c of json.conventions) expect(report.text).toContain(c.text);
    expect(json.targetDirection).toBe('toward-null');
    expect(command.help).toMatch(/--design +how the table/);
    expect(command.help).toMatch(/Conventions \(each report lists the ones that apply\)/);
  });
  it('echoes the numbers with the precision typed: "1.10 (0.90 to 1.35)", not "1.1 (0.9 to 1.35)"', async () => {
    const report = await run({ measure: 'rr', estimate: '1.10', lower: '0.90', upper: '1.35' });
    expect(report.text).toMatch(/Estimate +1\.10 +\(95% interval 0\.90 to 1\.35\)/);
  });
  it('says first that the interval includes the null, and claims nothing about what could not explain it (R: E = 1.43)', async () => {
    const report = await run({ measure: 'rr', estimate: '1.10', lower: '0.90', upper: '1.35' });
    const reading = report.text.split('\n\n')[2];
    expect(reading.split('\n')[0]).toMatch(/^The 95% interval already includes the null: even with no hidden confounding at all/);
    expect(reading).toContain(`at least ${plainWords.evalue_includes_null.eValueEstimate.toFixed(2)} each`);
    expect(reading).not.toMatch(/could not/);
  });
  it('names the direction of confounding for a target beyond the estimate (R: E-value 2.00 for RR 1.5 → 2)', async () => {
    const report = await run({ measure: 'rr', estimate: '1.5', target: '2' });
    expect((report.json as { targetDirection: string }).targetDirection).toBe('away-from-null');
    expectClose((report.json as { eValueEstimate: number }).eValueEstimate, plainWords.evalue_target_beyond.eValueEstimate, { rel: 1e-12 });
    expect(report.text).toMatch(/these E-values concern confounding that pushed the estimate toward the null/);
  });
});
