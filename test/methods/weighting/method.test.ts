import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { buildCliForTest } from '../../support/builtCli';
import { referencePath } from '../../support/reference';
import { weightingResultJson } from '../../../src/methods/weighting/report';
import { readWeightingSettings } from '../../../src/methods/weighting/request';
import { analyseWeightingStream } from '../../../src/methods/weighting/runner';
import { textSource } from '../../../src/methods/weighting/weightingData';
import { weightingFormFromOptions, weightingMethod, weightingOptionOf } from '../../../src/methods/weighting/method';
import { methodByCommand, methodById } from '../../../src/methods/registry';

let cli: { lurk: string; remove(): void };
beforeAll(async () => {
  cli = await buildCliForTest();
}, 180_000);
afterAll(() => cli?.remove());

describe('the command line and the page give the same result', () => {
  test('fictional data, B = 50: the CLI (two threads) equals the page path (one thread, pieces of 25) exactly', async () => {
    const options = { file: referencePath('weighting_fictional.csv'), treatment: 'treated', outcome: 'outcome', bootstrap: '50', seed: '11', lambda: '1,1.5,2', estimand: 'att' };
    const run = spawnSync('node', [cli.lurk, 'weighting', ...Object.entries(options).flatMap(([k, v]) => [`--${k}`, v]), '--json'], { encoding: 'utf8' });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    const fromCli = JSON.parse(run.stdout);
    const form = weightingFormFromOptions(options);
    const page = await analyseWeightingStream(textSource(readFileSync(options.file, 'utf8')), readWeightingSettings(form));
    const fromPage = JSON.parse(JSON.stringify(weightingResultJson(page.analysis, page.read)));
    expect(fromCli).toEqual(fromPage);
    expect(fromCli.bootstrap.requested).toBe(50);
  }, 120_000);
});

describe('the method module', () => {
  test('is registered under id and command "weighting", shown by <lurk-weighting>', () => {
    expect(methodById('weighting')).toBe(weightingMethod);
    expect(methodByCommand('weighting')).toBe(weightingMethod);
    expect(weightingMethod.title).toBe('Weighting');
    expect(weightingMethod.view.element).toBe('lurk-weighting');
  });
  test('form fields and analysis fields name their options', () => {
    expect(weightingOptionOf('lambdas[2]')).toBe('--lambda');
    expect(weightingOptionOf('covariates[0].values')).toBe('--covariates');
    expect(weightingOptionOf('trim')).toBe('--trim-below');
    expect(weightingOptionOf('trimAbove')).toBe('--trim-above');
    expect(weightingOptionOf('fileName')).toBe('--file');
  });
  test('options become the form as typed; settings not given keep the form defaults', () => {
    const form = weightingFormFromOptions({ file: 'a.csv', treatment: 't', outcome: 'y', lambda: '1;1,5' });
    expect(form).toMatchObject({ fileName: 'a.csv', treatment: 't', outcome: 'y', lambdas: '1;1,5', bootstrap: '1000', seed: '1', alpha: '0.05', estimand: 'ate' });
  });
  test('a file is needed again to recompute: the saved summary stands in', () => {
    expect(weightingMethod.workspace.needsData(weightingMethod.form.empty())).toBe(true);
    expect(weightingMethod.workspace.summaryFromForm(weightingMethod.form.empty())).toBeNull();
  });
});
