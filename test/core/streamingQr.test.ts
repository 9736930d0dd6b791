import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitLeastSquares, INTERCEPT_NAME, type TriangularDesign } from '../../src/core/linearModel';
import { StreamingQr, triangularFactor } from '../../src/core/streamingQr';
import { expectClose } from '../support/expectClose';
import { readReferenceJson, readReferenceText } from '../support/reference';

function longley(): { names: string[]; rows: number[][] } {
  const lines = readReferenceText('longley.csv').trim().split(/\r?\n/);
  return { names: lines[0].split(',').map((h) => h.replace(/"/g, '')), rows: lines.slice(1).map((l) => l.split(',').map(Number)) };
}

/** RᵀR, p×p. */
function gram(r: Float64Array, p: number): number[][] {
  const g = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) for (let k = 0; k < p; k++) g[i][j] += r[k * p + i] * r[k * p + j];
  return g;
}

/** XᵀX computed directly (exact enough for small integer data). */
function crossProducts(rows: number[][], p: number): number[][] {
  const g = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (const row of rows) for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) g[i][j] += row[i] * row[j];
  return g;
}

function designOf(qr: StreamingQr, names: string[]): TriangularDesign {
  return { columnNames: names, r: qr.triangle(), rowCount: qr.rowCount, interceptColumn: INTERCEPT_NAME };
}

describe('StreamingQr', () => {
  it('reproduces the NIST StRD Longley certified values with any block size', () => {
    // NIST StRD "Longley" certified values (test/reference/longley.json)
    const cert = readReferenceJson('longley.json').certified;
    const { names, rows } = longley();
    for (const blockRows of [1, 2, 3, 7, 16, 512]) {
      const qr = new StreamingQr(names.length + 1, blockRows);
      for (const row of rows) qr.addRow([1, ...row]);
      const fit = fitLeastSquares(designOf(qr, [INTERCEPT_NAME, ...names]), {
        response: 'y',
        predictors: [INTERCEPT_NAME, 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'],
      });
      ['intercept', 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'].forEach((key, i) => {
        expectClose(fit.coefficients[i], cert.coefficients[key], { rel: 1e-9 }, `block ${blockRows}: ${key}`);
        expectClose(fit.standardErrors[i], cert.standard_errors[key], { rel: 1e-9 }, `block ${blockRows}: SE ${key}`);
      });
      expectClose(fit.residualSd, cert.residual_sd, { rel: 1e-9 });
    }
  });

  it('gives R with RᵀR = XᵀX and a non-negative diagonal', () => {
    const rows = [
      [1, 2, 3],
      [1, -1, 4],
      [1, 0, -2],
      [1, 5, 1],
    ];
    const qr = new StreamingQr(3, 2);
    qr.addRows(rows.flat(), rows.length);
    const r = qr.triangle();
    const g = gram(r, 3);
    const x = crossProducts(rows, 3);
    for (let i = 0; i < 3; i++) {
      expect(r[i * 3 + i]).toBeGreaterThanOrEqual(0);
      for (let j = 0; j < 3; j++) expectClose(g[i][j], x[i][j], { rel: 1e-13, abs: 1e-13 });
      for (let j = 0; j < i; j++) expect(r[i * 3 + j]).toBe(0);
    }
    expect(qr.rowCount).toBe(4);
  });

  it('with no rows, R is zero', () => {
    expect([...new StreamingQr(3).triangle()]).toEqual(new Array(9).fill(0));
  });

  it('inserting a zero column equals having had that column from the start', () => {
    const before = [
      [1, 2],
      [1, 3],
      [1, 7],
    ];
    const after = [
      [1, 1, 4],
      [1, 0, 1],
      [1, 1, 2],
    ];
    const streamed = new StreamingQr(2, 2);
    before.forEach((row) => streamed.addRow(row));
    streamed.insertZeroColumn(1);
    after.forEach((row) => streamed.addRow(row));
    const direct = new StreamingQr(3, 2);
    before.forEach(([a, b]) => direct.addRow([a, 0, b]));
    after.forEach((row) => direct.addRow(row));
    const g1 = gram(streamed.triangle(), 3);
    const g2 = gram(direct.triangle(), 3);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expectClose(g1[i][j], g2[i][j], { rel: 1e-13, abs: 1e-12 });
  });

  it('handles huge (1e150) and tiny (1e-150) magnitudes without overflow or underflow', () => {
    const { names, rows } = longley();
    const reference = new StreamingQr(names.length + 1);
    rows.forEach((row) => reference.addRow([1, ...row]));
    const base = fitLeastSquares(designOf(reference, [INTERCEPT_NAME, ...names]), { response: 'y', predictors: [INTERCEPT_NAME, 'x1', 'x2'] });
    for (const scale of [1e150, 1e-150, 1e300]) {
      const qr = new StreamingQr(names.length + 1, 4);
      rows.forEach((row) => qr.addRow([1, ...row.map((v) => v * scale)]));
      const fit = fitLeastSquares(designOf(qr, [INTERCEPT_NAME, ...names]), { response: 'y', predictors: [INTERCEPT_NAME, 'x1', 'x2'] });
      // Scaling y and x alike: the slopes and t values do not change, the intercept scales with y.
      expectClose(fit.coefficients[1], base.coefficients[1], { rel: 1e-9 }, `scale ${scale}`);
      expectClose(fit.coefficients[2], base.coefficients[2], { rel: 1e-9 }, `scale ${scale}`);
      expectClose(fit.tValues[1], base.tValues[1], { rel: 1e-9 }, `scale ${scale}`);
      expectClose(fit.coefficients[0] / scale, base.coefficients[0], { rel: 1e-9 }, `scale ${scale}`);
      expectClose(fit.rSquared, base.rSquared, { rel: 1e-12 }, `scale ${scale}`);
    }
  });

  it('a column of tiny values whose squares underflow (1e-300) is not skipped as if it were zero', () => {
    const r = triangularFactor([1e-300, 2e-300, 3e-300], 3, 1);
    // ‖(1, 2, 3)‖·1e-300 = √14·1e-300.
    expectClose(r[0], Math.sqrt(14) * 1e-300, { rel: 1e-14 });
  });

  it('propagates NaN rather than hiding it', () => {
    const qr = new StreamingQr(2, 1);
    qr.addRow([1, NaN]);
    qr.addRow([1, 2]);
    expect([...qr.triangle()].some(Number.isNaN)).toBe(true);
  });

  it('refuses a bad shape', () => {
    expect(() => new StreamingQr(0)).toThrow(RangeError);
    expect(() => new StreamingQr(2, 0)).toThrow(RangeError);
    expect(() => new StreamingQr(2).insertZeroColumn(3)).toThrow(RangeError);
  });

  it('any block size and any row order give the same RᵀR (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 40 }),
        fc.integer({ min: 1, max: 17 }),
        fc.integer({ min: 1, max: 17 }),
        (rows, blockA, blockB) => {
          const a = new StreamingQr(3, blockA);
          rows.forEach((row) => a.addRow(row));
          const b = new StreamingQr(3, blockB);
          [...rows].reverse().forEach((row) => b.addRow(row));
          const x = crossProducts(rows, 3);
          const ga = gram(a.triangle(), 3);
          const gb = gram(b.triangle(), 3);
          const scale = Math.max(1, ...x.map((r, i) => r[i]));
          for (let i = 0; i < 3; i++) {
            for (let j = 0; j < 3; j++) {
              expect(Math.abs(ga[i][j] - x[i][j])).toBeLessThanOrEqual(1e-12 * scale);
              expect(Math.abs(gb[i][j] - x[i][j])).toBeLessThanOrEqual(1e-12 * scale);
            }
          }
        },
      ),
    );
  });

  it('triangularFactor of a matrix with fewer rows than columns pads R with zero rows', () => {
    const r = triangularFactor([3, 4, 0], 1, 3);
    expectClose(r[0], 3, { rel: 1e-15 });
    expectClose(r[1], 4, { rel: 1e-15 });
    expect([...r.slice(3)]).toEqual([0, 0, 0, 0, 0, 0]);
  });
});
