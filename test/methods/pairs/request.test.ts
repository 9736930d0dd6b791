import { describe, expect, test } from 'vitest';
import { emptyPairsForm, guessPairsColumns, normalisePairsForm, pairsInputFromForm, readPairsOptions } from '../../../src/methods/pairs/request';
import { pairsFromCsvText } from '../../../src/methods/pairs/pairsFromCsv';

const form = (patch: object) => normalisePairsForm({ ...emptyPairsForm(), ...patch });

describe('typed options', () => {
  test('α with a decimal point or comma; Γ lists separated by commas, semicolons or spaces', () => {
    expect(readPairsOptions(form({ alpha: '0,05' })).alpha).toBe(0.05);
    expect(readPairsOptions(form({ gammas: '1, 1.5, 2' })).gammas).toEqual([1, 1.5, 2]);
    expect(readPairsOptions(form({ gammas: '1,5; 2; 3' })).gammas).toEqual([1.5, 2, 3]);
    expect(readPairsOptions(form({ gammas: '1 1.5 2' })).gammas).toEqual([1, 1.5, 2]);
    expect(readPairsOptions(form({ gammas: '1,2,3' })).gammas).toEqual([1, 2, 3]);
    expect(readPairsOptions(form({ gammas: '' })).gammas).toBeUndefined();
    expect(readPairsOptions(form({ alpha: 'five' })).problems[0]).toMatchObject({ field: 'alpha', code: 'not-a-number' });
    // The one field reader names the list field and the item in its message.
    expect(readPairsOptions(form({ gammas: '1, x' })).problems[0]).toMatchObject({ field: 'gammas', code: 'not-a-number', message: 'item 2 must be a number, got "x"' });
  });
});

describe('form to analysis input', () => {
  test('pasted numbers, discordant counts and a file read', () => {
    const pasted = pairsInputFromForm(form({ source: 'pasted', pasted: '1\n2\nNA\n-0.5' }), null);
    expect(pasted.problems).toEqual([]);
    expect(pasted.input?.droppedRows).toBe(1);
    const counts = pairsInputFromForm(form({ source: 'discordant', treatedOnly: '12', controlOnly: '3' }), null);
    expect(counts.input?.data).toEqual({ kind: 'discordant', treatedOnly: 12, controlOnly: 3 });
    const read = pairsFromCsvText('d\n1\n2\n3\n', { difference: 'd' });
    expect(pairsInputFromForm(form({ source: 'file' }), read).input?.data.kind).toBe('differences');
  });
  test('problems are named by the form’s fields', () => {
    const fields = (patch: object, read = null) => pairsInputFromForm(form(patch), read).problems.map((p) => p.field);
    expect(fields({ source: 'file' })).toEqual(['file']);
    expect(fields({ source: 'pasted', pasted: '0\n0\n1' })).toEqual(['pasted']);
    expect(fields({ source: 'pasted', pasted: '1\n2\n3', alpha: '2' })).toEqual(['alpha']);
    expect(fields({ source: 'pasted', pasted: '1\n2\n3', gammas: '1, 0.9' })).toEqual(['gammas[1]']);
    expect(fields({ source: 'discordant', treatedOnly: '1', controlOnly: '0' })).toEqual(['treatedOnly']);
    expect(fields({ source: 'discordant', treatedOnly: 'x', controlOnly: '' })).toEqual(['treatedOnly', 'controlOnly']);
  });
  test('saved forms are completed and cleaned', () => {
    const restored = normalisePairsForm({ source: 'pasted', pasted: '1\n2', test: 'median', alpha: 5, extra: 'x' });
    expect(restored.source).toBe('pasted');
    expect(restored.test).toBe('signrank');
    // A number where text is expected is taken as its text.
    expect(restored.alpha).toBe('5');
    expect('extra' in restored).toBe(false);
    expect(normalisePairsForm(null)).toEqual(emptyPairsForm());
  });
  test('column guesses from a header', () => {
    expect(guessPairsColumns(['pair', 'treated', 'control'])).toMatchObject({ columnsBy: 'outcomes', treatedColumn: 'treated', controlColumn: 'control' });
    expect(guessPairsColumns(['d'])).toMatchObject({ columnsBy: 'difference', differenceColumn: 'd' });
    expect(guessPairsColumns(['id', 'difference'])).toMatchObject({ columnsBy: 'difference', differenceColumn: 'difference' });
    expect(guessPairsColumns(['a', 'b'])).toMatchObject({ treatedColumn: '', controlColumn: '' });
  });
});

describe('the zero rule', () => {
  test('"pratt" (any case) reaches the analysis input; empty keeps the default; a wrong word is named by its field', () => {
    expect(pairsInputFromForm(form({ source: 'pasted', pasted: '1\n0\n2', zeros: 'Pratt' }), null).input?.zeroRule).toBe('pratt');
    expect(pairsInputFromForm({ ...form({ source: 'pasted', pasted: '1\n0\n2' }), zeros: '' }, null).input?.zeroRule).toBeUndefined();
    const bad = pairsInputFromForm({ ...form({ source: 'pasted', pasted: '1\n0\n2' }), zeros: 'drop' }, null);
    expect(bad.problems.map((p) => p.field)).toContain('zeros');
    expect(normalisePairsForm({ zeros: 'nonsense' }).zeros).toBe('wilcoxon');
  });
});
