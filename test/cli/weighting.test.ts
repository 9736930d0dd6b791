import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { spawnSync } from 'node:child_process';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';
import { expectClose } from '../support/expectClose';
import { referencePath } from '../support/reference';
import { buildCliForTest } from '../support/builtCli';
import { weightingReference as reference } from '../support/weightingData';

let cli: { lurk: string; remove(): void };
beforeAll(async () => {
  cli = await buildCliForTest();
}, 180_000);
afterAll(() => cli?.remove());

function built(args: string[]) {
  const run = spawnSync('node', [cli.lurk, 'weighting', ...args], { encoding: 'utf8' });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

async function lurk(args: string[], files: Record<string, string> = {}) {
  const io = memoryIo(files);
  const code = await runLurk(['weighting', ...args], io);
  return { code, stdout: io.stdout, stderr: io.stderr };
}

describe('the built command against R\'s reference bounds', () => {
  test.each(['ate', 'att'] as const)('mtcars, %s: point bounds equal the brute-force R values to 1e-6', (estimand) => {
    // R 4.2.2: glm(am ~ hp + wt, binomial) and brute force over every split — test/reference/weighting.json
    const ref = reference.mtcars[estimand];
    const run = built(['--file', referencePath('weighting_mtcars.csv'), '--treatment', 'am', '--outcome', 'mpg', '--estimand', estimand, '--lambda', ref.lambdas.join(','), '--bootstrap', '40', '--json']);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    const json = JSON.parse(run.stdout);
    expectClose(json.estimate.effect, ref.effect, { abs: 1e-6 });
    json.rows.forEach((row: Record<string, number>, i: number) => {
      expect(Object.keys(row)).toEqual(['lambda', 'lowestEffect', 'highestEffect', 'intervalLow', 'intervalHigh']);
      expectClose(row.lowestEffect, ref.lower[i], { abs: 1e-6 });
      expectClose(row.highestEffect, ref.upper[i], { abs: 1e-6 });
    });
    if (ref.tipping_lambda_point === null) expect(json.tippingPointStatus).toBe('beyond-range');
    else expectClose(json.tippingLambdaPoint, ref.tipping_lambda_point, { rel: 1e-6 });
    // R 4.2.2 summary.glm standard errors — test/reference/logistic_standard_errors.json
    expectClose(json.propensityModel.coefficients[1].standardError, 0.017734153650769368, { rel: 1e-6 });
  }, 60_000);

  test('fictional data (text covariate, missing cells): point bounds equal R\'s to 1e-6 and the missing rows are counted', () => {
    // R 4.2.2 on the invented fixture (complete cases, site as a factor) — test/reference/weighting.json
    const ref = reference.fictional.ate;
    const run = built(['--file', referencePath('weighting_fictional.csv'), '--treatment', 'treated', '--outcome', 'outcome', '--lambda', ref.lambdas.join(','), '--bootstrap', '0', '--json']);
    expect(run.status).toBe(0);
    const json = JSON.parse(run.stdout);
    expect(json.counts.used).toBe(reference.fictional.n);
    expect(json.counts.droppedMissing).toBe(3);
    expect(json.file.categorical).toEqual([{ column: 'site', reference: 'east', levels: 3 }]);
    json.rows.forEach((row: Record<string, number>, i: number) => {
      expectClose(row.lowestEffect, ref.lower[i], { abs: 1e-6 });
      expectClose(row.highestEffect, ref.upper[i], { abs: 1e-6 });
      expect(row.intervalLow).toBeNull();
    });
    expect(json.tippingIntervalStatus).toBe('not-available');
  }, 60_000);

  test('a fixed --seed reproduces the result exactly; another seed changes the interval', () => {
    const args = ['--file', referencePath('weighting_fictional.csv'), '--treatment', 'treated', '--outcome', 'outcome', '--bootstrap', '60', '--json'];
    const a = JSON.parse(built([...args, '--seed', '7']).stdout);
    const b = JSON.parse(built([...args, '--seed', '7']).stdout);
    const c = JSON.parse(built([...args, '--seed', '8']).stdout);
    expect(b.rows).toEqual(a.rows);
    expect(b.tippingLambdaInterval).toBe(a.tippingLambdaInterval);
    expect(c.rows[0].intervalLow).not.toBe(a.rows[0].intervalLow);
  }, 90_000);

  test('bad input to the built command exits 2 with one line naming the option', () => {
    const run = built(['--file', referencePath('weighting_mtcars.csv'), '--treatment', 'am', '--outcome', 'mpg', '--bootstrap', '2.5']);
    expect(run.status).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/^lurk weighting: --bootstrap: must be a whole number/);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
  }, 60_000);

  test('--help states the conventions and the caution', () => {
    const run = spawnSync('node', [cli.lurk, 'weighting', '--help'], { encoding: 'utf8' });
    expect(run.status).toBe(0);
    for (const phrase of ['Hájek', 'Weight boxes', 'sorting each group', 'stratified', 'quantile type 7', '801 log-spaced', 'Trimming', 'Numbers:', 'does not prove causation']) {
      expect(run.stdout).toContain(phrase);
    }
  }, 60_000);
});

