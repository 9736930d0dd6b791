import { DuckDBInstance } from '@duckdb/node-api';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { designFromCrossProducts } from '../../../src/core/crossProductFit';
import { fitLeastSquares, INTERCEPT_NAME, type LeastSquaresFit } from '../../../src/core/linearModel';
import { regressionDataFromText } from '../../../src/methods/regression/regressionData';
import {
  crossProductsFromSqlRow,
  quoteSqlIdentifier,
  quoteSqlString,
  summaryStatisticsSql,
  type SummaryVariable,
} from '../../../src/methods/regression/summaryStatisticsSql';
import { expectClose } from '../../support/expectClose';
import { readReferenceJson, readReferenceText, referencePath } from '../../support/reference';

// The swiss data (R's datasets::swiss, test/reference/swiss.csv) with a few cells blanked and a made-up
// categorical column derived from Catholic, to exercise dropped rows and indicators in both paths.
const BLANKED: Record<number, string> = { 3: 'Catholic', 10: 'Examination', 11: 'Examination', 30: 'Fertility' };
function region(catholic: number): string {
  return catholic > 90 ? 'south' : catholic > 20 ? "mid'land" : 'north';
}
function modifiedSwissCsv(): string {
  const lines = readReferenceText('swiss.csv').trim().split(/\r?\n/);
  const header = lines[0].split(',').map((h) => h.replace(/"/g, ''));
  const out = [lines[0] + ',"region"'];
  lines.slice(1).forEach((line, i) => {
    const cells = line.split(',');
    const catholic = Number(cells[header.indexOf('Catholic')]);
    const blank = BLANKED[i + 1];
    if (blank) cells[header.indexOf(blank)] = 'NA';
    out.push([...cells, region(catholic)].join(','));
  });
  return out.join('\n') + '\n';
}

function compareFits(actual: LeastSquaresFit, expected: LeastSquaresFit, rel: number): void {
  expect(actual.rowCount).toBe(expected.rowCount);
  expect(actual.residualDf).toBe(expected.residualDf);
  expected.coefficients.forEach((b, i) => {
    expectClose(actual.coefficients[i], b, { rel }, `coefficient ${expected.predictors[i]}`);
    expectClose(actual.standardErrors[i], expected.standardErrors[i], { rel }, `SE ${expected.predictors[i]}`);
  });
  expectClose(actual.rSquared, expected.rSquared, { rel }, 'R²');
}

describe('summaryStatisticsSql', () => {
  it('quotes identifiers and literals as standard SQL', () => {
    expect(quoteSqlIdentifier('Infant.Mortality')).toBe('"Infant.Mortality"');
    expect(quoteSqlIdentifier('a "b"')).toBe('"a ""b"""');
    expect(quoteSqlString("mid'land")).toBe("'mid''land'");
  });

  it('writes one SELECT with COUNT, SUMs of variables and of their products, and a NULL filter', () => {
    const sql = summaryStatisticsSql({ table: ['research', 'visits'], variables: [{ column: 'dose' }, { column: 'site', level: 'b' }] });
    expect(sql).toContain('COUNT(*) AS n');
    expect(sql).toContain('CAST("dose" AS DOUBLE PRECISION) AS v_1');
    expect(sql).toContain(`CASE WHEN CAST("site" AS VARCHAR) = 'b' THEN 1.0 ELSE 0.0 END AS v_2`);
    expect(sql).toContain('AVG(v_1) AS m_1');
    expect(sql).toContain('SUM(v_1 - means.m_1) AS d_1');
    expect(sql).toContain('SUM((v_1 - means.m_1) * (v_2 - means.m_2)) AS c_1_2');
    expect(sql).toContain('FROM "research"."visits"');
    expect(sql).toMatch(/WHERE "dose" IS NOT NULL\s+AND "site" IS NOT NULL/);
    // A schema-qualified name typed as one string is quoted part by part.
    expect(summaryStatisticsSql({ table: 'research.visits', variables: [{ column: 'dose' }] })).toContain('FROM "research"."visits"');
    expect(summaryStatisticsSql({ table: '"my.table"', variables: [{ column: 'dose' }] })).toContain('FROM "my.table"');
  });

  it('names the field of a bad spec', () => {
    expect(() => summaryStatisticsSql({ table: '', variables: [{ column: 'a' }, { column: 'a' }] })).toThrow(/table[\s\S]*chosen twice/);
  });

  it('names a result column that is missing or not a number', () => {
    const variables = [{ column: 'a' }];
    expect(() => crossProductsFromSqlRow({ n: 3, m_1: 2, d_1: 0 }, variables)).toThrow(/c_1_1: is missing/);
    expect(() => crossProductsFromSqlRow({ n: 3, m_1: 'x', d_1: 0, c_1_1: 1 }, variables)).toThrow(/m_1: must be a number/);
    expect(() => crossProductsFromSqlRow({ n: 3, s_1: 2 }, variables)).toThrow(/c_1_1: is missing/);
  });

  it('reads the centred form: means, and centred sums corrected by d_i·d_j/n over n − 1', () => {
    const input = crossProductsFromSqlRow({ N: 3n, M_1: '2', d_1: 0.3, c_1_1: 2.03 }, [{ column: 'a' }]);
    expect(input.kind).toBe('covariance');
    if (input.kind !== 'covariance') return;
    expect(input.rowCount).toBe(3);
    expect(input.means).toEqual([2]);
    expect(input.covariance[0][0]).toBeCloseTo((2.03 - 0.09 / 3) / 2, 15);
  });

  it('still reads the earlier raw form (sums and raw products), in any letter case', () => {
    const input = crossProductsFromSqlRow({ N: 3n, S_1: '6', c_1_1: 14 }, [{ column: 'a' }]);
    expect(input.kind).toBe('cross-products');
    if (input.kind !== 'cross-products') return;
    expect(input.rowCount).toBe(3);
    expect(input.sums).toEqual([6]);
    expect(input.crossProducts).toEqual([[14]]);
  });

  it("refuses a row from another calculator's query", () => {
    expect(() => crossProductsFromSqlRow({ lurk_query: 'lurk-2x2-counts', a: 1 }, [{ column: 'a' }])).toThrow(/another calculator/);
  });
});

describe('the summary query run in DuckDB matches the CSV path', () => {
  let instance: DuckDBInstance;
  async function query(sql: string): Promise<Record<string, unknown>[]> {
    const connection = await instance.connect();
    try {
      const reader = await connection.runAndReadAll(sql);
      return reader.getRowObjectsJS() as Record<string, unknown>[];
    } finally {
      connection.closeSync();
    }
  }

  beforeAll(async () => {
    instance = await DuckDBInstance.create(':memory:');
    const path = referencePath('swiss.csv').replace(/'/g, "''");
    const connection = await instance.connect();
    await connection.run(`CREATE TABLE swiss AS SELECT * FROM read_csv('${path}', header = true)`);
    await connection.run(`CREATE TABLE "swiss with gaps" AS SELECT row_number() OVER () AS row_id, * FROM read_csv('${path}', header = true)`);
    for (const [row, column] of Object.entries(BLANKED)) {
      await connection.run(`UPDATE "swiss with gaps" SET ${quoteSqlIdentifier(column)} = NULL WHERE row_id = ${row}`);
    }
    await connection.run(`ALTER TABLE "swiss with gaps" ADD COLUMN region VARCHAR`);
    await connection.run(
      `UPDATE "swiss with gaps" SET region = CASE WHEN "Catholic" > 90 OR ("Catholic" IS NULL AND row_id = 3) THEN 'south' WHEN "Catholic" > 20 THEN 'mid''land' ELSE 'north' END`,
    );
    connection.closeSync();
  });
  afterAll(() => instance?.closeSync());

  it('on R\'s swiss data: the same fit as the CSV path and as R\'s lm', async () => {
    const variables: SummaryVariable[] = ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality', 'Education', 'Fertility'].map((column) => ({ column }));
    const [row] = await query(summaryStatisticsSql({ table: 'swiss', variables }));
    const design = designFromCrossProducts(crossProductsFromSqlRow(row, variables));
    const predictors = [INTERCEPT_NAME, 'Agriculture', 'Examination', 'Catholic', 'Infant.Mortality', 'Education'];
    const fromSql = fitLeastSquares(design, { response: 'Fertility', predictors });
    const raw = regressionDataFromText(readReferenceText('swiss.csv'), {
      outcome: 'Fertility',
      treatment: 'Education',
      covariates: ['Agriculture', 'Examination', 'Catholic', 'Infant.Mortality'],
    });
    const fromCsv = fitLeastSquares(raw.design, { response: raw.outcomeColumn, predictors: raw.predictors });
    // Normal equations square the condition number; on swiss 1e-9 relative still holds.
    compareFits(fromSql, fromCsv, 1e-9);
    // R 4.2.2 lm: test/reference/ovb.json swiss (treatment Education)
    const ref = readReferenceJson('ovb.json').swiss;
    expectClose(fromSql.coefficients[5], ref.estimate, { rel: 1e-9 });
    expectClose(fromSql.standardErrors[5], ref.se, { rel: 1e-9 });
  });

  it('on NIST Longley: the certified coefficients to 8 significant digits (integer data: exact sums)', async () => {
    // NIST StRD "Longley" certified values (test/reference/longley.json). The cross-product path squares
    // the condition number; the QR path on the same data reaches 10+ digits (linearModel.test.ts).
    const path = referencePath('longley.csv').replace(/'/g, "''");
    const connection = await instance.connect();
    await connection.run(`CREATE TABLE longley AS SELECT * FROM read_csv('${path}', header = true)`);
    connection.closeSync();
    const variables: SummaryVariable[] = ['x1', 'x2', 'x3', 'x4', 'x5', 'x6', 'y'].map((column) => ({ column }));
    const [row] = await query(summaryStatisticsSql({ table: 'longley', variables }));
    const fit = fitLeastSquares(designFromCrossProducts(crossProductsFromSqlRow(row, variables)), {
      response: 'y',
      predictors: [INTERCEPT_NAME, 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'],
    });
    const cert = readReferenceJson('longley.json').certified;
    ['intercept', 'x1', 'x2', 'x3', 'x4', 'x5', 'x6'].forEach((key, i) => {
      expectClose(fit.coefficients[i], cert.coefficients[key], { rel: 1e-8 }, key);
      expectClose(fit.standardErrors[i], cert.standard_errors[key], { rel: 1e-8 }, `SE ${key}`);
    });
  });

  it('drops rows with a NULL exactly as the CSV path drops rows with NA, and codes categories alike', async () => {
    const raw = regressionDataFromText(modifiedSwissCsv(), {
      outcome: 'Fertility',
      treatment: 'Education',
      covariates: ['Agriculture', 'Examination', 'region', 'Infant.Mortality'],
    });
    expect(raw.rowsDropped).toBe(3); // row 3's blank is in Catholic, which is not chosen
    const coding = raw.categorical.find((c) => c.column === 'region')!;
    expect(coding.reference).toBe("mid'land");
    const variables: SummaryVariable[] = [
      { column: 'Agriculture' },
      { column: 'Examination' },
      ...coding.levels.slice(1).map((level) => ({ column: 'region', level })),
      { column: 'Infant.Mortality' },
      { column: 'Education' },
      { column: 'Fertility' },
    ];
    const [row] = await query(summaryStatisticsSql({ table: 'swiss with gaps', variables }));
    const design = designFromCrossProducts(crossProductsFromSqlRow(row, variables));
    expect(design.columnNames).toEqual(raw.design.columnNames);
    const fromSql = fitLeastSquares(design, { response: 'Fertility', predictors: raw.predictors });
    const fromCsv = fitLeastSquares(raw.design, { response: raw.outcomeColumn, predictors: raw.predictors });
    compareFits(fromSql, fromCsv, 1e-9);
  });
});
