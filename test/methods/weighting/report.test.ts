import { beforeAll, describe, expect, test } from 'vitest';
import { readFileSync } from 'node:fs';
import { renderSvgString } from '../../../src/plot/svgString';
import type { WeightingAnalysis } from '../../../src/methods/weighting/analysis';
import { weightingPlots } from '../../../src/methods/weighting/plots';
import { weightingReport } from '../../../src/methods/weighting/report';
import { emptyWeightingForm, readWeightingSettings } from '../../../src/methods/weighting/request';
import { analyseWeightingStream } from '../../../src/methods/weighting/runner';
import { textSource, type WeightingReadSummary } from '../../../src/methods/weighting/weightingData';
import { expectClose } from '../../support/expectClose';
import { referencePath } from '../../support/reference';
import { weightingReference as reference } from '../../support/weightingData';

let analysis: WeightingAnalysis;
let read: WeightingReadSummary;
beforeAll(async () => {
  const form = { ...emptyWeightingForm(), treatment: 'am', outcome: 'mpg', bootstrap: '40', lambdas: reference.mtcars.ate.lambdas.join(',') };
  ({ analysis, read } = await analyseWeightingStream(textSource(readFileSync(referencePath('weighting_mtcars.csv'), 'utf8')), readWeightingSettings(form)));
}, 60_000);

describe('reference values', () => {
  test('JSON rows carry R\'s brute-force bounds under self-explaining names', () => {
    // R 4.2.2 — test/reference/weighting.json (mtcars, ATE)
    const json = weightingReport(analysis, read).json as { rows: Record<string, number>[]; estimate: { effect: number } };
    expectClose(json.estimate.effect, reference.mtcars.ate.effect, { abs: 1e-6 });
    json.rows.forEach((row, i) => {
      expect(Object.keys(row)).toEqual(['lambda', 'lowestEffect', 'highestEffect', 'intervalLow', 'intervalHigh']);
      expectClose(row.lowestEffect, reference.mtcars.ate.lower[i], { abs: 1e-6 });
      expectClose(row.highestEffect, reference.mtcars.ate.upper[i], { abs: 1e-6 });
    });
  });
});

describe('the report', () => {
  test('JSON: both tipping values with status, model with iterations, convergence and standard errors, overlap, weights, conventions, warnings, caution', () => {
    const json = weightingReport(analysis, read).json as Record<string, any>;
    for (const key of ['tippingLambdaPoint', 'tippingPointStatus', 'tippingLambdaInterval', 'tippingIntervalStatus', 'overlap', 'weights', 'counts', 'conventions', 'warnings', 'caution', 'reading']) expect(json).toHaveProperty(key);
    expect(json.propensityModel).toMatchObject({ iterations: 8, converged: true });
    expect(json.propensityModel.coefficients.map((c: { name: string }) => c.name)).toEqual(['(intercept)', 'hp', 'wt']);
    // R 4.2.2 summary.glm standard errors — test/reference/logistic_standard_errors.json
    expectClose(json.propensityModel.coefficients[2].standardError, 3.0686751130547045, { rel: 1e-6 });
    expect(json.overlap.bins).toHaveLength(analysis.result.overlap.bins.length);
    expect(json.conventions.length).toBe(analysis.result.conventions.length + 1);
  });
  test('text: every convention of the result, the reading in words, and nothing unprintable', () => {
    const { text, json } = weightingReport(analysis, read);
    for (const c of analysis.result.conventions) expect(text).toContain(c.text);
    expect(text).toMatch(/a hidden factor that changed some people's odds of treatment by more than [\d.]+-fold/i);
    expect(text).toContain('Tipping Λ (point bounds)');
    expect(text).toContain('standard error');
    for (const w of analysis.result.warnings) expect(text).toContain(w);
    expect(text).not.toMatch(/NaN|undefined|Infinity/);
    expect(JSON.stringify(json)).not.toMatch(/NaN|undefined|Infinity/);
  });
});

describe('plots', () => {
  test('bounds by Λ, propensity overlap and weights: tables, marks and SVG without NaN', () => {
    const plots = weightingPlots(analysis.result);
    expect(plots.bounds.table.rows).toHaveLength(analysis.result.rows.length);
    expect(plots.overlap.table.rows).toHaveLength(analysis.result.overlap.bins.length);
    expect(plots.weights.table.rows.map((r) => r[0])).toEqual(['treated', 'control']);
    expect(plots.bounds.marks.some((m) => m.kind === 'rule' && /tipping Λ/.test(m.label ?? ''))).toBe(true);
    for (const spec of Object.values(plots)) expect(renderSvgString(spec)).not.toMatch(/NaN|undefined|Infinity/);
  });
});
