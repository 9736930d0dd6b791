import { describe, expect, it } from 'vitest';
import { InputError } from '../../../src/core/inputProblem';
import { pairsFromSummaryText, pairsQueryOfForm } from '../../../src/methods/pairs/pairsFromSummary';
import { emptyPairsForm, pairsInputFromForm } from '../../../src/methods/pairs/request';

// A fictional result row of the matched-pairs query.
const good = { lurk_query: 'lurk-pairs-signed-ranks', rows_read: 7, pairs: 5, zeros: 1, non_zero: 4, positive: 3, rank_sum_positive: 8, rank_sum: 10, rank_sum_squares: 30 };
const problemsOf = (text: string) => {
  try {
    pairsFromSummaryText(text);
    return [];
  } catch (error) {
    return (error as InputError).problems.map((p) => `${p.field}: ${p.message}`);
  }
};

describe('the pasted result of the matched-pairs query', () => {
  it('reads JSON and CSV alike into a signed-rank summary with the rows left out', () => {
    const csv = Object.keys(good).join(',') + '\n' + Object.values(good).join(',');
    for (const text of [JSON.stringify(good), csv, `[${JSON.stringify(good)}]`]) {
      const read = pairsFromSummaryText(text);
      expect(read.data).toMatchObject({ kind: 'signed-rank-summary', pairs: 5, zeros: 1, nonZero: 4, positive: 3, statistic: 8, sumRanks: 10, sumSquaredRanks: 30 });
      expect(read.droppedRows).toBe(2);
      expect(read.warnings).toEqual(['2 of 7 rows were left out because a value was missing.']);
    }
  });
  it('names the column of a missing, non-numeric or negative cell, and refuses another query', () => {
    expect(problemsOf(JSON.stringify({ ...good, rank_sum: undefined }))).toEqual(['summaryResult: column rank_sum is missing from the result (run the whole query unchanged)']);
    expect(problemsOf(JSON.stringify({ ...good, positive: 'three' }))[0]).toMatch(/^summaryResult: column positive must be a whole number/);
    expect(problemsOf(JSON.stringify({ ...good, zeros: -1 }))[0]).toMatch(/^summaryResult: column zeros/);
    expect(problemsOf('{"lurk_query": "lurk-2x2-counts", "a": 1}')[0]).toMatch(/^summaryResult: is the result of another query/);
    expect(problemsOf('just words')[0]).toMatch(/^summaryResult: must be the query's one result row/);
    expect(problemsOf('')[0]).toMatch(/^summaryResult: paste/);
  });
  it('the request reader names the column of an impossible sum of squared ranks', () => {
    const form = { ...emptyPairsForm(), source: 'summary' as const, summaryResult: JSON.stringify({ ...good, rank_sum_squares: 0 }) };
    const { problems } = pairsInputFromForm(form, null);
    expect(problems.map((p) => p.field)).toEqual(['summaryResult']);
    expect(problems[0].message).toMatch(/^column rank_sum_squares must lie between/);
  });
});

describe('the matched-pairs query of the form', () => {
  it('names the missing table or column by form field', () => {
    const base = { summaryTable: 'research.pairs', columnsBy: 'difference' as const, treatedColumn: '', controlColumn: '', differenceColumn: 'd' };
    expect(pairsQueryOfForm(base).sql).toMatch(/FROM "research"\."pairs"/);
    expect(pairsQueryOfForm({ ...base, summaryTable: '' }).problems.map((p) => p.field)).toEqual(['summaryTable']);
    expect(pairsQueryOfForm({ ...base, columnsBy: 'outcomes' }).problems.map((p) => p.field)).toEqual(['treatedColumn', 'controlColumn']);
  });
});
