/// <reference types="vite/client" />
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { page, userEvent } from 'vitest/browser';
import axe from 'axe-core';
import '../../components/lurk-pairs';
import type { LurkPairs } from '../../components/lurk-pairs';
import { mountElement, settleElement, shadowText, waitUntil, type RecordedEvent } from '../support/mountElement';
import smallN15 from '../reference/rosenbaum_small_n15.csv?raw';
import reference from '../reference/rosenbaum.json';

let element: LurkPairs;
let events: RecordedEvent[];

beforeEach(async () => {
  ({ element, events } = await mountElement<LurkPairs>('lurk-pairs', {
    viewport: { width: 1280, height: 1800 },
    configure: (e) => {
      e.study = { finding: 'Fictional example', exposure: 'the new ward routine', outcome: 'recovery score', units: 'points', source: '' };
    },
  }));
});

afterEach(() => element.remove());

const shadow = () => element.shadowRoot as ShadowRoot;
const text = (selector: string) => shadowText(element, selector);
const settle = () => settleElement(element, 3);
const until = (condition: () => boolean, ms = 20_000) => waitUntil(condition, settle, ms, 10);

describe('<lurk-pairs>', () => {
  it('loads a CSV through the file input and shows the tipping Γ and the table', async () => {
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([smallN15], 'differences.csv', { type: 'text/csv' }));
    await until(() => text('#tipping-gamma') !== '');

    // R 4.2.2 reference (test/reference/rosenbaum.json): exact signed-rank sensitivity value 1.6118… → 1.611
    expect(text('#tipping-gamma')).toBe('1.611');
    expect(text('#sign-tipping-gamma')).toBe('1.273'); // sign_exact 1.2738…
    // psignrank reference at Γ = 1: 0.007537841796875
    expect(text('#p-value')).toBe('0.00754');
    const rows = [...shadow().querySelectorAll('#bounds-table tbody tr')].map((tr) => [...tr.children].map((c) => c.textContent!.trim()));
    expect(rows[0].slice(0, 3)).toEqual(['1', '0.00754', '0.00754']);
    expect(rows.at(-1)![0]).toBe('1.7');
    expect(rows.length).toBe(8);
    expect(text('.reading')).toMatch(/odds of the new ward routine by a factor of more than 1\.611/);
    expect(text('.caution')).toMatch(/does not prove causation/);
    expect(text('#pairs-counts')).toMatch(/15 pairs used/);

    const svgs = [...shadow().querySelectorAll('lurk-plot')].map((p) => p.shadowRoot?.querySelector('svg'));
    expect(svgs).toHaveLength(3);
    expect(svgs[0]?.textContent).toMatch(/tipping Γ = 1\.611/);
    expect(element.shadowRoot?.textContent).not.toMatch(/NaN|undefined|Infinity/);

    const results = events.filter((e) => e.type === 'lurk-result');
    expect(results.at(-1)?.detail.result.sensitivityValue).toBeCloseTo(reference.datasets.small_n15.sensitivity_value.wilcoxon_exact, 8);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs).toMatchObject({ fileName: 'differences.csv', columnsBy: 'difference', differenceColumn: 'd' });
    expect(element.summary?.sensitivityValue).toBeCloseTo(1.61183482643143, 8);

    const check = await axe.run(element);
    expect(check.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target).join(' ')}`)).toEqual([]);
    await page.screenshot({ path: '../artifacts/pairs.png', element });
  });

  it('treated and control columns with a missing value: the row is dropped and counted', async () => {
    const csv = 'pair;treated;control\r\n1;5,1;4,2\r\n2;6,0;5,5\r\n3;NA;4,9\r\n4;7,2;6,1\r\n5;5,5;5,0\r\n6;6,6;5,1\r\n7;3,9;3,2\r\n8;5,0;4,1\r\n9;6,2;5,9\r\n';
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([csv], 'pairs.csv', { type: 'text/csv' }));
    await until(() => text('#tipping-gamma') !== '');
    expect(text('#pairs-counts')).toMatch(/8 pairs used, 1 left out for a missing value/);
    expect(text('.warning')).toMatch(/1 of 9 rows was left out because a value was missing|1 of 9 rows were left out/);
    // All 8 differences positive: exact p = 2⁻⁸ = 0.00390625 (only one sign pattern reaches T = 36)
    expect(text('#p-value')).toBe('0.00391');
  });

  it('two 0/1 columns are a binary outcome: discordant pairs and the sign test', async () => {
    // 12 pairs where only the treated unit had the event, 3 where only the control did, 5 concordant
    const rows = ['treated,control'];
    for (let i = 0; i < 12; i++) rows.push('1,0');
    for (let i = 0; i < 3; i++) rows.push('0,1');
    for (let i = 0; i < 5; i++) rows.push(i % 2 ? '1,1' : '0,0');
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([rows.join('\n')], 'binary.csv', { type: 'text/csv' }));
    await until(() => text('#tipping-gamma') !== '');
    // R 4.2.2 reference: sign-test sensitivity value for S = 12 of D = 15 is 1.2738… (rosenbaum.json)
    expect(text('#tipping-gamma')).toBe('1.273');
    expect(text('#pairs-counts')).toMatch(/20 pairs used; 15 informative/);
    expect(text('.warning')).toMatch(/binary/);
    expect(text('.warning')).toMatch(/5 concordant pairs/);
  });

  it('bad pasted input names the line and keeps what was typed', async () => {
    await userEvent.click(page.getByLabelText('Numbers pasted in'));
    await userEvent.fill(page.getByLabelText('Pairs', { exact: true }), '1.2\nabc\n0.4');
    await settle();
    expect(text('#pasted-error')).toBe('line 2 has "abc", which is not a number');
    expect((shadow().querySelector('#pasted') as HTMLTextAreaElement).value).toBe('1.2\nabc\n0.4');
    expect(shadow().querySelector('#pasted')?.getAttribute('aria-invalid')).toBe('true');
    expect(events.filter((e) => e.type === 'lurk-result').at(-1)?.detail.result).toBeNull();

    await userEvent.fill(page.getByLabelText('Significance level α'), '1.5');
    await userEvent.fill(page.getByLabelText('Pairs', { exact: true }), '1.2\n2.5\n0.4\n3.1\n-0.2\n1.9\n2.2\n0.8');
    await settle();
    // One range for α on every surface: 1e-12 to 0.5, with the reason.
    expect(text('#alpha-error')).toMatch(/^must be between 1e-12 and 0.5 /);
    await userEvent.fill(page.getByLabelText('Significance level α'), '0.05');
    await userEvent.fill(page.getByLabelText('Γ values to tabulate'), '1, 0.5');
    await settle();
    expect(text('#gammas-error')).toMatch(/must be 1 or more/);
  });

  it('discordant counts give the sign-test bounds', async () => {
    await userEvent.click(page.getByLabelText('Discordant counts (binary outcome)'));
    await userEvent.fill(page.getByLabelText('Only the treated unit'), '12');
    await userEvent.fill(page.getByLabelText('Only the control unit'), '3');
    await settle();
    // R 4.2.2 reference: sign-test sensitivity value for S = 12 of D = 15 is 1.2738… (rosenbaum.json)
    expect(text('#tipping-gamma')).toBe('1.273');
    expect(shadow().querySelectorAll('lurk-plot')).toHaveLength(2); // no estimate plot for a binary outcome
  });

  it('a large paste runs in a Web Worker with a progress bar and gives the same answer', async () => {
    const values = Array.from({ length: 400 }, (_, i) => (Math.sin(i * 12.9898) * 43758.5453) % 1 + 0.15);
    await userEvent.click(page.getByLabelText('Numbers pasted in'));
    const box = shadow().querySelector('#pasted') as HTMLTextAreaElement;
    box.value = values.map((v) => v.toFixed(4)).join('\n');
    box.dispatchEvent(new Event('input', { bubbles: true, composed: true }));
    await element.updateComplete;
    expect(shadow().querySelector('progress')).toBeTruthy();
    expect(text('.busy')).toMatch(/Computing the bounds/);
    await until(() => text('#tipping-gamma') !== '', 60_000);
    expect(Number(text('#tipping-gamma'))).toBeGreaterThan(1);
    expect(events.filter((e) => e.type === 'lurk-result').at(-1)?.detail.result.tailMethod).toBe('exact');
  }, 90_000);

  it('a file over 1 MB is read in the Web Worker with a progress bar', async () => {
    const rows = ['pair,treated,control'];
    for (let i = 0; i < 60_000; i++) rows.push(`${i + 1},${(50 + ((i * 0.7548776662) % 1) * 10 + 0.4).toFixed(3)},${(50 + ((i * 0.5698402910) % 1) * 10).toFixed(3)}`);
    const file = new File([rows.join('\n')], 'many-pairs.csv', { type: 'text/csv' });
    expect(file.size).toBeGreaterThan(1 << 20);
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), file);
    let sawProgress = false;
    await until(() => {
      if (shadow().querySelector('progress')) sawProgress = true;
      return text('#pairs-counts') !== '' || /Fix|failed/.test(text('section'));
    }, 60_000);
    expect(sawProgress).toBe(true);
    expect(text('section')).not.toMatch(/Fix|failed/);
    expect(text('#pairs-counts')).toMatch(/60,000 pairs used/);
    expect(text('#pairs-counts')).toMatch(/normal approximation/);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs).toMatchObject({ treatedColumn: 'treated', controlColumn: 'control' });
  }, 90_000);

  it('the worker can be cancelled; the typed numbers stay', async () => {
    const values = Array.from({ length: 900 }, (_, i) => ((i * 0.6180339887) % 1) - 0.4);
    await userEvent.click(page.getByLabelText('Numbers pasted in'));
    const box = shadow().querySelector('#pasted') as HTMLTextAreaElement;
    const typed = values.map((v) => v.toFixed(5)).join('\n');
    box.value = typed;
    box.dispatchEvent(new Event('input', { bubbles: true, composed: true }));
    await element.updateComplete;
    await userEvent.click(page.getByRole('button', { name: 'Cancel' }));
    await settle();
    expect(shadow().querySelector('progress')).toBeNull();
    expect(text('#pasted-error')).toBe('');
    expect(text('.waiting')).toBe('The analysis was cancelled; change any input to run it again.');
    expect(box.value).toBe(typed);
    expect(events.filter((e) => e.type === 'lurk-result').at(-1)?.detail.problems[0].code).toBe('cancelled');
  });

  it('restoring saved inputs fires no events and keeps the typed text', async () => {
    element.inputs = { source: 'pasted', pasted: '2\n3\n-1\n4\n5\n6\n7\n8', alpha: '0,05' };
    await settle();
    expect((shadow().querySelector('#pasted') as HTMLTextAreaElement).value).toBe('2\n3\n-1\n4\n5\n6\n7\n8');
    expect((shadow().querySelector('#alpha') as HTMLInputElement).value).toBe('0,05');
    expect(events).toEqual([]);
    expect(text('#tipping-gamma')).not.toBe('');
    expect(shadow().querySelectorAll('lurk-plot')).toHaveLength(3);
  });

  it('offers Pratt’s rule for zero differences and says when the data point the other way', async () => {
    await userEvent.click(page.getByLabelText('Numbers pasted in'));
    // R wilcox.test(d, alternative = "greater", exact = TRUE): p = 0.997; Hodges–Lehmann −0.85 (plain_words_cases.json)
    await userEvent.fill(page.getByLabelText('Pairs', { exact: true }), '-1.2\n-0.5\n0.3\n-2.1\n-0.8\n-1.1\n0.2\n-0.9\n-1.5\n-0.65');
    await settle();
    expect(text('.reading')).toMatch(/^The data point the other way/);
    await userEvent.selectOptions(page.getByLabelText('Pairs with a zero difference'), 'pratt');
    await settle();
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs.zeros).toBe('pratt');
    expect(text('details.conventions')).toMatch(/Pratt's rule/);
    expect(shadow().textContent).not.toMatch(/NaN|undefined|Infinity|p = </);
  });
});
