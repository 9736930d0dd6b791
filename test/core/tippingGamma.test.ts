import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { tippingGamma } from '../../src/core/tippingGamma';
import { signedRanks } from '../../src/core/signedRanks';
import { signedRankUpperP } from '../../src/core/signedRankBound';
import { signTestBound } from '../../src/core/signTestBound';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const reference = readReferenceJson('rosenbaum.json');
const datasets = Object.entries<any>(reference.datasets);

describe('reference sensitivity values', () => {
  test.each(datasets)('%s: every variant at α = 0.05', (_name, ds) => {
    // R 4.2.2 uniroot (tol 1e-12) on the same bounds, rosenbaum.json sensitivity_value
    const alpha = ds.sensitivity_value.alpha;
    const ranks = signedRanks(ds.differences);
    const cases: [string, (g: number) => number][] = [
      ['wilcoxon_exact', (g) => signedRankUpperP(ranks, g, { method: 'exact' })],
      ['wilcoxon_normal', (g) => signedRankUpperP(ranks, g, { method: 'normal' })],
      ['wilcoxon_normal_cc', (g) => signedRankUpperP(ranks, g, { method: 'normal', continuityCorrection: true })],
      ['sign_exact', (g) => signTestBound(ds.sign_S, ds.sign_D, g, { method: 'exact' }).pUpper],
      ['sign_normal', (g) => signTestBound(ds.sign_S, ds.sign_D, g, { method: 'normal' }).pUpper],
      ['sign_normal_cc', (g) => signTestBound(ds.sign_S, ds.sign_D, g, { method: 'normal', continuityCorrection: true }).pUpper],
    ];
    for (const [key, pUpper] of cases) {
      const result = tippingGamma(pUpper, alpha, { tolerance: 1e-12 });
      expect(result.status, key).toBe('found');
      expectClose(result.gamma!, ds.sensitivity_value[key], { rel: 1e-9 }, key);
      expect(pUpper(result.gamma!)).toBeLessThanOrEqual(alpha);
    }
  });
});

describe('special cases', () => {
  test('not significant at Γ = 1 → null with status not-significant', () => {
    const result = tippingGamma(() => 0.3, 0.05);
    expect(result.gamma).toBeNull();
    expect(result.status).toBe('not-significant');
    expect(result.pAtOne).toBe(0.3);
  });
  test('still significant at the largest Γ searched → beyond-range', () => {
    const result = tippingGamma((g) => 1e-9 * g, 0.05, { maxGamma: 1000 });
    expect(result.status).toBe('beyond-range');
    expect(result.gamma).toBeNull();
  });
  test('α outside (0, 1) or NaN p → not-significant', () => {
    expect(tippingGamma(() => 0.01, 0).status).toBe('not-significant');
    expect(tippingGamma(() => NaN, 0.05).status).toBe('not-significant');
  });
  test('a p-value that underflows to 0 near Γ = 1 still brackets the root', () => {
    // p(Γ) = (Γ/(1+Γ))^2000 · 2^2000 / 10^310 crosses 0.05 far above Γ = 1
    const p = (g: number) => Math.exp(2000 * Math.log(g / (1 + g)) + 2000 * Math.log(2) - 310 * Math.log(10)) || 0;
    const result = tippingGamma((g) => Math.min(1, p(g)), 0.05);
    expect(result.status).toBe('found');
    expect(p(result.gamma!)).toBeLessThanOrEqual(0.05);
    expect(p(result.gamma! * (1 + 1e-8))).toBeGreaterThan(0.05);
  });
});

describe('invariants', () => {
  test('the returned Γ has p ≤ α and a slightly larger Γ has p > α (any monotone bound)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 0.5, noNaN: true }), fc.double({ min: 0.5, max: 8, noNaN: true }), (p1, slope) => {
        const pUpper = (g: number) => 1 - (1 - p1) * Math.exp(-slope * (g - 1));
        const alpha = 0.6;
        const result = tippingGamma(pUpper, alpha, { tolerance: 1e-11 });
        expect(result.status).toBe('found');
        expect(pUpper(result.gamma!)).toBeLessThanOrEqual(alpha);
        expect(pUpper(result.gamma! * (1 + 1e-9))).toBeGreaterThan(alpha - 1e-12);
      }),
    );
  });
});

describe('search cost', () => {
  test('a model of the bound (the normal approximation) cuts the exact evaluations and gives the same Γ', () => {
    const ds = reference.datasets.n40;
    const ranks = signedRanks(ds.differences);
    const exact = (g: number) => signedRankUpperP(ranks, g, { method: 'exact' });
    const normal = (g: number) => signedRankUpperP(ranks, g, { method: 'normal' });
    const guess = tippingGamma(normal, 0.05, { tolerance: 1e-4 }).gamma!;
    const plain = tippingGamma(exact, 0.05, { guess, tolerance: 1e-10 });
    const modelled = tippingGamma(exact, 0.05, { guess, tolerance: 1e-10, model: normal });
    // R 4.2.2 reference sensitivity value (exact signed-rank), rosenbaum.json
    expectClose(modelled.gamma!, ds.sensitivity_value.wilcoxon_exact, { rel: 1e-9 });
    expectClose(modelled.gamma!, plain.gamma!, { rel: 1e-9 });
    expect(modelled.evaluations).toBeLessThanOrEqual(plain.evaluations);
  });
});
