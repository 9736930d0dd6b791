import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { emptyEValueForm, evaluateEValueForm } from '../../src/methods/evalue/request';
import { emptyOvbForm, evaluateOvbForm } from '../../src/methods/regression/request';
import { appraiseBatchCsv } from '../../src/workspace/batchFindings';
import { createAppraisal } from '../../src/workspace/appraisal';
import { decodeShareFragment, encodeShareFragment } from '../../src/workspace/shareLink';
import { methodById } from '../../src/methods/registry';
import { emptyStudy } from '../../src/format/studyLabels';
import { buildCliForTest } from '../support/builtCli';

/**
 * The same typed text gives the same value or the same message on every surface: the page's form (its request
 * reader), the command line, a batch row and a share link. Expected readings follow the one written rule of
 * src/data/numberText.ts (NUMBER_READING_RULE).
 */
const run = promisify(execFile);
let cli: Awaited<ReturnType<typeof buildCliForTest>>;
beforeAll(async () => {
  cli = await buildCliForTest();
}, 120_000);
afterAll(() => cli?.remove());

type Reading = { value: number } | { message: string };

/** The typed strings: at least 40, with the expected reading in a decimal field (null = refused). */
const TYPED: ReadonlyArray<[string, number | null]> = [
  // Values above about 700 are read as numbers, then refused as too extreme for a standardized mean difference:
  // the test shows the same message on every surface.
  ['1,200', null], ['1 200', null], ['0,95', 0.95], ['95', 95], ['95%', null], ['5%', null], ['RR', null], [' 2.5 ', 2.5],
  ['2.5e-3', 0.0025], ['\u22121.2', -1.2], ['', null], ['NA', null], ['1.5', 1.5], ['1,5', 1.5], ['-0.4', -0.4], ['+3', 3],
  ['1e3', null], ['1E-2', 0.01], ['0', 0], ['-0', 0], ['.5', 0.5], ['5.', 5], ['1,234,567', null], ['1.200,5', null],
  ['1,200.5', null], ['12,3456', 12.3456], ['Infinity', null], ['-Infinity', null], ['abc', null], ['1..2', null],
  ['0x10', null], ['1e999', null], ['3.9', 3.9], ['1.10', 1.1], ['2', 2], ['\u22120,5', -0.5], ['7\u00a0000', null],
  ['1 200,5', null], ['100', 100], ['0.0001', 0.0001], ['99.9', 99.9], ['1/2', null], ['2,5', 2.5], ['0,0001', 0.0001], ['1 0.5', null],
];

function pageEstimate(text: string): Reading {
  const o = evaluateEValueForm({ ...emptyEValueForm(), source: 'reported', measure: 'smd', estimate: text }, null);
  const p = o.problems.find((x) => x.field === 'estimate');
  return p ? { message: p.message } : { value: o.result!.input.estimate };
}

async function cliEstimate(text: string): Promise<Reading> {
  try {
    const { stdout } = await run(process.execPath, [cli.lurk, 'evalue', '--measure', 'smd', '--estimate', text, '--json']);
    return { value: JSON.parse(stdout).estimate };
  } catch (error) {
    const line = String((error as { stderr: string }).stderr).trim();
    return { message: line.replace(/^lurk evalue: --estimate: /, '') };
  }
}

function batchEstimate(text: string): Reading {
  const quoted = `"${text.replace(/"/g, '""')}"`;
  const row = appraiseBatchCsv(`label,measure,estimate\nx,smd,${quoted}\n`).rows[0];
  const problem = row.problem.split('; ').find((p) => p.startsWith('estimate: '));
  return problem ? { message: problem.replace(/^estimate: /, '') } : { value: row.estimate! };
}

function linkEstimate(text: string): Reading {
  const appraisal = createAppraisal(emptyStudy, { evalue: { inputs: { ...emptyEValueForm(), source: 'reported', measure: 'smd', estimate: text }, summary: null } });
  const decoded = decodeShareFragment(encodeShareFragment(appraisal));
  const form = methodById('evalue')!.form.normalise(decoded.appraisal!.findings[0].inputs);
  return pageEstimate((form as { estimate: string }).estimate);
}

/** Degrees of freedom (a whole-number field): regression form, `lurk ovb --df`, a batch `coef` row, a link. */
function pageDf(text: string): Reading {
  const o = evaluateOvbForm({ ...emptyOvbForm(), source: 'reported', estimate: '2', se: '0.5', dfBy: 'df', df: text }, null);
  const p = o.problems.find((x) => x.field === 'df');
  return p ? { message: p.message } : o.result ? { value: o.result.df } : { message: o.problems[0]?.message ?? 'no result' };
}

async function cliDf(text: string): Promise<Reading> {
  try {
    const { stdout } = await run(process.execPath, [cli.lurk, 'ovb', '--estimate', '2', '--se', '0.5', '--df', text, '--json']);
    return { value: JSON.parse(stdout).df };
  } catch (error) {
    const line = String((error as { stderr: string }).stderr).trim();
    return { message: line.replace(/^lurk ovb: --df: /, '') };
  }
}

function batchDf(text: string): Reading {
  const quoted = `"${text.replace(/"/g, '""')}"`;
  const row = appraiseBatchCsv(`label,measure,estimate,se,df\nx,coef,2,0.5,${quoted}\n`).rows[0];
  const problem = row.problem.split('; ').find((p) => p.startsWith('df: '));
  return problem ? { message: problem.replace(/^df: /, '') } : row.df !== null ? { value: row.df } : { message: row.problem };
}