describe('bad input exits 2 with one line naming the option', () => {
  const files = {
    'w.csv': 'treated,outcome,age,grade\n1,3.5,40,a\n0,2.1,51,b\n1,4.0,38,a\n0,1.9,60,b\n1,3.1,45,b\n0,2.5,58,a\n',
    'y.csv': 'treated,outcome,age\n1,3.5,40\n2,2.1,51\n1,4.0,38\n0,1.9,60\n',
    'o.csv': 'treated,outcome,age\n1,3.5,40\n0,high,51\n1,4.0,38\n0,1.9,60\n',
  };
  const base = ['--file', 'w.csv', '--treatment', 'treated', '--outcome', 'outcome'];
  test.each([
    [['--treatment', 'treated', '--outcome', 'outcome'], /^lurk weighting: --file: give a CSV file/],
    [['--file', 'w.csv', '--outcome', 'outcome'], /^lurk weighting: --treatment: is required/],
    [['--file', 'w.csv', '--treatment', 'dose', '--outcome', 'outcome'], /^lurk weighting: --treatment: "dose" is not a column of the file/],
    [['--file', 'y.csv', '--treatment', 'treated', '--outcome', 'outcome'], /^lurk weighting: --treatment: column "treated" must hold 0 \(control\) or 1 \(treated\): 1 value is not \(first at data row 2: "2"\)/],
    [['--file', 'o.csv', '--treatment', 'treated', '--outcome', 'outcome'], /^lurk weighting: --outcome: column "outcome" must hold numbers: 1 value is not \(first at data row 2: "high"\)/],
    [[...base, '--covariates', 'age,height'], /^lurk weighting: --covariates: "height" is not a column/],
    [[...base, '--estimand', 'atc'], /^lurk weighting: --estimand: must be one of ate, att/],
    [[...base, '--lambda', '1,0.5'], /^lurk weighting: --lambda: Λ must be at least 1/],
    [[...base, '--bootstrap', '-3'], /^lurk weighting: --bootstrap: must be a whole number/],
    [[...base, '--seed', '1.5'], /^lurk weighting: --seed: must be a whole number/],
    [[...base, '--alpha', '1.5'], /^lurk weighting: --alpha: must be between 0 and 1/],
    [[...base, '--trim-below', '0.1'], /^lurk weighting: --trim-above: trimming needs both bounds/],
    [[...base, '--trim-below', '0.6', '--trim-above', '0.9'], /^lurk weighting: --trim-below: needs below in \[0, 0\.5\)/],
    [['--file', 'missing.csv', '--treatment', 't', '--outcome', 'y'], /^lurk weighting: --file: "missing.csv": no such file\n$/],
    [[...base, '--frobnicate'], /^lurk weighting: --frobnicate: is not an option/],
  ])('%j', async (args, message) => {
    const { code, stderr, stdout } = await lurk(args as string[], files);
    expect(stdout).toBe('');
    expect(stderr).toMatch(message);
    expect(code).toBe(2);
    expect(stderr.trim().split('\n')).toHaveLength(1);
  });
});
