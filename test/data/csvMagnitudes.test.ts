// Columns offset far from zero or scaled to extreme magnitudes: the readers must hand out the values
// unchanged, and a column whose values vary must not be called constant.
import { Readable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { fitLeastSquares } from '../../src/core/linearModel';
import { numericColumn, readCsvText } from '../../src/data/csv';
import { CsvChunkReader } from '../../src/data/csvChunkReader';
import { readCsvRows } from '../../src/data/csvStream';
import { parseNumericCell, regressionDataFromText } from '../../src/methods/regression/regressionData';
import { expectClose } from '../support/expectClose';

// Invented data (fictional): outcome y, treatment t, covariate x.
const rows = [
  [1, 0, 2],
  [2, 1, 1],
  [3, 0, 5],
  [5, 1, 3],
  [4, 1, 4],
  [7, 0, 8],
  [6, 1, 2],
  [2, 0, 7],
];
const transforms: [string, (x: number) => number][] = [
  ['offset by 1e9', (x) => 1e9 + x],
  ['offset by 1e12', (x) => 1e12 + x],
  ['scaled by 1e-300', (x) => x * 1e-300],
  ['scaled by 1e300', (x) => x * 1e300],
];

function csvWith(transform: (x: number) => number): { text: string; x: number[] } {
  const x = rows.map((r) => transform(r[2]));
  return { text: ['y,t,x', ...rows.map((r, i) => `${r[0]},${r[1]},${x[i].toPrecision(17)}`)].join('\n'), x: x.map((v) => Number(v.toPrecision(17))) };
}

describe('extreme magnitudes are read exactly by every reader', () => {
  for (const [label, transform] of transforms) {
    it(`x ${label}`, async () => {
      const { text, x } = csvWith(transform);
      expect(Array.from(numericColumn(readCsvText(text), 'x', 'x').values)).toEqual(x);
      const streamed: number[] = [];
      await readCsvRows(Readable.from([text]), (row) => streamed.push(parseNumericCell(row[2]!, false)));
      expect(streamed).toEqual(x);
      const spans: number[] = [];
      const reader = CsvChunkReader.withSpans((record, n) => n > 1 && spans.push(parseNumericCell(record.field(2), false)), undefined, { readNumbers: true });
      reader.push(text);
      reader.end();
      expect(spans).toEqual(x);
      // The values vary: their range is far above the rounding level of their largest magnitude.
      const big = Math.max(...x.map(Math.abs));
      expect(Math.max(...x) - Math.min(...x)).toBeGreaterThan(1e3 * Number.EPSILON * big);
    });
  }
});

describe('a varying column is not called constant, whatever its offset or scale', () => {
  const plain = (() => {
    const data = regressionDataFromText(csvWith((x) => x).text, { outcome: 'y', treatment: 't', covariates: ['x'] });
    return fitLeastSquares(data.design, { response: data.outcomeColumn, predictors: data.predictors });
  })();

  it('x scaled by 1e300: same treatment effect, x coefficient scaled by 1e-300 (invariance of least squares)', () => {
    const data = regressionDataFromText(csvWith((x) => x * 1e300).text, { outcome: 'y', treatment: 't', covariates: ['x'] });
    const fit = fitLeastSquares(data.design, { response: data.outcomeColumn, predictors: data.predictors });
    expectClose(fit.coefficients[2], plain.coefficients[2], { rel: 1e-12 });
    expectClose(fit.coefficients[1] * 1e300, plain.coefficients[1], { rel: 1e-12 });
  });

  // Constancy is judged relative to scale in src/core: absorbBlock (streamingQr.ts) takes a column whose squares
  // underflow (1e-300) through the scaled norm, and retriangulate (linearModel.ts) judges a column after the
  // intercept against its centred norm (1e9 + x varies by ±3: not constant). R's lm would drop the offset column.
  for (const [label, transform] of transforms.filter(([l]) => l !== 'scaled by 1e300')) {
    it(`x ${label}: same treatment effect as the plain data`, () => {
      const data = regressionDataFromText(csvWith(transform).text, { outcome: 'y', treatment: 't', covariates: ['x'] });
      const fit = fitLeastSquares(data.design, { response: data.outcomeColumn, predictors: data.predictors });
      expectClose(fit.coefficients[2], plain.coefficients[2], { rel: 1e-9 });
    });
  }
});