function linkDf(text: string): Reading {
  const appraisal = createAppraisal(emptyStudy, { regression: { inputs: { ...emptyOvbForm(), source: 'reported', estimate: '2', se: '0.5', dfBy: 'df', df: text }, summary: null } });
  const decoded = decodeShareFragment(encodeShareFragment(appraisal));
  const form = methodById('regression')!.form.normalise(decoded.appraisal!.findings[0].inputs);
  return pageDf((form as { df: string }).df);
}

/** A confidence level (a level field): E-value form, `lurk evalue --level`, a batch row's level, a link. */
function pageLevel(text: string): Reading {
  const o = evaluateEValueForm({ ...emptyEValueForm(), source: 'reported', measure: 'rr', estimate: '2', lower: '1.5', upper: '3', level: text }, null);
  const p = o.problems.find((x) => x.field === 'level');
  return p ? { message: p.message } : o.result ? { value: o.result.level } : { message: o.problems[0]?.message ?? 'no result' };
}

async function cliLevel(text: string): Promise<Reading> {
  try {
    const { stdout } = await run(process.execPath, [cli.lurk, 'evalue', '--measure', 'rr', '--estimate', '2', '--lower', '1.5', '--upper', '3', '--level', text, '--json']);
    return { value: JSON.parse(stdout).level };
  } catch (error) {
    const line = String((error as { stderr: string }).stderr).trim();
    return { message: line.replace(/^lurk evalue: --level: /, '') };
  }
}

function batchLevel(text: string): Reading {
  const quoted = `"${text.replace(/"/g, '""')}"`;
  const row = appraiseBatchCsv(`label,measure,estimate,lower,upper,level\nx,rr,2,1.5,3,${quoted}\n`).rows[0];
  const problem = row.problem.split('; ').find((p) => p.startsWith('level: '));
  // A batch row shows the level through its E-values; compare it with the page's E-value at that level.
  if (problem) return { message: problem.replace(/^level: /, '') };
  return row.eValueInterval !== null ? { value: Number.NaN } : { message: row.problem };
}

describe('one reading of typed text on every surface', () => {
  it('has at least 40 typed strings', () => expect(TYPED.length).toBeGreaterThanOrEqual(40));

  it.each(TYPED)('estimate %j reads the same on the page, the command line, a batch row and a share link', async (text, expected) => {
    const page = pageEstimate(text);
    expect(await cliEstimate(text)).toEqual(page);
    expect(batchEstimate(text)).toEqual(page);
    expect(linkEstimate(text)).toEqual(page);
    if (expected === null) expect(page).toHaveProperty('message');
    else expect((page as { value: number }).value).toBeCloseTo(expected, 12);
  }, 30_000);

  const WHOLE: ReadonlyArray<[string, number | null]> = [
    ['1,200', 1200], ['1 200', 1200], ['1200', 1200], ['1.5', null], ['', null], ['NA', null], ['12,3456', null],
    ['2.5e3', 2500], ['\u22125', null], [' 783 ', 783], ['783.0', 783], ['1\u00a0234\u00a0567', 1234567], ['95%', null],
  ];
  it.each(WHOLE)('df %j reads the same on the page, the command line, a batch row and a share link', async (text, expected) => {
    const page = pageDf(text);
    expect(await cliDf(text)).toEqual(page);
    expect(linkDf(text)).toEqual(page);
    const batch = batchDf(text);
    if ('value' in page) expect(batch).toEqual(page);
    else expect(batch).toHaveProperty('message');
    if (expected === null) expect(page).toHaveProperty('message');
    else expect((page as { value: number }).value).toBe(expected);
  }, 30_000);

  const LEVELS: ReadonlyArray<[string, number | null]> = [
    ['95', 0.95], ['95%', 0.95], ['0.95', 0.95], ['0,95', 0.95], ['90', 0.9], ['99.9', 0.999], ['', 0.95], ['NA', 0.95], ['150', null], ['1,200', null],
  ];
  it.each(LEVELS)('level %j reads the same on the page and the command line, and a batch row agrees', async (text, expected) => {
    const page = pageLevel(text === '' ? '95' : text);
    expect(await cliLevel(text === '' ? '95' : text)).toEqual(page);
    const batch = batchLevel(text);
    if ('message' in page) expect(batch).toHaveProperty('message');
    else expect(batch).not.toHaveProperty('message');
    if (expected === null) expect(page).toHaveProperty('message');
    else expect((page as { value: number }).value).toBeCloseTo(expected, 12);
  }, 30_000);

  const MEASURES: ReadonlyArray<[string, string | null]> = [['RR', 'rr'], ['rr', 'rr'], [' Rr ', 'rr'], ['OR', 'or'], ['Hr', 'hr'], ['xx', null]];
  it.each(MEASURES)('measure %j is read without regard to case on the command line and in a batch row', async (text, expected) => {
    let cli_: string | null;
    try {
      const { stdout } = await run(process.execPath, [cli.lurk, 'evalue', '--measure', text, '--estimate', '2', '--lower', '1.5', '--upper', '3', '--outcome-prevalence', 'rare', '--json']);
      cli_ = JSON.parse(stdout).measure;
    } catch {
      cli_ = null;
    }
    const row = appraiseBatchCsv(`label,measure,estimate,lower,upper,outcome_prevalence\nx,${text},2,1.5,3,rare\n`).rows[0];
    expect(cli_).toBe(expected);
    expect(row.eValueEstimate !== null ? row.measure : null).toBe(expected);
  }, 30_000);
});
