import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { fileURLToPath } from 'node:url';
import { memoryIo } from '../../src/cli/cliIo';
import { runLurk } from '../../src/cli/main';
import { BATCH_RV_RULE } from '../../src/workspace/batchFindings';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';

// The command line's new options and words: --design, --zeros, --se-kind, --times-outcome, and the batch rule.
const pratt = readReferenceJson('pratt_signed_rank.json');
const plainWords = readReferenceJson('plain_words_cases.json');
const batchFile = fileURLToPath(new URL('../files/batch-findings.csv', import.meta.url));

async function lurk(args: string[], files: Record<string, string> = {}) {
  const io = memoryIo(files);
  const code = await runLurk(args, io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

describe('lurk pairs --zeros', () => {
  const set = (pratt.datasets ?? pratt).zeros_and_ties;
  const csv = 'diff\n' + set.differences.join('\n') + '\n';
  it('pratt ranks the zeros and scores them 0 (R: exact p at Γ = 1 from pratt_signed_rank.json)', async () => {
    const { code, stdout } = await lurk(['pairs', '--file', 'd.csv', '--diff', 'diff', '--zeros', 'pratt', '--method', 'exact', '--json'], { 'd.csv': csv });
    expect(code).toBe(0);
    const json = JSON.parse(stdout);
    expect(json.zeroRule).toBe('pratt');
    expectClose(json.pValue, set.pratt.by_gamma[0].greater_upper, { rel: 1e-9 });
    expect(json.conventions.map((c: { id: string }) => c.id)).toContain('zero-differences');
  });
  it('the default is Wilcoxon’s rule (R: p = 0.0410 with the zeros dropped); a wrong word exits 2 naming --zeros', async () => {
    const json = JSON.parse((await lurk(['pairs', '--file', 'd.csv', '--diff', 'diff', '--method', 'exact', '--json'], { 'd.csv': csv })).stdout);
    expect(json.zeroRule).toBe('wilcoxon');
    expectClose(json.pValue, set.wilcoxon.by_gamma[0].greater_upper, { rel: 1e-9 });
    const bad = await lurk(['pairs', '--file', 'd.csv', '--diff', 'diff', '--zeros', 'drop'], { 'd.csv': csv });
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--zeros/);
  });
  it('the help states --zeros, the conventions and the measured error of the normal approximation', async () => {
    const { stdout } = await lurk(['pairs', '--help']);
    expect(stdout).toMatch(/--zeros Z +signed-rank test: wilcoxon/);
    expect(stdout).toMatch(/Conventions/);
    expect(stdout).toMatch(/relative error near p = 0\.05 was measured at up to\s+0\.7%/);
  });
});

describe('lurk ovb --se-kind and --times-outcome', () => {
  const args = ['ovb', '--estimate', '0.5', '--se', '0.2', '--df', '100', '--covariate-t', 'age=1.5:2'];
  it('a robust SE is warned about and its adjusted t-values are not used', async () => {
    const { code, stdout } = await lurk([...args, '--k', '3', '--se-kind', 'robust']);
    expect(code).toBe(0);
    expect(stdout).toMatch(/Note: The standard error is robust/);
    expect(stdout).toMatch(/its t is not shown/);
  });
  it('--times-outcome gives k_Y beside k (R, Cinelli & Hazlett 2020: adjusted estimate 0.4114 for k_D 1, k_Y 2)', async () => {
    const { code, stdout } = await lurk([...args, '--k', '1', '--times-outcome', '2', '--json']);
    expect(code).toBe(0);
    const row = JSON.parse(stdout).benchmarks[0];
    expect(row).toMatchObject({ kTreatment: 1, kOutcome: 2, informative: true });
    expectClose(row.correctedEstimate, plainWords.ovb_times_outcome.adjusted, { rel: 1e-10 });
  });
  it('a list of the wrong length exits 2 naming --times-outcome; the help states both options', async () => {
    const bad = await lurk([...args, '--k', '1,2', '--times-outcome', '3']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--times-outcome/);
    const { stdout } = await lurk(['ovb', '--help']);
    expect(stdout).toMatch(/--times-outcome/);
    expect(stdout).toMatch(/--se-kind +how the reported standard error was computed/);
    expect(stdout).toMatch(/strongest measured covariate is the benchmark/);
  });
});

describe('lurk evalue --design', () => {
  it('a cohort table with a common outcome: its own risk ratio (R: E-value 3.41)', async () => {
    const { stdout } = await lurk(['evalue', '--counts', '30,70,15,85', '--measure', 'or', '--outcome-prevalence', 'common', '--design', 'cohort', '--json']);
    expectClose(JSON.parse(stdout).eValueEstimate, plainWords.cohort_table.eValueEstimate, { rel: 1e-12 });
  });
  it('case-control with rr exits 2 naming --design', async () => {
    const bad = await lurk(['evalue', '--counts', '30,70,15,85', '--measure', 'rr', '--design', 'case-control']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--design/);
  });
});

describe('lurk batch: robustness values for coef rows only', () => {
  it('the help says so', async () => {
    const { stdout } = await lurk(['batch', '--help']);
    expect(stdout).toContain(BATCH_RV_RULE.slice(0, 60));
    expect(stdout).not.toMatch(/Where se and df are both given, robustness values are added/);
  });
  it('the text report and the CSV say so', async () => {
    const text = await lurk(['batch', batchFile]);
    expect(text.stdout).toContain(BATCH_RV_RULE);
    const csv = await lurk(['batch', batchFile, '--csv']);
    const rows = Papa.parse<string[]>(csv.stdout.trim()).data;
    const note = rows[0].indexOf('rv_note');
    expect(note).toBeGreaterThan(0);
    const measure = rows[0].indexOf('measure');
    for (const row of rows.slice(1)) {
      if (row[measure] === 'coef') expect(row[note]).toBe('');
      else expect(row[note]).toMatch(/coef rows only/);
    }
  });
});

describe('settings echoed as typed', () => {
  it('lurk pairs --alpha 0.10 prints α = 0.10, not 0.1', async () => {
    const { stdout } = await lurk(['pairs', '--file', 'a.csv', '--diff', 'diff', '--alpha', '0.10'], { 'a.csv': 'diff\n1\n2\n3\n-1\n4\n5\n' });
    expect(stdout).toMatch(/one-sided\), α = 0\.10\./);
  });
  it('lurk ovb echoes the estimate, SE, q and α as typed', async () => {
    const { stdout } = await lurk(['ovb', '--estimate', '0.50', '--se', '0.20', '--df', '100', '--alpha', '0.050', '--q', '1.0']);
    expect(stdout).toMatch(/ estimate +0\.50\n/);
    expect(stdout).toMatch(/ standard error +0\.20\n/);
    expect(stdout).toMatch(/RV \(q = 1\.0\)/);
    expect(stdout).toMatch(/at α = 0\.050 /);
  });
});
