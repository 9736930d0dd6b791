/// <reference types="vite/client" />
import { afterEach, describe, expect, it } from 'vitest';
import { page, userEvent } from 'vitest/browser';
import axe from 'axe-core';
import '../../components/lurk-pairs';
import '../../components/lurk-evalue';
import { mountElement, settleElement, shadowText, waitUntil } from '../support/mountElement';
import { analysePairs } from '../../src/core/pairsAnalysis';
import { signedRanks } from '../../src/core/signedRanks';
import { analyseEValueFromCounts } from '../../src/core/eValueAnalysis';
import { formatGamma } from '../../src/methods/pairs/text';
import { formatEValue } from '../../src/methods/evalue/text';
import reference from '../reference/rosenbaum.json';

// The page's "Summary statistics from your database" source: table and columns → the query with a copy button →
// the pasted result → the analysis. The result rows here are what the queries return (the CLI tests run them on
// DuckDB and PostgreSQL); the reference is the file path's analysis of the same data.
let element: HTMLElement & { updateComplete: Promise<unknown> };
afterEach(() => element?.remove());

const text = (selector: string) => shadowText(element, selector);
const until = (condition: () => boolean) => waitUntil(condition, () => settleElement(element, 3), 20_000, 10);

describe('<lurk-pairs> from summary statistics', () => {
  it('shows the query, and the pasted result gives the tipping Γ of the normal approximation on the differences', async () => {
    ({ element } = await mountElement('lurk-pairs', { viewport: { width: 1280, height: 1800 } }));
    await userEvent.click(page.getByLabelText('Summary statistics from your database'));
    await userEvent.fill(page.getByLabelText('Table or view'), 'study.pairs');
    await userEvent.click(page.getByLabelText('One column of differences'));
    await userEvent.fill(page.getByLabelText('Difference (treated − control)'), 'd');
    await until(() => text('pre.sql') !== '');
    expect(text('pre.sql')).toMatch(/FROM "study"\."pairs"/);
    expect(page.getByRole('button', { name: 'Copy the query' }).element()).toBeTruthy();

    // Data: test/reference/rosenbaum.json, n40 (R 4.2.2 reference data); the query's sums are its signed ranks.
    const differences: number[] = reference.datasets.n40.differences;
    const r = signedRanks(differences);
    const row = { lurk_query: 'lurk-pairs-signed-ranks', rows_read: r.pairs, pairs: r.pairs, zeros: r.zeros, non_zero: r.nonZero, positive: r.positive, rank_sum_positive: r.statistic, rank_sum: r.sumRanks, rank_sum_squares: r.sumSquaredRanks };
    await userEvent.fill(page.getByLabelText('Its result row'), Object.keys(row).join(',') + '\n' + Object.values(row).join(','));
    await until(() => text('#tipping-gamma') !== '');
    const normal = analysePairs({ data: { kind: 'differences', differences }, method: 'normal' });
    expect(text('#tipping-gamma')).toBe(formatGamma(normal.sensitivityValue));
    expect(element.shadowRoot?.textContent).toMatch(/need the differences themselves/);
    expect(element.shadowRoot?.textContent).not.toMatch(/NaN|undefined|Infinity/);
    const check = await axe.run(element);
    expect(check.violations.map((v) => v.id)).toEqual([]);

    // A result pasted into the wrong calculator is refused with one message.
    await userEvent.fill(page.getByLabelText('Its result row'), '{"lurk_query": "lurk-2x2-counts", "a": 3, "b": 7, "c": 1, "d": 9}');
    await until(() => text('#summaryResult-error') !== '');
    expect(text('#summaryResult-error')).toMatch(/another query/);
  });
});

describe('<lurk-evalue> from summary statistics', () => {
  it('shows the counting query, and the pasted counts give the E-values of the same table', async () => {
    ({ element } = await mountElement('lurk-evalue', { viewport: { width: 1280, height: 1800 } }));
    await userEvent.click(page.getByLabelText('Summary statistics from your database'));
    await userEvent.fill(page.getByLabelText('Table or view'), 'cohort.people');
    await userEvent.fill(page.getByLabelText('Exposure column'), 'smoker');
    await userEvent.fill(page.getByLabelText('Outcome column'), 'cancer');
    await until(() => text('pre.sql') !== '');
    expect(text('pre.sql')).toMatch(/FROM "cohort"\."people"/);
    // Fictional counts.
    await userEvent.fill(page.getByLabelText('Its result row'), '{"lurk_query": "lurk-2x2-counts", "a": 30, "b": 70, "c": 10, "d": 90, "rows_missing": 2}');
    await until(() => text('#evalue-estimate') !== '');
    const expected = analyseEValueFromCounts({ counts: { a: 30, b: 70, c: 10, d: 90 }, measure: 'rr' });
    expect(text('#evalue-estimate')).toBe(formatEValue(expected.eValueEstimate));
    expect(element.shadowRoot?.textContent).toMatch(/2 rows were left out/);
    const check = await axe.run(element);
    expect(check.violations.map((v) => v.id)).toEqual([]);

    await userEvent.fill(page.getByLabelText('Its result row'), '{"lurk_query": "lurk-2x2-counts", "a": 30, "b": -1, "c": 10, "d": 90, "rows_missing": 0}');
    await until(() => text('#summaryResult-error') !== '');
    expect(text('#summaryResult-error')).toMatch(/column b must be a whole number of 0 or more/);
  });
});

describe('<lurk-ovb> summary statistics with a categorical covariate', () => {
  it('shows the levels query first, then, with the pasted levels, the summary query with indicators', async () => {
    await import('../../components/lurk-ovb');
    ({ element } = await mountElement('lurk-ovb', { viewport: { width: 1280, height: 1800 } }));
    await page.getByLabelText('Summary statistics from a database').click();
    await userEvent.fill(page.getByLabelText('Table or view'), 'survey.swiss');
    await userEvent.fill(page.getByLabelText('Outcome column'), 'Fertility');
    await userEvent.fill(page.getByLabelText('Treatment column'), 'Education');
    await userEvent.fill(page.getByLabelText('Covariate columns'), 'Agriculture, region');
    await userEvent.fill(page.getByLabelText('Categorical covariates'), 'region');
    await until(() => /SELECT DISTINCT/.test(text('#sql')));
    // Fictional levels, as the levels query returns them (out of order: Lurk sorts them itself).
    await userEvent.fill(page.getByLabelText('Rows of the levels query'), 'lurk_query,column_name,level\nlurk-regression-levels,region,south\nlurk-regression-levels,region,mid\nlurk-regression-levels,region,north');
    await until(() => /lurk_levels/.test(text('#sql')));
    expect(text('#sql')).toMatch(/CAST\("region" AS VARCHAR\) = 'north'/);
    expect(text('#sql')).toMatch(/CAST\("region" AS VARCHAR\) = 'south'/);
    expect(text('#sql')).not.toMatch(/= 'mid'/); // the reference level: first in character order
    const check = await axe.run(element);
    expect(check.violations.map((v) => v.id)).toEqual([]);
  });
});
