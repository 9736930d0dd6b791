import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { page, userEvent } from 'vitest/browser';
import axe from 'axe-core';
import '../../components/lurk-ovb';
import type { LurkOvb } from '../../components/lurk-ovb';
import { mountElement, settleElement, shadowText, waitUntil, type RecordedEvent } from '../support/mountElement';
import swissText from '../reference/swiss.csv?raw';
import ovb from '../reference/ovb.json';

let element: LurkOvb;
let events: RecordedEvent[];

beforeEach(async () => {
  ({ element, events } = await mountElement<LurkOvb>('lurk-ovb', { viewport: { width: 1280, height: 2400 } }));
});

afterEach(() => element.remove());

const shadow = () => element.shadowRoot as ShadowRoot;
const text = (selector: string) => shadowText(element, selector);
const settle = () => settleElement(element);
const until = (check: () => boolean, ms = 15000) => waitUntil(check, settle, ms, 50);

describe('<lurk-ovb>', () => {
  it('reproduces the published example from reported numbers', async () => {
    // Cinelli & Hazlett 2020, JRSS-B 82(1):39–67: t = 4.18, df = 783 → 2.2%, 13.9%, 7.6%
    await userEvent.fill(page.getByLabelText('Estimate (coefficient)'), '4.18');
    await userEvent.fill(page.getByLabelText('Standard error'), '1');
    await userEvent.fill(page.getByLabelText('Degrees of freedom'), '783');
    await settle();
    expect(text('#partial-r2')).toBe('2.2%');
    expect(text('#rv')).toBe('13.9%');
    expect(text('#rv-alpha')).toBe('7.6%');
    expect(text('.caution')).toMatch(/does not prove causation/);
    expect(events.filter((e) => e.type === 'lurk-result').at(-1)?.detail.result.rv).toBeCloseTo(ovb.published_example.RV_1, 12);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs.df).toBe('783');
    expect(shadow().textContent).not.toMatch(/NaN|undefined|Infinity/);
    const report = await axe.run(element);
    expect(report.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target).join(' ')}`)).toEqual([]);
  });

  it('keeps what was typed and names the field of a bad value', async () => {
    await userEvent.fill(page.getByLabelText('Estimate (coefficient)'), '0,5');
    await userEvent.fill(page.getByLabelText('Standard error'), '0.1');
    await userEvent.fill(page.getByLabelText('Degrees of freedom'), '1');
    await settle();
    expect(text('#df-error')).toMatch(/greater than 1/);
    expect(shadow().querySelector('#df')?.getAttribute('aria-invalid')).toBe('true');
    expect((shadow().querySelector('#df') as HTMLInputElement).value).toBe('1');
    await userEvent.fill(page.getByLabelText('Partial R² with the treatment'), '120%');
    await userEvent.fill(page.getByLabelText('Degrees of freedom'), '50');
    await userEvent.fill(page.getByLabelText('Partial R² with the outcome'), '0.1');
    await settle();
    expect(text('#r2dz-error')).toMatch(/\[0, 1\)/);
    expect((shadow().querySelector('#estimate') as HTMLInputElement).value).toBe('0,5');
  });

  it('loads a CSV, picks columns, fits in a worker, and shows RV, a benchmark row and the contour plots', async () => {
    await page.getByLabelText('A CSV file of the data').click();
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([swissText], 'swiss.csv', { type: 'text/csv' }));
    await until(() => shadow().querySelector('#column-outcome') !== null);
    await userEvent.selectOptions(page.getByLabelText('Outcome', { exact: true }), 'Fertility');
    await userEvent.selectOptions(page.getByLabelText('Treatment (exposure)'), 'Education');
    await settle();
    await userEvent.click(page.getByRole('button', { name: 'Fit the regression' }));
    await until(() => text('#rv') !== '');

    // R 4.2.2 lm on datasets::swiss (test/reference/ovb.json swiss): RV 51.7%, RV at α 34.3%, R²yd 35.6%
    expect(text('#rv')).toBe('51.7%');
    expect(text('#rv-alpha')).toBe('34.3%');
    expect(text('#partial-r2')).toBe('35.6%');
    expect(text('#data-note')).toMatch(/47 rows used of 47/);
    const rows = [...shadow().querySelectorAll('#benchmarks tbody tr')].map((tr) => [...tr.children].map((c) => c.textContent!.replace(/\s+/g, ' ').trim()));
    // Agriculture, k = 1: r2dz 16.08%, r2yz 20.22%, adjusted −0.6402, SE 0.1807, t −3.54 (bound formulas from memory, re-derived)
    expect(rows[0]).toEqual(['Agriculture', '1', '16.1%', '20.2%', '-0.6402', '0.181', '-3.54']);
    expect(rows.find((r) => r[0] === 'Examination' && r[1] === '2')?.[2]).toMatch(/Not available/);
    expect(text('#reading')).toMatch(/at least 51\.7% of the residual variance of both Education and Fertility/);

    const plot = shadow().querySelector('#plot-estimate') as HTMLElement;
    const svg = plot.shadowRoot?.querySelector('svg') as SVGSVGElement;
    expect(svg.textContent).toMatch(/as strong as Agriculture/);
    expect(svg.querySelectorAll('path').length).toBeGreaterThan(8);
    expect(shadow().textContent).not.toMatch(/NaN|undefined|Infinity/);

    // Pointing at the plot reads off the adjusted values.
    const box = svg.getBoundingClientRect();
    await userEvent.hover(page.elementLocator(svg), { position: { x: box.width * 0.4, y: box.height * 0.5 } });
    await settle();
    expect((plot as HTMLElement & { readout: string }).readout).toMatch(/adjusted estimate .*SE .*t /);
    // Clicking there tries that confounder: its strength fills the fields and the adjusted values appear.
    await userEvent.click(page.elementLocator(svg), { position: { x: box.width * 0.4, y: box.height * 0.5 } });
    await settle();
    expect((shadow().querySelector('#r2dz') as HTMLInputElement).value).toMatch(/^\d+(\.\d)?%$/);
    expect(text('#scenario')).toMatch(/would give an adjusted estimate of/);

    // A viewport that fits the runner's window, so the screenshot is not scaled down.
    await page.viewport(1200, 700);
    await settle();
    plot.scrollIntoView();
    await page.screenshot({ path: '../artifacts/ovb.png', element: plot });
    element.scrollIntoView();
    await page.screenshot({ path: '../artifacts/ovb-page.png' });
    const report = await axe.run(element);
    expect(report.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target).join(' ')}`)).toEqual([]);
  });

  it('shows progress while reading a large file and can cancel it', async () => {
    await page.getByLabelText('A CSV file of the data').click();
    const [header, ...lines] = swissText.trim().split(/\r?\n/);
    const body = lines.join('\n') + '\n';
    // swiss repeated: about 50 MB, long enough to cancel midway
    const big = new File([header + '\n', ...Array.from({ length: 40000 }, () => body)], 'swiss-big.csv', { type: 'text/csv' });
    // Handed to the input in the page (sending 50 MB through the test driver would take most of a minute).
    const input = shadow().querySelector('#file') as HTMLInputElement;
    const transfer = new DataTransfer();
    transfer.items.add(big);
    input.files = transfer.files;
    input.dispatchEvent(new Event('change', { bubbles: true }));
    await until(() => shadow().querySelector('#column-outcome') !== null);
    await userEvent.selectOptions(page.getByLabelText('Outcome', { exact: true }), 'Fertility');
    await userEvent.selectOptions(page.getByLabelText('Treatment (exposure)'), 'Education');
    await userEvent.click(page.getByRole('button', { name: 'Fit the regression' }));
    // Press Cancel as soon as the progress bar shows (the keyboard-and-mouse path is tested by its role below).
    await until(() => shadow().querySelector('progress') !== null, 30000);
    const cancel = shadow().querySelector('#cancel') as HTMLButtonElement;
    expect(cancel.textContent?.trim()).toBe('Cancel');
    cancel.click();
    await until(() => text('#file-error') !== '', 30000);
    expect(text('#file-error')).toMatch(/cancelled/);
    expect(shadow().querySelector('progress')).toBeNull();
    expect(text('#rv')).toBe('');
  }, 90_000);

  it('dummy-codes a numeric column named as a category and shows its reference level', async () => {
    await page.getByLabelText('A CSV file of the data').click();
    const csv = 'y,d,region\n1,2,1\n2,1,2\n4,3,3\n3,5,1\n5,2,2\n6,1,3\n2,4,1\n7,3,2\n';
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([csv], 'regions.csv', { type: 'text/csv' }));
    await until(() => shadow().querySelector('#column-outcome') !== null);
    await userEvent.selectOptions(page.getByLabelText('Outcome', { exact: true }), 'y');
    await userEvent.selectOptions(page.getByLabelText('Treatment (exposure)'), 'd');
    await userEvent.fill(page.getByLabelText('Numeric columns that are categories'), 'region');
    await userEvent.click(page.getByRole('button', { name: 'Fit the regression' }));
    await until(() => text('#rv') !== '');
    expect(text('#data-note')).toMatch(/region is dummy-coded with reference level “1”/);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs.categorical).toBe('region');
  });

  it('reports a constant treatment by name', async () => {
    await page.getByLabelText('A CSV file of the data').click();
    const csv = 'y,d,x\n1,2,3\n2,2,1\n4,2,7\n3,2,2\n5,2,9\n';
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([csv], 'const.csv', { type: 'text/csv' }));
    await until(() => shadow().querySelector('#column-outcome') !== null);
    await userEvent.selectOptions(page.getByLabelText('Outcome', { exact: true }), 'y');
    await userEvent.selectOptions(page.getByLabelText('Treatment (exposure)'), 'd');
    await userEvent.click(page.getByRole('button', { name: 'Fit the regression' }));
    await until(() => text('#column-treatment-error') !== '');
    expect(text('#column-treatment-error')).toMatch(/"d" is constant/);
  });

  it('shows the SQL for summary statistics and analyses a pasted result', async () => {
    await page.getByLabelText('Summary statistics from a database').click();
    await userEvent.fill(page.getByLabelText('Table or view'), 'swiss');
    await userEvent.fill(page.getByLabelText('Outcome column'), 'Fertility');
    await userEvent.fill(page.getByLabelText('Treatment column'), 'Education');
    await userEvent.fill(page.getByLabelText('Covariate columns'), 'Agriculture, Examination, Catholic, Infant.Mortality');
    await settle();
    expect(text('#sql')).toMatch(/SELECT/);
    // The query's result, computed here from the CSV (as a database would)
    const [header, ...lines] = swissText.trim().split(/\r?\n/);
    const names = header.split(',').map((h) => h.replace(/"/g, ''));
    const vars = ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality', 'Education', 'Fertility'];
    const cols = vars.map((v) => lines.map((l) => Number(l.split(',')[names.indexOf(v)])));
    const row: Record<string, number> = { n: lines.length };
    cols.forEach((c, i) => (row[`s_${i + 1}`] = c.reduce((a, b) => a + b, 0)));
    for (let i = 0; i < vars.length; i++) for (let j = i; j < vars.length; j++) row[`c_${i + 1}_${j + 1}`] = cols[i].reduce((a, x, r) => a + x * cols[j][r], 0);
    (shadow().querySelector('#summaryResult') as HTMLTextAreaElement).value = JSON.stringify(row);
    shadow().querySelector('#summaryResult')!.dispatchEvent(new Event('input', { bubbles: true }));
    await settle();
    expect(text('#rv')).toBe('51.7%');
    const report = await axe.run(element);
    expect(report.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target).join(' ')}`)).toEqual([]);
  });

  it('asks for the SE’s kind and outcome-side multiples, and says capped bounds in words', async () => {
    await userEvent.fill(page.getByLabelText('Estimate (coefficient)'), '0.5');
    await userEvent.fill(page.getByLabelText('Standard error'), '0.2');
    await userEvent.fill(page.getByLabelText('Degrees of freedom'), '100');
    await userEvent.selectOptions(page.getByLabelText('How the SE was computed'), 'robust');
    await settle();
    expect(text('.warning')).toMatch(/The standard error is robust/);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs.seKind).toBe('robust');
    await userEvent.fill(page.getByLabelText('Outcome side, times as strong (one per value above)'), '1, 2');
    await settle();
    expect(text('#kOutcome-error')).toMatch(/one outcome-side multiple per/);
    expect(shadow().textContent).not.toMatch(/NaN|undefined|Infinity/);
  });
});
