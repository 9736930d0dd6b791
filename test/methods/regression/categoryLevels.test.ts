import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { categoryLevelsSql, decodeCategoryLevels, encodeCategoryLevels, readCategoryLevels, summaryDesign } from '../../../src/methods/regression/categoryLevels';

describe('the levels query', () => {
  it('lists each categorical column over the complete rows, as text, in standard SQL', () => {
    const sql = categoryLevelsSql({ table: 'research."2024 visits"', columns: ['bp', 'dose', 'region'], categorical: ['region'] });
    expect(sql).toMatch(/SELECT DISTINCT 'lurk-regression-levels' AS lurk_query, 'region' AS column_name, CAST\("region" AS VARCHAR\) AS level/);
    expect(sql).toMatch(/FROM "research"\."2024 visits" WHERE "bp" IS NOT NULL AND "dose" IS NOT NULL AND "region" IS NOT NULL/);
    expect(sql).toMatch(/ORDER BY 2, 3;/);
  });
});

describe('reading the levels', () => {
  it('from the query result (CSV or JSON rows) or a JSON object, sorted by character code (the first is the reference)', () => {
    const csv = 'lurk_query,column_name,level\nlurk-regression-levels,region,south\nlurk-regression-levels,region,North\nlurk-regression-levels,region,mid\n';
    expect(readCategoryLevels(csv, ['region']).get('region')).toEqual(['North', 'mid', 'south']);
    expect(readCategoryLevels('[{"column_name": "zone", "level": 2}, {"COLUMN_NAME": "zone", "LEVEL": 10}]', ['zone']).get('zone')).toEqual(['10', '2']);
    expect(readCategoryLevels('{"region": ["b", "a"]}', ['region']).get('region')).toEqual(['a', 'b']);
  });
  it('refuses one level, a column not named categorical, a missing column and another query', () => {
    expect(() => readCategoryLevels('{"region": ["a"]}', ['region'])).toThrow(/only one level/);
    expect(() => readCategoryLevels('{"age": ["1", "2"]}', ['region'])).toThrow(/not among the categorical columns/);
    expect(() => readCategoryLevels('{"region": ["a", "b"]}', ['region', 'zone'])).toThrow(/no levels of "zone"/);
    expect(() => readCategoryLevels('lurk_query,column_name,level\nlurk-pairs-signed-ranks,region,a\n', ['region'])).toThrow(/another query/);
  });
});

describe('the design of the summary query', () => {
  it('has an indicator for each level but the reference, grouped under its covariate', () => {
    const levels = new Map([['region', ['mid', 'north', 'south']]]);
    const design = summaryDesign(['age', 'region'], 'dose', 'bp', levels);
    expect(design.variables).toEqual([{ column: 'age' }, { column: 'region', level: 'north' }, { column: 'region', level: 'south' }, { column: 'dose' }, { column: 'bp' }]);
    expect(design.covariates).toEqual([{ name: 'age', designColumns: ['age'] }, { name: 'region', designColumns: ['region=north', 'region=south'] }]);
  });
  it('writes the levels into the result and reads them back unchanged, whatever the characters', () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string({ minLength: 1 }), fc.uniqueArray(fc.string(), { minLength: 2, maxLength: 5 }), { minKeys: 1, maxKeys: 3 }), (object) => {
        const levels = new Map(Object.entries(object));
        const text = encodeCategoryLevels(levels);
        expect(text).not.toMatch(/[,"'\n]/);
        expect(decodeCategoryLevels(text)).toEqual(levels);
      }),
    );
  });
});
