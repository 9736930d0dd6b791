import { describe, expect, it } from 'vitest';
import * as lurk from '../src/library';
import { expectClose } from './support/expectClose';

describe('the typed library', () => {
  it("exports each method's request reader, runner and core analysis", () => {
    // VanderWeele & Ding 2017, Ann Intern Med 167:268–274: RR 3.9 (1.8 to 8.7) → E-values 7.26 and 3.00
    const outcome = lurk.evaluateEValueForm({ ...lurk.emptyEValueForm(), source: 'reported', measure: 'rr', estimate: '3.9', lower: '1.8', upper: '8.7' }, null);
    expectClose(outcome.result!.eValueEstimate, 7.26, { abs: 0.005 });
    expectClose(lurk.analyseEValue({ measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 }).eValueInterval!, 3, { rel: 1e-12 });
    // Cinelli & Hazlett 2020, JRSS-B 82(1):39–67: t = 4.18, df = 783 → RV 13.9%
    const ovb = lurk.evaluateOvbForm({ ...lurk.emptyOvbForm(), source: 'reported', estimate: '4.18', se: '1', df: '783' }, null);
    expectClose(ovb.result!.rv, 0.139, { abs: 0.0005 });
    expect(typeof lurk.analysePairsForm).toBe('function');
  });

  it('lists every method of the registry with its command', () => {
    expect(lurk.METHODS.map((m) => m.command.name)).toEqual(expect.arrayContaining(['evalue', 'pairs', 'ovb']));
    expect(lurk.readTypedNumber('1,200', 'whole')).toEqual({ ok: true, value: 1200 });
  });
});
