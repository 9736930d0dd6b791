import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { page, userEvent } from 'vitest/browser';
import axe from 'axe-core';
import '../../components/lurk-evalue';
import type { LurkEValue } from '../../components/lurk-evalue';
import { mountElement, settleElement, shadowText, waitUntil, type RecordedEvent } from '../support/mountElement';

let element: LurkEValue;
let events: RecordedEvent[];

beforeEach(async () => {
  ({ element, events } = await mountElement<LurkEValue>('lurk-evalue', {
    viewport: { width: 1280, height: 1500 },
    configure: (e) => {
      e.study = { finding: 'Fictional example', exposure: 'cycling to work', outcome: 'hypertension', units: '', source: '' };
    },
  }));
});

afterEach(() => element.remove());

const shadow = () => element.shadowRoot as ShadowRoot;
const text = (selector: string) => shadowText(element, selector);
const settle = () => settleElement(element);
const until = (check: () => boolean, ms = 15000) => waitUntil(check, settle, ms, 10);

describe('<lurk-evalue>', () => {
  it('has no accessibility violations, empty and filled in', async () => {
    const empty = await axe.run(element);
    expect(empty.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target).join(' ')}`)).toEqual([]);
    await userEvent.fill(page.getByLabelText('Estimate', { exact: true }), '3.9');
    await userEvent.fill(page.getByLabelText('Lower limit'), '1.8');
    await userEvent.fill(page.getByLabelText('Upper limit'), 'x');
    await settle();
    const filled = await axe.run(element);
    expect(filled.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target).join(' ')}`)).toEqual([]);
  });

  it('fills in the published example and reads back E-values 7.26 and 3.00, with the plot drawn', async () => {
    // VanderWeele & Ding 2017, Ann Intern Med 167:268–274: RR 3.9 (1.8 to 8.7) → 7.26 and 3.0
    await userEvent.fill(page.getByLabelText('Estimate', { exact: true }), '3.9');
    await userEvent.fill(page.getByLabelText('Lower limit'), '1.8');
    await userEvent.fill(page.getByLabelText('Upper limit'), '8.7');
    await userEvent.click(page.getByRole('button', { name: 'Add a reference confounder' }));
    await userEvent.fill(page.getByLabelText('Confounder name'), 'age (measured)');
    await userEvent.fill(page.getByLabelText('RR with exposure'), '2');
    await userEvent.fill(page.getByLabelText('RR with outcome'), '3');
    await userEvent.click(page.getByRole('button', { name: 'Add a reference confounder' }));
    await userEvent.fill(page.getByLabelText('Confounder name').nth(1), 'income');
    await userEvent.fill(page.getByLabelText('RR with exposure').nth(1), '20');
    await userEvent.fill(page.getByLabelText('RR with outcome').nth(1), '5');
    await settle();

    expect(text('#evalue-estimate')).toBe('7.26');
    expect(text('#evalue-interval')).toBe('3.00');
    expect(text('#reading-estimate')).toMatch(/both cycling to work and hypertension by a risk ratio of at least 7\.26 each/);
    expect(text('.caution')).toMatch(/does not prove causation/);
    expect(text('.verdicts')).toMatch(/as strong as age \(measured\) .*: not enough to explain away the estimate/);
    expect(text('.verdicts')).toMatch(/as strong as income .*: enough to explain away the estimate/);

    const plot = shadow().querySelector('lurk-plot') as HTMLElement;
    const svg = plot.shadowRoot?.querySelector('svg') as SVGSVGElement;
    expect(svg).toBeTruthy();
    expect(svg.querySelectorAll('path').length).toBeGreaterThan(5);
    expect(svg.getBoundingClientRect().width).toBeGreaterThan(300);
    expect(svg.textContent).toMatch(/E-value 7\.26/);
    expect(svg.textContent).toMatch(/income/);
    expect(element.shadowRoot?.textContent).not.toMatch(/NaN|undefined|Infinity/);

    // Events: every edit tells the page; the last result is the published one.
    const results = events.filter((e) => e.type === 'lurk-result');
    expect(results.at(-1)?.detail.result.eValueEstimate).toBeCloseTo(7.263034344160047, 12);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs.estimate).toBe('3.9');

    await page.screenshot({ path: '../artifacts/evalue.png', element });
  });

  it('shows a problem beside its field and keeps the text typed', async () => {
    await userEvent.fill(page.getByLabelText('Estimate', { exact: true }), '3,9');
    await userEvent.fill(page.getByLabelText('Lower limit'), 'abc');
    await userEvent.fill(page.getByLabelText('Upper limit'), '8.7');
    await settle();
    const lower = shadow().querySelector('#lower') as HTMLInputElement;
    expect(lower.value).toBe('abc');
    expect(lower.getAttribute('aria-invalid')).toBe('true');
    const describedBy = (lower.getAttribute('aria-describedby') ?? '').split(' ');
    expect(describedBy).toContain('lower-error');
    expect(text('#lower-error')).toBe('must be a number, got "abc"');
    expect(text('.waiting')).toMatch(/Fix the field marked/);

    await userEvent.fill(page.getByLabelText('Lower limit'), '1.8');
    await userEvent.fill(page.getByLabelText('Upper limit'), '3');
    await settle();
    expect(text('#estimate-error')).toMatch(/must lie within its interval/);
    expect(element.shadowRoot?.textContent).not.toMatch(/NaN|undefined|Infinity/);
  });

  it('asks for the outcome prevalence of an odds ratio and converts it', async () => {
    await userEvent.selectOptions(page.getByLabelText('Effect measure'), 'or');
    await userEvent.fill(page.getByLabelText('Estimate', { exact: true }), '2.5');
    await userEvent.fill(page.getByLabelText('Lower limit'), '1.6');
    await userEvent.fill(page.getByLabelText('Upper limit'), '3.9');
    await settle();
    expect(text('#outcomePrevalence-error')).toMatch(/is required for odds ratios/);
    await userEvent.selectOptions(page.getByLabelText('How common is the outcome?'), 'common');
    await settle();
    // R 4.2.2: evalues.json case or_2.5_common → 2.5397 and 1.8438
    expect(text('#evalue-estimate')).toBe('2.54');
    expect(text('#evalue-interval')).toBe('1.84');
    expect(text('.scale')).toMatch(/on the risk-ratio scale 1\.58/);
  });

  it('computes from a typed 2×2 table and warns about a zero cell', async () => {
    await userEvent.click(page.getByLabelText('A 2×2 table of counts'));
    await userEvent.fill(page.getByLabelText('Exposed, had the outcome (a)'), '0');
    await userEvent.fill(page.getByLabelText('Exposed, did not (b)'), '20');
    await userEvent.fill(page.getByLabelText('Unexposed, had the outcome (c)'), '5');
    await userEvent.fill(page.getByLabelText('Unexposed, did not (d)'), '15');
    await settle();
    // hand computation: 0.5 added to every cell → RR = 1/11, E = (1 + √(10/11))·11
    expect(text('#evalue-estimate')).toBe(((1 + Math.sqrt(10 / 11)) * 11).toFixed(2));
    expect(text('.warning')).toMatch(/0\.5 was added to every cell/);
    await userEvent.fill(page.getByLabelText('Exposed, did not (b)'), '2.5');
    await settle();
    expect(text('#count-b-error')).toMatch(/whole number/);
  });

  it('counts a table from a CSV file with column pickers', async () => {
    await userEvent.click(page.getByLabelText('A CSV file, one row per person'));
    const csv = 'id;cycles;hypertension\r\n1;yes;1\r\n2;yes;0\r\n3;no;1\r\n4;no;0\r\n5;no;0\r\n6;yes;1\r\n7;NA;1\r\n';
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([csv], 'people.csv', { type: 'text/csv' }));
    await settle();
    await userEvent.selectOptions(page.getByLabelText('Exposure column'), 'cycles');
    await userEvent.selectOptions(page.getByLabelText('Outcome column'), 'hypertension');
    await settle();
    expect(text('#counted')).toMatch(/a 2, b 1, c 1, d 2 from 6 rows/);
    // hand computation: (2/3)/(1/3) = 2 → E = 2 + √2
    expect(text('#evalue-estimate')).toBe((2 + Math.SQRT2).toFixed(2));
    expect(text('.warning')).toMatch(/1 row was left out/);
  });

  it('an empty CSV file is refused with a message beside the file field', async () => {
    await userEvent.click(page.getByLabelText('A CSV file, one row per person'));
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([''], 'empty.csv', { type: 'text/csv' }));
    // Reading the file is asynchronous: wait for its outcome rather than a fixed number of renders.
    await until(() => text('#file-error') !== '');
    expect(text('#file-error')).toBe('empty.csv: the file is empty');
    expect(shadow().querySelector('#file')?.getAttribute('aria-invalid')).toBe('true');
    expect(shadow().querySelector('#evalue-estimate')).toBeNull();
  });

  it('can be filled in with the keyboard alone', async () => {
    (shadow().querySelector('#estimate') as HTMLInputElement).focus();
    await userEvent.keyboard('2');
    await userEvent.tab();
    await userEvent.tab(); // past the two interval radios, which form one tab stop
    await userEvent.keyboard('1.5');
    await userEvent.tab();
    await userEvent.keyboard('2.7');
    await settle();
    expect(text('#evalue-estimate')).toBe((2 + Math.SQRT2).toFixed(2));
    // hand computation: E(1.5) = 1.5 + √0.75
    expect(text('#evalue-interval')).toBe((1.5 + Math.sqrt(0.75)).toFixed(2));
  });

  it('a programmatic inputs change fires no event and restores the typed text', async () => {
    element.inputs = { estimate: '2', lower: '1,5', upper: 'oops' };
    await settle();
    expect(events).toEqual([]);
    expect((shadow().querySelector('#upper') as HTMLInputElement).value).toBe('oops');
    expect(text('#upper-error')).toBe('must be a number, got "oops"');
  });

  it('echoes the typed numbers, says first that the interval includes the null, and lists the conventions', async () => {
    // RR 1.10 (0.90 to 1.35): E-value 1.43 (R: 1.1 + sqrt(1.1 · 0.1), VanderWeele & Ding 2017; plain_words_cases.json)
    await userEvent.fill(page.getByLabelText('Estimate', { exact: true }), '1.10');
    await userEvent.fill(page.getByLabelText('Lower limit'), '0.90');
    await userEvent.fill(page.getByLabelText('Upper limit'), '1.35');
    await settle();
    expect(text('.scale')).toMatch(/^Risk ratio 1\.10 \(95% interval 0\.90 to 1\.35\)/);
    expect(text('.headline')).toMatch(/^The 95% interval already includes the null/);
    expect(text('#reading-estimate')).not.toMatch(/could not/);
    expect(text('details.conventions')).toMatch(/The interval E-value uses the limit nearer the target/);
  });

  it('asks how a 2×2 table was sampled and refuses a risk ratio from a case-control table', async () => {
    await userEvent.click(page.getByLabelText('A 2×2 table of counts'));
    await userEvent.fill(page.getByLabelText('Exposed, had the outcome (a)'), '30');
    await userEvent.fill(page.getByLabelText('Exposed, did not (b)'), '70');
    await userEvent.fill(page.getByLabelText('Unexposed, had the outcome (c)'), '15');
    await userEvent.fill(page.getByLabelText('Unexposed, did not (d)'), '85');
    await settle();
    // Cohort table: RR = 0.3/0.15 = 2, E-value 3.41 (R, plain_words_cases.json)
    expect(text('#evalue-estimate')).toBe('3.41');
    await userEvent.selectOptions(page.getByLabelText('How the table was sampled'), 'case-control');
    await userEvent.selectOptions(page.getByLabelText('Ratio to compute'), 'rr');
    await settle();
    expect(text('#design-error')).toMatch(/case-control table/);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs.design).toBe('case-control');
  });
});
