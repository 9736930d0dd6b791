import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';

// The appraisal file holds the summaries of three analyses of outside reference inputs:
// VanderWeele & Ding 2017 (RR 3.9, 1.8–8.7 → 7.26 and 3.00); R 4.2.2 rosenbaum.json small_n15 (exact signed-rank
// sensitivity value 1.6118…, shown floored to 1.611); Cinelli & Hazlett 2020 (t = 4.18, df = 783 → RV 13.9%, RV at α = 0.05 7.6%).
const file = fileURLToPath(new URL('../files/appraisal-reference.json', import.meta.url));

describe('lurk report', () => {
  it('prints the Markdown statement with the E-value, tipping Γ and RV', async () => {
    const io = memoryIo();
    expect(await runLurk(['report', file], io)).toBe(0);
    expect(io.stdout).toContain('## Sensitivity to unmeasured confounding: Fictional example for testing');
    expect(io.stdout).toContain('is 7.26');
    expect(io.stdout).toContain('Γ = 1.611');
    expect(io.stdout).toContain('13.9%');
    expect(io.stdout).toContain('### References');
  });

  it('prints LaTeX and HTML', async () => {
    const tex = memoryIo();
    expect(await runLurk(['report', file, '--format', 'tex'], tex)).toBe(0);
    expect(tex.stdout).toContain('$\\Gamma$ = 1.611');
    const html = memoryIo();
    expect(await runLurk(['report', file, '--format', 'html'], html)).toBe(0);
    expect(html.stdout).toMatch(/^<section class="lurk-robustness-statement">/);
  });

  it('prints the bottom line with the caution', async () => {
    const io = memoryIo();
    expect(await runLurk(['report', file, '--bottom-line'], io)).toBe(0);
    expect(io.stdout).toContain('at least 7.26 times as likely');
    expect(io.stdout).toContain('licensed practice');
  });

  it('exits 2 with one line for a bad format, a missing file, a non-JSON or a wrong file', async () => {
    const cases: [string[], Record<string, string>, RegExp][] = [
      [['report', file, '--format', 'docx'], {}, /--format: must be one of md, tex, html/],
      [['report', '/no/such.json'], {}, /APPRAISAL: cannot read/],
      [['report', 'x.json'], { 'x.json': 'not json' }, /APPRAISAL: is not a JSON file/],
      [['report', 'y.json'], { 'y.json': '{"format":"lurk-appraisal","version":9}' }, /APPRAISAL: version is 9, made by a newer Lurk/],
    ];
    for (const [args, files, message] of cases) {
      const io = memoryIo(files);
      expect(await runLurk(args, io)).toBe(2);
      expect(io.stderr).toMatch(message);
      expect(io.stderr.trim().split('\n')).toHaveLength(1);
    }
  });
});
