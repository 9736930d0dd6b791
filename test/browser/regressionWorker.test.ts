import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/inputProblem';
import { fitLeastSquares } from '../../src/core/linearModel';
import { runRegressionInWorker, type RegressionProgress } from '../../src/methods/regression/regressionWorkerClient';
import swissText from '../reference/swiss.csv?raw';
import ovb from '../reference/ovb.json';
import { expectClose } from '../support/expectClose';

const spec = { outcome: 'Fertility', treatment: 'Education', covariates: ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality'] };

/** Swiss repeated `copies` times (a bigger file with the same coefficients): about 1.2 kB per copy. */
function repeatedSwiss(copies: number): File {
  const [header, ...rows] = swissText.trim().split(/\r?\n/);
  const body = rows.join('\n') + '\n';
  return new File([header + '\n', ...Array.from({ length: copies }, () => body)], 'swiss-repeated.csv', { type: 'text/csv' });
}

describe('runRegressionInWorker (Chromium, a real Web Worker)', () => {
  it('reads a CSV file in the worker and matches R\'s lm on swiss', async () => {
    // R 4.2.2 base lm: test/reference/ovb.json "swiss"
    const file = new File([swissText], 'swiss.csv', { type: 'text/csv' });
    const data = await runRegressionInWorker(file, spec);
    const fit = fitLeastSquares(data.design, { response: data.outcomeColumn, predictors: data.predictors });
    const d = data.predictors.indexOf('Education');
    expectClose(fit.coefficients[d], ovb.swiss.estimate, { rel: 1e-9 });
    expectClose(fit.standardErrors[d], ovb.swiss.se, { rel: 1e-9 });
    expect(fit.residualDf).toBe(ovb.swiss.df);
    expect(data.rowsUsed).toBe(47);
    expect(data.design.r).toBeInstanceOf(Float64Array);
    expect(Object.isFrozen(data)).toBe(true);
  });

  it('reports progress in bytes while reading a larger file in chunks', async () => {
    const file = repeatedSwiss(400);
    const progress: RegressionProgress[] = [];
    const data = await runRegressionInWorker(file, spec, { chunkBytes: 16 * 1024, onProgress: (p) => progress.push(p) });
    expect(data.rowsUsed).toBe(47 * 400);
    expect(progress.length).toBeGreaterThan(1);
    expect(progress.at(-1)!.bytesRead).toBe(file.size);
    expect(progress.every((p) => p.totalBytes === file.size)).toBe(true);
    // The same coefficients as one copy: repeating every row does not move the least-squares solution.
    const fit = fitLeastSquares(data.design, { response: data.outcomeColumn, predictors: data.predictors });
    expectClose(fit.coefficients[data.predictors.indexOf('Education')], ovb.swiss.estimate, { rel: 1e-9 });
  });

  it('cancels when the signal aborts, with an AbortError', async () => {
    const controller = new AbortController();
    const file = repeatedSwiss(4000);
    const run = runRegressionInWorker(file, spec, {
      chunkBytes: 8 * 1024,
      signal: controller.signal,
      onProgress: () => controller.abort(),
    });
    await expect(run).rejects.toMatchObject({ name: 'AbortError' });
  });

  it('an already aborted signal rejects at once', async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(runRegressionInWorker(new File([swissText], 'swiss.csv'), spec, { signal: controller.signal })).rejects.toMatchObject({ name: 'AbortError' });
  });

  it('bad input comes back as an InputError naming the field', async () => {
    const error = await runRegressionInWorker(new File([swissText], 'swiss.csv'), { ...spec, treatment: 'Age' }).catch((e) => e);
    expect(error).toBeInstanceOf(InputError);
    expect(error.problems[0]).toMatchObject({ field: 'treatment', code: 'unknown-column' });
  });
});
