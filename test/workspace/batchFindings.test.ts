import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { appraiseBatchCsv } from '../../src/workspace/batchFindings';
import { InputError } from '../../src/core/inputProblem';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

const batchText = readFileSync(new URL('../files/batch-findings.csv', import.meta.url), 'utf8');
const evalues = readReferenceJson('evalues.json');
const ovb = readReferenceJson('ovb.json');
const reference = (id: string) => evalues.cases.find((c: { id: string }) => c.id === id);

describe('appraiseBatchCsv', () => {
  const result = appraiseBatchCsv(batchText);

  it('gives the E-values of the reference cases row by row', () => {
    // VanderWeele & Ding 2017 worked example: RR 3.9 (1.8, 8.7) → 7.26 and 3.00; exact values from R 4.2.2 (evalues.json)
    expectClose(result.rows[0].eValueEstimate!, reference('rr_published').evalue_point, { rel: 1e-12 });
    expectClose(result.rows[0].eValueInterval!, 3, { rel: 1e-12 });
    // R 4.2.2 closed forms, evalues.json cases rr_protective and rr_ci_crosses_1
    expectClose(result.rows[1].eValueEstimate!, reference('rr_protective').evalue_point, { rel: 1e-12 });
    expectClose(result.rows[1].eValueInterval!, reference('rr_protective').evalue_ci, { rel: 1e-12 });
    expect(result.rows[2].eValueInterval).toBe(1);
  });

  it('gives robustness values where SE and df are given', () => {
    // Cinelli & Hazlett 2020 published example: t = 4.18, df = 783 → partial R² 2.2%, RV 13.9%, RV(α = 0.05) 7.6%;
    // exact values from R 4.2.2 in ovb.json
    const row = result.rows[3];
    expect(row.eValueEstimate).toBeNull();
    expectClose(row.partialR2!, ovb.published_example.R2yd, { rel: 1e-12 });
    expectClose(row.rv!, ovb.published_example.RV_1, { rel: 1e-10 });
    expectClose(row.rvAlpha!, ovb.published_example['RV_1_0.05'], { rel: 1e-10 });
  });

  it('keeps going past a bad row and says what is wrong with it, naming the column', () => {
    expect(result.rows[4].problem).toMatch(/^outcome_prevalence: /);
    // The same message as the page and the command line give for the same text (one number reader).
    expect(result.rows[6].problem).toBe('estimate: must be a number, got "abc"');
    expect(result.rows[5].eValueEstimate).not.toBeNull();
    expect(result.computed).toBe(5); // four E-values and the coefficient's robustness values
    expect(result.withProblems).toBe(2);
  });

  it('refuses a file without a measure or estimate column, naming the column', () => {
    try {
      appraiseBatchCsv('label,measure,est\nx,rr,1\n');
      throw new Error('expected an error');
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      expect((error as InputError).problems[0].message).toMatch(/no column named "estimate"/);
    }
  });
});

describe('appraiseBatchStream', () => {
  it('gives the same rows as the whole-text reader, whatever the chunk size', async () => {
    const { appraiseBatchStream } = await import('../../src/workspace/batchFindings');
    const whole = appraiseBatchCsv(batchText);
    for (const size of [3, 64, 1 << 20]) {
      const bytes = new TextEncoder().encode(batchText);
      const chunks = (async function* () {
        for (let i = 0; i < bytes.length; i += size) yield bytes.slice(i, i + size);
      })();
      const streamed = await appraiseBatchStream(chunks);
      expect(streamed.rows).toEqual(whole.rows);
      expect(streamed.warnings).toEqual(whole.warnings);
    }
  });
});
