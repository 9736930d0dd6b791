// Appraisal files and share links made hostile: damaged fields, saved summaries of every shape, inputs of any
// type, tampered links. Reading never crashes; a file is refused with the path of a field, or its statement
// (Markdown, LaTeX, HTML) and bottom line hold no NaN/undefined/Infinity/"not available".
import fc from 'fast-check';

import { describe, expect, it } from 'vitest';
import { createAppraisal, readAppraisal, type Appraisal } from '../../src/workspace/appraisal';
import { buildRobustnessStatement, renderRobustnessStatement } from '../../src/workspace/robustnessStatement';
import { buildBottomLine } from '../../src/workspace/bottomLine';
import { decodeShareFragment, encodeShareFragment, fragmentOfJson } from '../../src/workspace/shareLink';
import { METHODS } from '../../src/methods/registry';
import { crc32 } from '../../src/data/crc32';
import { fictionalStudy } from '../../src/demo/fictionalStudy';
import { expectCleanText, FUZZ_RUNS, FUZZ_SEED, hostileValue, LEAKS } from './hostileInput';

/** A valid appraisal of the fictional demo study (every method with inputs and its own summary), as JSON. */
function demoAppraisal(): Record<string, any> {
  const demo = fictionalStudy();
  const calculators: Record<string, unknown> = {};
  for (const method of METHODS) {
    const form = method.form.normalise((demo.inputs as Record<string, unknown>)[method.id]);
    calculators[method.id] = { inputs: form, summary: method.workspace.summaryFromForm(form) };
  }
  return JSON.parse(JSON.stringify(createAppraisal(demo.study, calculators as never, new Date('2026-01-02T03:04:05Z'))));
}
const DEMO = demoAppraisal();

/** Any JSON value, shallow: what a damaged field may hold. */
const anyJson = fc.oneof(
  hostileValue,
  fc.constantFrom(null, true, false, 0, -1, 1, 3.9, 1e308, -1e308, 5e-324, 0.5, 2, 1e9),
  fc.constantFrom('{}', '[]', '[null]').map((text) => JSON.parse(text) as unknown),
  fc.dictionary(fc.constantFrom('a', 'name', 'kind', 'x'), hostileValue, { maxKeys: 2 }),
  fc.array(fc.oneof(hostileValue, fc.constant(null), fc.constant('{}').map((t) => JSON.parse(t) as unknown)), { maxLength: 3 }),
);

/** Every path to a field of the demo appraisal (objects and arrays), to damage one of them. */
function paths(value: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  if (value === null || typeof value !== 'object') return [prefix];
  const keys = Array.isArray(value) ? value.map((_, i) => i) : Object.keys(value);
  return [prefix, ...keys.flatMap((k) => paths((value as Record<string | number, unknown>)[k], [...prefix, k]))];
}
const PATHS = paths(DEMO).filter((p) => p.length > 0);
/** Fields a summary may have, to add where they are missing (e.g. a file saved with the data source). */
const EXTRA_KEYS = ['measure', 'references', 'amplification', 'benchmarks', 'rangeAt', 'kind', 'source', 'fileName', 'n', 'target', 'targetIsNull', 'sensitivityStatus'];

const edit = fc.oneof(
  { weight: 5, arbitrary: fc.tuple(fc.constantFrom(...PATHS), anyJson).map(([path, value]) => ({ path, value, remove: false })) },
  { weight: 2, arbitrary: fc.constantFrom(...PATHS).map((path) => ({ path, value: undefined, remove: true })) },
  {
    weight: 2,
    arbitrary: fc
      .tuple(fc.nat(METHODS.length - 1), fc.constantFrom(...EXTRA_KEYS), anyJson)
      .map(([index, key, value]) => ({ path: ['findings', index, 'summary', key], value, remove: false })),
  },
);

function applyEdits(base: Record<string, any>, edits: { path: (string | number)[]; value: unknown; remove: boolean }[], fileSource: boolean): Record<string, any> {
  const copy = JSON.parse(JSON.stringify(base));
  // With the data source "file", each method's statement comes from its saved summary (the rows are not saved).
  if (fileSource) for (const finding of copy.findings) finding.inputs.source = 'file';
  for (const { path, value, remove } of edits) {
    let at = copy;
    for (const key of path.slice(0, -1)) {
      if (at === null || typeof at !== 'object') break;
      at = at[key];
    }
    if (at === null || typeof at !== 'object') continue;
    if (remove) delete at[path[path.length - 1] as string];
    else at[path[path.length - 1] as string] = value === undefined ? undefined : JSON.parse(JSON.stringify(value));
  }
  return copy;
}

function expectStatementsClean(appraisal: Appraisal, where: string): void {
  const statement = buildRobustnessStatement(appraisal);
  for (const format of ['md', 'tex', 'html'] as const) expectCleanText(renderRobustnessStatement(statement, format), `${where} (${format})`);
  const line = buildBottomLine(appraisal);
  expectCleanText([...line.howStrong, ...line.comparedWithMeasured, ...line.wouldChange, ...line.wouldNotChange, line.caution].join('\n'), `${where} (bottom line)`);
}

