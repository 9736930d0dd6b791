import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signedRanks } from '../../../src/core/signedRanks';
import { pairsSql, pairsSummaryFromSqlRow } from '../../../src/methods/pairs/pairsSql';
import { InputError } from '../../../src/core/inputProblem';
import { readReferenceText } from '../../support/reference';
import { expectClose } from '../../support/expectClose';
import { duckDbEngine, postgresEngine, type SqlEngine, type TestColumn } from '../../support/sqlEngines';

// Reference: the file path's signed ranks (src/core/signedRanks.ts, itself checked against R's psignrank and
// wilcox.test in test/core) on the same differences. Data: test/reference/rosenbaum_n40.csv (column d), plus a
// fictional set with large means and small spread, ties, zeros and missing values.
const n40 = readReferenceText('rosenbaum_n40.csv').trim().split(/\r?\n/).slice(1).map(Number);
const control = Array.from({ length: 300 }, (_, i) => 1_000_000 + ((i * 7919) % 13) * 0.25);
const treated = control.map((c, i) => (i % 17 === 0 ? c : c + (((i * 104729) % 9) - 3) * 0.5));
const treatedWithGaps: Array<number | null> = treated.map((t, i) => (i % 23 === 4 ? null : t));

const engines: Array<[string, () => Promise<SqlEngine>]> = [
  ['DuckDB', duckDbEngine],
  ['PostgreSQL', postgresEngine],
];

describe.each(engines)('the matched-pairs query on %s equals the file path', (_name, open) => {
  let engine: SqlEngine;
  beforeAll(async () => {
    engine = await open();
    const columns: TestColumn[] = [
      { name: 'id', type: 'INTEGER', values: treated.map((_, i) => i) },
      { name: 'treated bp', type: 'DOUBLE PRECISION', values: treatedWithGaps },
      { name: 'control bp', type: 'DOUBLE PRECISION', values: control },
    ];
    await engine.table(['study', 'pairs'], columns);
    await engine.table(['n40'], [{ name: 'd', type: 'DOUBLE PRECISION', values: n40 }]);
  }, 120_000);
  afterAll(async () => engine?.close());

  it('gives T, ΣR, ΣR² and the counts of a difference column (rosenbaum_n40.csv)', async () => {
    const s = pairsSummaryFromSqlRow(await engine.row(pairsSql({ table: 'n40', differenceColumn: 'd' })));
    const ref = signedRanks(n40);
    expect([s.pairs, s.zeros, s.nonZero, s.positive]).toEqual([ref.pairs, ref.zeros, ref.nonZero, ref.positive]);
    expectClose(s.statistic, ref.statistic, { rel: 1e-12 });
    expectClose(s.sumSquaredRanks, ref.sumSquaredRanks, { rel: 1e-12 });
  });

  it('gives the same from treated and control columns with large means, ties, zeros and missing values, in a schema', async () => {
    const s = pairsSummaryFromSqlRow(await engine.row(pairsSql({ table: 'study.pairs', treatedColumn: 'treated bp', controlColumn: 'control bp' })));
    const kept = treatedWithGaps.flatMap((t, i) => (t === null ? [] : [t - control[i]]));
    const ref = signedRanks(kept);
    expect(s.droppedRows).toBe(treated.length - kept.length);
    expect([s.pairs, s.zeros, s.nonZero, s.positive]).toEqual([ref.pairs, ref.zeros, ref.nonZero, ref.positive]);
    expect(ref.tiedMagnitudes).toBe(true);
    expectClose(s.statistic, ref.statistic, { rel: 1e-12 });
    expectClose(s.sumRanks, ref.sumRanks, { rel: 1e-12 });
    expectClose(s.sumSquaredRanks, ref.sumSquaredRanks, { rel: 1e-12 });
  });
});

describe('reading the matched-pairs query result', () => {
  const good = { lurk_query: 'lurk-pairs-signed-ranks', rows_read: 5, pairs: 5, zeros: 1, non_zero: 4, positive: 3, rank_sum_positive: 8, rank_sum: 10, rank_sum_squares: 30 };
  it('reads a good row', () => expect(pairsSummaryFromSqlRow(good).statistic).toBe(8));
  it('names a missing column, a negative count and an inconsistent total', () => {
    const problems = (row: Record<string, unknown>) => {
      try {
        pairsSummaryFromSqlRow(row);
        return [];
      } catch (error) {
        return (error as InputError).problems.map((p) => p.field);
      }
    };
    expect(problems({ ...good, rank_sum: undefined })).toEqual(['summary.rank_sum']);
    expect(problems({ ...good, zeros: -1 })).toEqual(['summary.zeros']);
    expect(problems({ ...good, pairs: 6, rows_read: 6 })).toEqual(['summary.pairs']);
  });
  it("recognises another calculator's query result", () => {
    expect(() => pairsSummaryFromSqlRow({ lurk_query: 'lurk-2x2-counts', a: 1 })).toThrow(/another query/);
    expect(() => pairsSummaryFromSqlRow({ n: 3, s_1: 2 })).toThrow(/another calculator/);
  });
});
