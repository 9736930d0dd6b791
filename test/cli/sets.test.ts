import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyseMatchedSets } from '../../src/core/matchedSetsAnalysis';
import { expectClose } from '../support/expectClose';
import { readReferenceJson } from '../support/reference';
import { buildCliForTest } from '../support/builtCli';

const reference = readReferenceJson('matched_sets.json');
/** Fictional data, 1 to 4 controls per set: the data set fictional_d_large_effect of test/reference/matched_sets.json. */
const demoPath = fileURLToPath(new URL('../files/matched-sets-fictional.csv', import.meta.url));
const demo = readFileSync(demoPath, 'utf8');
const ds = reference.continuous.find((d: { name: string }) => d.name === 'fictional_d_large_effect');
const columns = ['--set', 'matched_set', '--treated', 'treated', '--outcome', 'outcome'];

let cli: { lurk: string; remove(): void };
beforeAll(async () => {
  cli = await buildCliForTest();
}, 120_000);
afterAll(() => cli?.remove());

const lurk = (args: string[], input?: string) => spawnSync('node', [cli.lurk, ...args], { encoding: 'utf8', input });

describe('lurk sets (built command)', { timeout: 20_000 }, () => {
  test('the fictional file holds the reference data set: 14 sets with 1 to 4 controls', () => {
    const rows = demo.trim().split('\n').slice(1).map((line) => line.split(','));
    expect(rows.map((r) => r[0])).toEqual(ds.setIds);
    expect(rows.map((r) => Number(r[1]))).toEqual(ds.treated);
    expect(rows.map((r) => Number(r[2]))).toEqual(ds.outcomes);
  });

  test('--json gives the numbers of analyseMatchedSets and of the R base reference', () => {
    const run = lurk(['sets', '--file', demoPath, ...columns, '--gamma', reference.gammas.join(','), '--json']);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    const json = JSON.parse(run.stdout);
    const direct = analyseMatchedSets({ setIds: ds.setIds, treated: ds.treated, outcomes: ds.outcomes, gammas: reference.gammas });
    expect(json.sensitivityValue).toBe(direct.sensitivityValue);
    expect(json.rows).toEqual(direct.rows.map((r) => ({ gamma: r.gamma, pUpper: r.pUpper, pLower: r.pLower, expectation: r.expectation, variance: r.variance })));
    expect(json.estimate).toBe(direct.estimate);
    expect(json.counts.controlsPerSet).toEqual([
      { controls: 1, sets: 1 },
      { controls: 2, sets: 5 },
      { controls: 3, sets: 5 },
      { controls: 4, sets: 3 },
    ]);
    // test/reference/matched_sets.json: R 4.2.2, base only (generator test/reference/generators/matched_sets.R)
    expectClose(json.scale, ds.sigma, { rel: 1e-15 }, 'σ');
    expectClose(json.statistic, ds.statistic, { rel: 1e-12 }, 'T');
    expectClose(json.estimate, ds.estimate, { rel: 1e-6, abs: 1e-9 }, 'estimate');
    expectClose(json.sensitivityValue, ds.sensitivity_value, { rel: 1e-6 }, 'Γ*');
    ds.rows.forEach((row: Record<string, number>, i: number) => {
      expectClose(json.rows[i].pUpper, row.p_upper, { rel: 1e-8 }, `pUpper Γ = ${row.gamma}`);
      expectClose(json.rows[i].pLower, row.p_lower, { rel: 1e-8 }, `pLower Γ = ${row.gamma}`);
      expectClose(json.estimates[i].estimateLow, row.estimate_low, { rel: 1e-6, abs: 1e-9 }, `estimateLow Γ = ${row.gamma}`);
      expectClose(json.estimates[i].intervalHigh, row.interval_high, { rel: 1e-6, abs: 1e-9 }, `intervalHigh Γ = ${row.gamma}`);
    });
  });

  test('"--file -" reads standard input and gives the same report', () => {
    const fromFile = lurk(['sets', '--file', demoPath, ...columns, '--json']);
    const fromStdin = lurk(['sets', '--file', '-', ...columns, '--json'], demo);
    expect(fromStdin.status).toBe(0);
    expect(fromStdin.stdout).toBe(fromFile.stdout);
  });

  test('the readable report names the tipping Γ, the conventions and the caution', () => {
    const run = lurk(['sets', '--file', demoPath, ...columns]);
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/Tipping Γ \(sensitivity value\): 8\.804/);
    expect(run.stdout).toMatch(/Conventions:\n- Scale σ/);
    expect(run.stdout).toMatch(/does not prove causation/);
  });

  test('bad input exits 2 with one line naming the option', () => {
    const cases: [string[], RegExp][] = [
      [['--alpha', '0.7'], /^lurk sets: --alpha: must be above 0 and at most 0\.5/],
      [['--gamma', '1,0.5'], /^lurk sets: --gamma: /],
      [['--trim', 'wide'], /^lurk sets: --trim: must be a number/],
      [['--tail', 'both'], /^lurk sets: --tail: must be one of exact, normal/],
    ];
    for (const [extra, message] of cases) {
      const run = lurk(['sets', '--file', demoPath, ...columns, ...extra]);
      expect(run.status, extra.join(' ')).toBe(2);
      expect(run.stderr).toMatch(message);
      expect(run.stderr.trim().split('\n')).toHaveLength(1);
    }
    const badColumn = lurk(['sets', '--file', demoPath, '--set', 'matched_set', '--treated', 'treated', '--outcome', 'scenario']);
    expect(badColumn.status).toBe(2);
    expect(badColumn.stderr).toMatch(/^lurk sets: --outcome: column "scenario" has 52 values that are not a number/);
    const noControl = lurk(['sets', '--file', '-', '--set', 's', '--treated', 't', '--outcome', 'y'], 's,t,y\na,1,2\na,0,1\nb,1,3\nc,1,5\nc,0,2\n');
    expect(noControl.status).toBe(2);
    expect(noControl.stderr).toMatch(/^lurk sets: --treated: 1 set has no control \(set b\)/);
  }, 60_000);

  test('--help states every convention, the number rule and the caution', () => {
    const run = lurk(['sets', '--help']);
    expect(run.status).toBe(0);
    for (const words of ['σ, the scale', 'ψ(x) = max(−c, min(c, x))', '--trim', 'Score of a unit', 'the split a = 1 … n − 1', 'normal approximation 1 − Φ((T − E)/√V)', 'exact Poisson-binomial tail', 'Sets left out', 'Numbers: a decimal point', 'does not prove causation']) {
      expect(run.stdout).toContain(words);
    }
  });
});
