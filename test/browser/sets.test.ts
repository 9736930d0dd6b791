/// <reference types="vite/client" />
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { page, userEvent } from 'vitest/browser';
import axe from 'axe-core';
import '../../components/lurk-sets';
import type { LurkSets } from '../../components/lurk-sets';
import { mountElement, settleElement, shadowText, waitUntil, type RecordedEvent } from '../support/mountElement';
import demo from '../files/matched-sets-fictional.csv?raw';
import reference from '../reference/matched_sets.json';

let element: LurkSets;
let events: RecordedEvent[];

beforeEach(async () => {
  ({ element, events } = await mountElement<LurkSets>('lurk-sets', {
    viewport: { width: 1280, height: 1800 },
    configure: (e) => {
      e.study = { finding: 'Fictional example', exposure: 'the garden programme', outcome: 'wellbeing score', units: 'points', source: '' };
    },
  }));
});

afterEach(() => element.remove());

const shadow = () => element.shadowRoot as ShadowRoot;
const text = (selector: string) => shadowText(element, selector);
const settle = () => settleElement(element, 3);
const until = (condition: () => boolean, ms = 20_000) => waitUntil(condition, settle, ms, 10);
const upload = (csv: string, name: string) => userEvent.upload(page.getByLabelText('CSV file', { exact: true }), new File([csv], name, { type: 'text/csv' }));

describe('<lurk-sets>', () => {
  it('loads the fictional CSV, guesses the columns and shows the tipping Γ, the table and the plots', async () => {
    await upload(demo, 'matched-sets-fictional.csv');
    await until(() => text('#tipping-gamma') !== '');

    // test/reference/matched_sets.json (R 4.2.2, base only), fictional_d_large_effect: Γ* = 8.8041… shown floored
    const ds = reference.continuous.find((d) => d.name === 'fictional_d_large_effect')!;
    expect(text('#tipping-gamma')).toBe('8.804');
    expect(text('#sets-counts')).toMatch(/14 matched sets \(1 to 4 controls each\), 52 units used/);
    expect(text('#estimate')).toBe('3.87 points');
    const header = [...shadow().querySelectorAll('#bounds-table thead th')].map((th) => th.textContent!.trim());
    expect(header).toEqual(['Γ', 'worst-case p', 'best-case p', 'smallest effect estimate (points)', 'largest effect estimate (points)', '95% interval (points)']);
    expect(text('.reading')).toMatch(/odds of the garden programme by a factor of more than 8\.804/);
    expect(text('.caution')).toMatch(/does not prove causation/);
    expect(shadow().querySelectorAll('#sets-conventions li').length).toBeGreaterThan(5);

    const svgs = [...shadow().querySelectorAll('lurk-plot')].map((p) => p.shadowRoot?.querySelector('svg'));
    expect(svgs).toHaveLength(3);
    expect(svgs[0]?.textContent).toMatch(/tipping Γ = 8\.804/);
    expect(element.shadowRoot?.textContent).not.toMatch(/NaN|undefined|Infinity/);

    const results = events.filter((e) => e.type === 'lurk-result');
    expect(results.at(-1)?.detail.result.sensitivityValue).toBeCloseTo(ds.sensitivity_value!, 5);
    expect(events.filter((e) => e.type === 'lurk-inputs-change').at(-1)?.detail.inputs).toMatchObject({
      fileName: 'matched-sets-fictional.csv',
      setColumn: 'matched_set',
      treatedColumn: 'treated',
      outcomeColumn: 'outcome',
    });
    expect(element.summary?.sensitivityValue).toBeCloseTo(ds.sensitivity_value!, 5);

    const check = await axe.run(element);
    expect(check.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target).join(' ')}`)).toEqual([]);
  });

  it('bad input: one message beside each field, naming the sets', async () => {
    await upload('stratum,treated,outcome\na,1,5\na,0,3\nb,1,4\nc,1,7\nc,0,1\nd,1,x\nd,0,2\n', 'bad.csv');
    await until(() => text('#outcomeColumn-error') !== '');
    expect(text('#outcomeColumn-error')).toBe('column "outcome" has a value that is not a number (row 6 "x"); leave a missing outcome empty or write NA');
    expect(shadow().querySelector('#outcomeColumn')?.getAttribute('aria-invalid')).toBe('true');

    await upload('stratum,treated,outcome\na,1,5\na,0,3\nb,1,4\nc,1,7\nc,0,1\nd,1,6\nd,0,2\n', 'no-control.csv');
    await until(() => text('#treatedColumn-error') !== '');
    expect(text('#treatedColumn-error')).toMatch(/^1 set has no control \(set b\)/);
    expect(events.filter((e) => e.type === 'lurk-result').at(-1)?.detail.result).toBeNull();

    await userEvent.fill(page.getByLabelText('Significance level α'), '0.7');
    await settle();
    expect(text('#alpha-error')).toMatch(/must be above 0 and at most 0\.5/);
  });

  it('a result that is not significant at Γ = 1 says so', async () => {
    // fictional_a: p = 0.0644 at Γ = 1 in the R base reference
    const ds = reference.continuous.find((d) => d.name === 'fictional_a')!;
    const csv = ['set,treated,outcome', ...ds.setIds.map((id, i) => `${id},${ds.treated[i]},${ds.outcomes[i]}`)].join('\n');
    await upload(csv, 'a.csv');
    await until(() => text('#tipping-gamma') !== '');
    expect(text('#tipping-gamma')).toBe('none');
    expect(text('.headline-box')).toMatch(/not significant at Γ = 1/);
    expect(text('.reading')).toMatch(/^Even with no hidden bias/);
  });

  it('a file over 1 MiB is read in the Web Worker and gives a result', async () => {
    const rows = ['set,treated,outcome'];
    for (let s = 0; s < 26_000; s++) {
      rows.push(`s${s},1,${(51 + ((s * 0.7548776662) % 1) * 10).toFixed(2)}`);
      rows.push(`s${s},0,${(50 + ((s * 0.5698402910) % 1) * 10).toFixed(2)}`);
      rows.push(`s${s},0,${(50 + ((s * 0.4142135623) % 1) * 10).toFixed(2)}`);
    }
    const file = new File([rows.join('\n')], 'many-sets.csv', { type: 'text/csv' });
    expect(file.size).toBeGreaterThan(1 << 20);
    await userEvent.upload(page.getByLabelText('CSV file', { exact: true }), file);
    let sawProgress = false;
    await until(() => {
      if (shadow().querySelector('progress')) sawProgress = true;
      return text('#sets-counts') !== '' || /Fix|failed/.test(text('section'));
    }, 90_000);
    expect(sawProgress).toBe(true);
    expect(text('section')).not.toMatch(/Fix|failed/);
    expect(text('#sets-counts')).toMatch(/26,000 matched sets \(2 controls each\), 78,000 units used/);
  }, 120_000);
});
