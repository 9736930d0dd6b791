import { describe, expect, test } from 'vitest';
import { analyseWeighting, finishWeighting } from '../../src/core/weightingAnalysis';
import { prepareWeighting } from '../../src/core/weightingPreparation';
import { lambdaGrid, LAMBDA_GRID_SIZE, ResampleStatus, runBootstrapChunk, splitBootstrap } from '../../src/core/weightingBootstrap';
import { generatedInput } from '../support/weightingData';
import { expectClose } from '../support/expectClose';

describe('bootstrap contract', () => {
  const input = generatedInput(300, 11, { bootstrap: 60, seed: 7, lambdas: [1, 1.2, 1.5, 2] });
  const whole = analyseWeighting(input);

  test('a fixed seed reproduces the result exactly', () => {
    expect(analyseWeighting(input)).toEqual(whole);
  });
  test('splitting the resamples into chunks, in any order, gives identical results', () => {
    const prepared = prepareWeighting(input);
    const chunks = [runBootstrapChunk(prepared, { start: 41, count: 19 }), runBootstrapChunk(prepared, { start: 0, count: 17 }), runBootstrapChunk(prepared, { start: 17, count: 24 })];
    expect(finishWeighting(prepared, chunks)).toEqual(whole);
  });
  test('a cancelled chunk returns the finished resamples and the rest can be computed later', () => {
    const prepared = prepareWeighting(input);
    let asked = 0;
    const first = runBootstrapChunk(prepared, { start: 0, count: 60 }, { isCancelled: () => asked++ >= 25 });
    expect(first.count).toBe(25);
    const rest = runBootstrapChunk(prepared, { start: 25, count: 35 });
    expect(finishWeighting(prepared, [first, rest])).toEqual(whole);
  });
  test('progress is reported after each resample', () => {
    const prepared = prepareWeighting(input);
    const seen: number[] = [];
    runBootstrapChunk(prepared, { start: 3, count: 4 }, { onProgress: (done) => seen.push(done) });
    expect(seen).toEqual([1, 2, 3, 4]);
  });
  test('another seed gives another interval', () => {
    const other = analyseWeighting({ ...input, seed: 8 });
    expect(other.rows[1].intervalLower).not.toBe(whole.rows[1].intervalLower);
  });
  test('the interval contains the point bounds and widens with Λ', () => {
    let previous = { lower: Infinity, upper: -Infinity };
    for (const row of whole.rows) {
      expect(row.intervalLower!).toBeLessThanOrEqual(row.lowerBound);
      expect(row.intervalUpper!).toBeGreaterThanOrEqual(row.upperBound);
      expect(row.intervalLower!).toBeLessThanOrEqual(previous.lower);
      expect(row.intervalUpper!).toBeGreaterThanOrEqual(previous.upper);
      previous = { lower: row.intervalLower!, upper: row.intervalUpper! };
    }
    expect(whole.bootstrap).toMatchObject({ requested: 60, seed: 7, stratified: true });
    expect(whole.bootstrap.used + whole.bootstrap.failed).toBe(60);
  });
  test('the interval tipping Λ is where the interval at Λ first includes 0', () => {
    expect(whole.tippingIntervalStatus).toBe('found');
    const tip = whole.tippingLambdaInterval!;
    expect(tip).toBeLessThanOrEqual(whole.tippingLambdaPoint!);
    const check = analyseWeighting({ ...input, lambdas: [tip / 1.01, tip * 1.01] });
    const [before, after] = check.rows;
    expect(before.intervalLower! > 0 || before.intervalUpper! < 0).toBe(true);
    expect(after.intervalLower! <= 0 && after.intervalUpper! >= 0).toBe(true);
  });
  test('B = 0 gives point bounds only', () => {
    const result = analyseWeighting({ ...input, bootstrap: 0 });
    expect(result.rows.every((r) => r.intervalLower === null && r.intervalUpper === null)).toBe(true);
    expect(result.rows.map((r) => r.lowerBound)).toEqual(whole.rows.map((r) => r.lowerBound));
    expect(result.bootstrap).toMatchObject({ requested: 0, used: 0, failed: 0 });
  });
  test('chunks that leave out or repeat a resample are refused', () => {
    const prepared = prepareWeighting(input);
    const a = runBootstrapChunk(prepared, { start: 0, count: 30 });
    expect(() => finishWeighting(prepared, [a])).toThrow(RangeError);
    expect(() => finishWeighting(prepared, [a, a, runBootstrapChunk(prepared, { start: 30, count: 30 })])).toThrow(RangeError);
    expect(() => runBootstrapChunk(prepared, { start: 50, count: 11 })).toThrow(RangeError);
  });
});

