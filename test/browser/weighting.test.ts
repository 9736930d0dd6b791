/// <reference types="vite/client" />
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { page, userEvent } from 'vitest/browser';
import axe from 'axe-core';
import '../../components/lurk-weighting';
import type { LurkWeighting } from '../../components/lurk-weighting';
import { mountElement, settleElement, shadowText, waitUntil, type RecordedEvent } from '../support/mountElement';
// Invented data (fictional), written by test/reference/generators/weighting.R.
import fictional from '../reference/weighting_fictional.csv?raw';
import reference from '../reference/weighting.json';

let element: LurkWeighting;
let events: RecordedEvent[];

beforeEach(async () => {
  ({ element, events } = await mountElement<LurkWeighting>('lurk-weighting', { viewport: { width: 1280, height: 2400 } }));
});

afterEach(() => element.remove());

const shadow = () => element.shadowRoot as ShadowRoot;
const text = (selector: string) => shadowText(element, selector);
const settle = () => settleElement(element, 3);
const until = (condition: () => boolean, ms = 60_000) => waitUntil(condition, settle, ms, 10);
const upload = () => userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([fictional], 'fictional-programme.csv', { type: 'text/csv' }));

describe('<lurk-weighting>', () => {
  it('loads a fictional CSV, shows the worker\'s progress, then the bounds, the model and three plots', async () => {
    await upload();
    // The file starts a run with the default 1,000 resamples; a new setting replaces it.
    await until(() => shadow().querySelector('#weighting-progress') !== null);
    await userEvent.fill(page.getByLabelText('Bootstrap resamples'), '40');
    let sawProgress = false;
    await until(() => {
      if (shadow().querySelector('#weighting-progress')) sawProgress = true;
      return text('#tipping-point') !== '' || /Fix/.test(text('section'));
    });
    expect(sawProgress).toBe(true);
    expect(text('section')).not.toMatch(/Fix/);
    // R 4.2.2 Hájek ATE on the complete cases — test/reference/weighting.json (fictional, ate.effect)
    expect(Number(text('#effect'))).toBeCloseTo(reference.fictional.ate.effect, 3);
    expect(text('#weighting-counts')).toMatch(/147 people used/);
    expect(text('#weighting-counts')).toMatch(/3 left out for a missing value/);
    expect(text('#weighting-counts')).toMatch(/"site" is dummy-coded/);
    const rows = [...shadow().querySelectorAll('#bounds-table tbody tr')];
    expect(rows).toHaveLength(5);
    expect(shadow().querySelectorAll('#model-table tbody tr')).toHaveLength(5);
    expect(text('.caution')).toMatch(/does not prove causation/);
    const svgs = [...shadow().querySelectorAll('lurk-plot')].map((p) => p.shadowRoot?.querySelector('svg'));
    expect(svgs).toHaveLength(3);
    expect(element.shadowRoot?.textContent).not.toMatch(/NaN|undefined|Infinity/);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs).toMatchObject({ fileName: 'fictional-programme.csv', treatment: 'treated', outcome: 'outcome', bootstrap: '40' });
    expect(events.filter((e) => e.type === 'lurk-result').at(-1)?.detail.result.bootstrap.requested).toBe(40);
    expect(element.summary?.kind).toBe('weighting');

    const check = await axe.run(element);
    expect(check.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target).join(' ')}`)).toEqual([]);
  }, 120_000);

  it('Cancel stops the worker; a new setting runs again', async () => {
    await userEvent.fill(page.getByLabelText('Bootstrap resamples'), '20000');
    await upload();
    await until(() => /Bootstrap:/.test(text('#progress-label')));
    await userEvent.click(page.getByRole('button', { name: 'Cancel' }));
    await settle();
    expect(shadow().querySelector('#weighting-progress')).toBeNull();
    expect(text('#cancelled')).toBe('The analysis was cancelled.');
    expect(events.filter((e) => e.type === 'lurk-result').at(-1)?.detail.problems[0].code).toBe('cancelled');
    await userEvent.fill(page.getByLabelText('Bootstrap resamples'), '0');
    await until(() => text('#tipping-point') !== '');
    expect(text('#tipping-interval')).toBe('none');
  }, 120_000);

  it('problems are shown by field: a Λ below 1 and a one-sided trimming rule', async () => {
    await upload();
    await userEvent.fill(page.getByLabelText('Bootstrap resamples'), '0');
    await userEvent.fill(page.getByLabelText('Trim below propensity'), '0.05');
    await settle();
    expect(text('#trimAbove-error')).toMatch(/both bounds/);
    await userEvent.fill(page.getByLabelText('Trim below propensity'), '');
    await userEvent.fill(page.getByLabelText('Λ values'), '1, 0.5');
    await until(() => text('#lambdas-error') !== '');
    expect(text('#lambdas-error')).toMatch(/at least 1/);
  }, 120_000);
});
