import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCsvText } from '../../../src/data/csv';
import { twoByTwoFromCsv } from '../../../src/methods/evalue/twoByTwoFromCsv';
import { twoByTwoFromSqlRow, twoByTwoSql } from '../../../src/methods/evalue/twoByTwoSql';
import { InputError } from '../../../src/core/inputProblem';
import { duckDbEngine, postgresEngine, type SqlEngine, type TestColumn } from '../../support/sqlEngines';

// A fictional cohort: 200 people, exposure and outcome as 0/1 integers, as yes/no text and with missing cells.
// The reference is the file path (twoByTwoFromCsv on the same rows written as CSV).
const N = 200;
const exposure = Array.from({ length: N }, (_, i) => (i % 7 === 3 ? null : (i * 37) % 5 < 2 ? 1 : 0));
const outcome = Array.from({ length: N }, (_, i) => (i % 11 === 5 ? null : (i * 53 + (exposure[i] ?? 0) * 3) % 7 < 3 ? 1 : 0));
const yesNo = (v: number | null) => (v === null ? null : v === 1 ? 'Yes' : 'No');
const columns: TestColumn[] = [
  { name: 'id', type: 'INTEGER', values: exposure.map((_, i) => i + 1) },
  { name: 'cycled', type: 'INTEGER', values: exposure },
  { name: 'hypertension', type: 'INTEGER', values: outcome },
  { name: 'cycled text', type: 'VARCHAR', values: exposure.map(yesNo) },
  { name: 'bp', type: 'VARCHAR', values: outcome.map((v, i) => (i % 13 === 0 ? 'NA' : v === null ? '' : v === 1 ? 'high' : 'normal')) },
];
const csv = [columns.map((c) => `"${c.name}"`).join(','), ...exposure.map((_, i) => columns.map((c) => (c.values[i] === null ? '' : String(c.values[i]))).join(','))].join('\n');
const fromFile = (exposureColumn: string, outcomeColumn: string, exposedValues: string[] | null, outcomeValues: string[] | null) =>
  twoByTwoFromCsv(readCsvText(csv, 'file'), { exposureColumn, outcomeColumn, exposedValues, outcomeValues });

const engines: Array<[string, () => Promise<SqlEngine>]> = [
  ['DuckDB', duckDbEngine],
  ['PostgreSQL', postgresEngine],
];

describe.each(engines)('the 2×2 counting query on %s equals the file path', (_name, open) => {
  let engine: SqlEngine;
  beforeAll(async () => {
    engine = await open();
    await engine.table(['people'], columns);
    await engine.table(['research', 'cohort.2024'], columns);
  }, 120_000);
  afterAll(async () => engine?.close());

  it('counts 0/1 columns with yes found from the column, and the rows left out', async () => {
    const row = await engine.row(twoByTwoSql({ table: 'people', exposureColumn: 'cycled', outcomeColumn: 'hypertension' }));
    const sql = twoByTwoFromSqlRow(row);
    const file = fromFile('cycled', 'hypertension', null, null);
    expect(sql.counts).toEqual(file.counts);
    expect(sql.rowsMissing).toBe(file.rowsMissing);
  });

  it('counts text columns with named values, NA and empty cells missing, from a schema-qualified table with a dot in its name', async () => {
    const row = await engine.row(twoByTwoSql({ table: 'research."cohort.2024"', exposureColumn: 'cycled text', outcomeColumn: 'bp', exposedValues: ['Yes'], outcomeValues: ['high'] }));
    const sql = twoByTwoFromSqlRow(row);
    const file = fromFile('cycled text', 'bp', ['Yes'], ['high']);
    expect(sql.counts).toEqual(file.counts);
    expect(sql.rowsMissing).toBe(file.rowsMissing);
  });

  it('refuses a column that is not plainly yes/no when no values are named, as the file path does', async () => {
    const row = await engine.row(twoByTwoSql({ table: 'people', exposureColumn: 'cycled', outcomeColumn: 'bp' }));
    expect(() => twoByTwoFromSqlRow(row)).toThrow(/outcome column has values other than/);
    expect(() => fromFile('cycled', 'bp', null, null)).toThrow(InputError);
  });
});

describe('reading the counting query result', () => {
  it('names a missing or negative count by its column', () => {
    try {
      twoByTwoFromSqlRow({ lurk_query: 'lurk-2x2-counts', a: 3, b: -1, c: 'x', rows_missing: 0 });
      throw new Error('expected an error');
    } catch (error) {
      const fields = (error as InputError).problems.map((p) => p.field);
      expect(fields).toEqual(['summary.b', 'summary.c', 'summary.d']);
    }
  });

  it('recognises a row from another calculator\'s query', () => {
    expect(() => twoByTwoFromSqlRow({ lurk_query: 'lurk-regression-summary', n: 10 })).toThrow(/another query/);
    expect(() => twoByTwoFromSqlRow({ n: 10, s_1: 3 })).toThrow(/another calculator/);
  });
});