describe('invariants', () => {
  test('negating every outcome negates the bounds and intervals and keeps both tipping values', () => {
    // Type-7 quantiles are symmetric: the α/2 quantile of −X is minus the 1 − α/2 quantile of X.
    const input = generatedInput(200, 5, { bootstrap: 30, seed: 3, lambdas: [1, 1.3] });
    const a = analyseWeighting(input);
    const b = analyseWeighting({ ...input, outcome: input.outcome.map((v) => -v) });
    a.rows.forEach((row, k) => {
      expectClose(b.rows[k].lowerBound, -row.upperBound, { rel: 1e-9 });
      expectClose(b.rows[k].intervalLower!, -row.intervalUpper!, { rel: 1e-9 });
      expectClose(b.rows[k].intervalUpper!, -row.intervalLower!, { rel: 1e-9 });
    });
    expect(b.tippingPointStatus).toBe(a.tippingPointStatus);
    expect(b.tippingIntervalStatus).toBe(a.tippingIntervalStatus);
    expectClose(b.tippingLambdaPoint!, a.tippingLambdaPoint!, { rel: 1e-9 });
    expectClose(b.tippingLambdaInterval!, a.tippingLambdaInterval!, { rel: 1e-6 });
  });
});

describe('special values', () => {
  test('the tipping grid runs from exactly 1 to exactly the limit, log-spaced', () => {
    const g = lambdaGrid(100);
    expect(g.length).toBe(LAMBDA_GRID_SIZE);
    expect(g[0]).toBe(1);
    expect(g[g.length - 1]).toBe(100);
    const ratio = g[1] / g[0];
    for (let k = 1; k < g.length; k++) expect(Math.abs(g[k] / g[k - 1] - ratio)).toBeLessThan(1e-12);
  });
  test('a resample that loses a rare category is counted as failed, not used', () => {
    // Invented data: a category held by 2 of 40 people often vanishes from a resample
    const n = 40;
    const treatment = Array.from({ length: n }, (_, i) => i % 2);
    const rare = Array.from({ length: n }, (_, i) => (i === 0 || i === 1 ? 1 : 0));
    const x = Array.from({ length: n }, (_, i) => Math.sin(i));
    const prepared = prepareWeighting({ treatment, outcome: x.map((v, i) => v + treatment[i]), covariates: [{ name: 'x', values: x }, { name: 'rare', values: rare }], estimand: 'ate', bootstrap: 50 });
    const chunk = runBootstrapChunk(prepared, { start: 0, count: 50 });
    const failed = [...chunk.status].filter((s) => s !== ResampleStatus.used).length;
    expect(failed).toBeGreaterThan(0);
    const result = finishWeighting(prepared, [chunk]);
    expect(result.bootstrap.failed).toBe(failed);
    expect(result.bootstrap.used).toBe(50 - failed);
    expect(result.warnings.some((w) => w.includes(`${failed} of 50 bootstrap resamples could not be used`))).toBe(true);
  });
  test('splitBootstrap covers 0 … B − 1 in consecutive nearly equal parts', () => {
    expect(splitBootstrap(10, 3)).toEqual([{ start: 0, count: 4 }, { start: 4, count: 3 }, { start: 7, count: 3 }]);
    expect(splitBootstrap(2, 4)).toEqual([{ start: 0, count: 1 }, { start: 1, count: 1 }]);
    expect(splitBootstrap(0, 2)).toEqual([]);
    expect(() => splitBootstrap(5, 0)).toThrow(RangeError);
  });
  test('two parts from splitBootstrap give the same result as one run', () => {
    const input = generatedInput(120, 9, { bootstrap: 21, seed: 4 });
    const prepared = prepareWeighting(input);
    const chunks = splitBootstrap(21, 2).map((r) => runBootstrapChunk(prepared, r));
    expect(finishWeighting(prepared, chunks)).toEqual(analyseWeighting(input));
  });
  test('an empty chunk is allowed', () => {
    const prepared = prepareWeighting(generatedInput(50, 3, { bootstrap: 5 }));
    expect(runBootstrapChunk(prepared, { start: 5, count: 0 }).count).toBe(0);
  });
});
