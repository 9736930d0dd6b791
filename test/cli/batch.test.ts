import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';

const file = fileURLToPath(new URL('../files/batch-findings.csv', import.meta.url));

describe('lurk batch', () => {
  it('prints a readable table with each finding and its problems, and exits 3 because a row has a problem', async () => {
    const io = memoryIo();
    expect(await runLurk(['batch', file], io)).toBe(3);
    expect(io.stderr).toBe('lurk batch: 2 of 7 rows have problems (listed with the results; --keep-going exits 0)\n');
    // VanderWeele & Ding 2017 worked example: RR 3.9 (1.8–8.7) → 7.26 and 3.00
    expect(io.stdout).toMatch(/Fictional finding A.*7\.26\s+3\.00/);
    // Cinelli & Hazlett 2020 published example: RV 13.9%, RV(α = 0.05) 7.6%
    expect(io.stdout).toMatch(/Fictional finding D.*13\.9%\s+7\.6%/);
    expect(io.stdout).toContain('row 7: estimate: must be a number, got "abc"');
    expect(io.stdout).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('prints JSON with one object per row', async () => {
    const io = memoryIo();
    expect(await runLurk(['batch', file, '--json', '--keep-going'], io)).toBe(0);
    const result = JSON.parse(io.stdout);
    expect(result.rows).toHaveLength(7);
    expect(result.rows[0].eValueEstimate).toBeCloseTo(7.263034344160047, 12);
  });

  it('prints a spreadsheet-safe CSV', async () => {
    const io = memoryIo();
    expect(await runLurk(['batch', file, '--csv', '--keep-going'], io)).toBe(0);
    const rows = Papa.parse<string[]>(io.stdout.trim()).data;
    expect(rows[0][0]).toBe('row');
    expect(rows[6][1]).toBe('\'=HYPERLINK("x")');
  });

  it('exits 2 with one line naming the problem for a missing file or a bad option', async () => {
    for (const args of [['batch'], ['batch', '/no/such/file.csv'], ['batch', file, '--alpha', '2'], ['batch', file, '--json', '--csv'], ['batch', file, '--bogus']]) {
      const io = memoryIo();
      expect(await runLurk(args, io)).toBe(2);
      expect(io.stderr.trim().split('\n')).toHaveLength(1);
      expect(io.stderr).toMatch(/^lurk batch: /);
    }
  });
});