describe('appraisal files, damaged', () => {
  it('the demo appraisal is valid, and every damaged copy is refused with a field path or written cleanly', () => {
    expect(readAppraisal(DEMO).problems).toEqual([]);
    fc.assert(
      fc.property(fc.array(edit, { minLength: 1, maxLength: 3 }), fc.boolean(), (edits, fileSource) => {
        const json = applyEdits(DEMO, edits, fileSource);
        const read = readAppraisal(json);
        // A name typed as "Infinity" is quoted back as typed: only values that are not such text are checked.
        const typedLeak = edits.some((e) => JSON.stringify(e.value ?? null).match(LEAKS));
        if (read.appraisal === null) {
          expect(read.problems.length).toBeGreaterThan(0);
          expect(read.problems[0].field).toMatch(/^(appraisal|format|version|savedAt|study|findings|calculators)\b/);
          expect(read.problems[0].message).not.toMatch(/undefined|NaN|\[object Object\]/);
          return;
        }
        if (!typedLeak) expectStatementsClean(read.appraisal, JSON.stringify(edits));
      }),
      { seed: FUZZ_SEED, numRuns: FUZZ_RUNS },
    );
  }, 120_000);

  it('inputs of any type (numbers, lists, objects, hostile text) are read or refused, never crash a statement', () => {
    const inputsOf = fc.dictionary(fc.constantFrom('source', 'measure', 'estimate', 'lower', 'upper', 'se', 'target', 'level', 'df', 'alpha', 'k', 'q', 'pasted', 'gammas', 'test', 'counts', 'confounders', 'covariateTs', 'exposedValues'), anyJson, { maxKeys: 6 });
    fc.assert(
      fc.property(fc.record({ evalue: inputsOf, pairs: inputsOf, regression: inputsOf }, { requiredKeys: [] }), (inputs) => {
        const findings = Object.entries(inputs).map(([id, form]) => ({ id, method: id, name: id, inputs: form, summary: null }));
        const read = readAppraisal(JSON.parse(JSON.stringify({ ...DEMO, findings })));
        if (read.appraisal) expectStatementsClean(read.appraisal, JSON.stringify(inputs));
        else expect(read.problems[0].field).toMatch(/^findings\[\d+\]\.inputs\b/);
      }),
      { seed: FUZZ_SEED, numRuns: FUZZ_RUNS },
    );
  }, 120_000);
});

/** A share fragment with valid check digits for any JSON (as a deliberate editor would make it), in link format 1. */
function fragmentOf(json: unknown): string {
  const bytes = new TextEncoder().encode(JSON.stringify(json));
  const check = crc32(bytes).toString(16).padStart(8, '0');
  return `#appraisal=1.${Buffer.from(bytes).toString('base64url')}.${check}`;
}

describe('share links, tampered', () => {
  const link = encodeShareFragment(DEMO as Appraisal);
  it('a link with changed, cut or added characters is refused with a message, or opens an appraisal written cleanly', () => {
    const alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_.=#%!é';
    const tamper = fc.oneof(
      fc.tuple(fc.nat(link.length - 1), fc.constantFrom(...alphabet)).map(([i, c]) => link.slice(0, i) + c + link.slice(i + 1)),
      fc.tuple(fc.nat(link.length - 1), fc.nat(40)).map(([i, n]) => link.slice(0, i) + link.slice(i + n)),
      fc.tuple(fc.nat(link.length - 1), fc.string({ maxLength: 8 })).map(([i, s]) => link.slice(0, i) + s + link.slice(i)),
      fc.string({ maxLength: 60 }).map((s) => `#appraisal=${s}`),
      // A deliberate edit with fresh check digits: the check digits catch damage, not edits; the reader must still hold.
      fc.tuple(fc.array(edit, { minLength: 1, maxLength: 2 }), fc.boolean()).map(([edits, file]) => fragmentOf(applyEdits(DEMO, edits, file))),
      fc.tuple(fc.array(edit, { minLength: 1, maxLength: 2 }), fc.boolean()).map(([edits, file]) => fragmentOfJson(applyEdits(DEMO, edits, file))),
    );
    fc.assert(
      fc.property(tamper, (fragment) => {
        const decoded = decodeShareFragment(fragment);
        if (decoded.appraisal === null) {
          expect(decoded.problems[0].field).toBe('link');
          expect(decoded.problems[0].message).not.toMatch(/undefined|NaN|\[object Object\]/);
        } else expectStatementsClean(decoded.appraisal, fragment.slice(0, 80));
      }),
      { seed: FUZZ_SEED, numRuns: FUZZ_RUNS },
    );
  }, 120_000);
});
