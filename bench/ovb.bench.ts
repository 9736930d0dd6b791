// Contour redraw after an input change: analysis → both contour PlotSpecs → SVG text, for the swiss
// example (R datasets::swiss) with 4 benchmark covariates × k = 1, 2, 3. Goal: under 16 ms (one frame).
// The 1,000,000-row CLI run (`lurk ovb --file`) is measured in bench/regression.bench.ts.
// Run: npx vitest bench --run --project unit bench/ovb.bench.ts
import { bench, describe } from 'vitest';
import { analyseOvb, type OvbInput } from '../src/core/ovbAnalysis';
import { ovbContourPlot } from '../src/methods/regression/ovbContourPlot';
import { ovbExtremeScenarioPlot } from '../src/methods/regression/ovbExtremeScenarioPlot';
import { renderSvgString } from '../src/plot/svgString';
import { readFileSync } from 'node:fs';

const swiss = JSON.parse(readFileSync(new URL('../test/reference/ovb.json', import.meta.url), 'utf8')).swiss;
const base: OvbInput = {
  estimate: swiss.estimate,
  se: swiss.se,
  df: swiss.df,
  benchmarks: Object.entries<any>(swiss.benchmarks).map(([covariate, b]) => ({ covariate, outcomeT: b.t_in_main_model, treatmentT: b.t_in_D_model })),
};
let step = 0;
/** Each call changes an input (q, α, the chosen strength), as a person typing would. */
function nextInput(): OvbInput {
  step++;
  return { ...base, q: 0.5 + (step % 10) / 20, alpha: step % 2 ? 0.05 : 0.1, scenario: { r2dz: (step % 30) / 100, r2yz: (step % 17) / 50 } };
}
const options = { time: 2000, warmupIterations: 5 };

describe('contour redraw after an input change (goal < 16 ms)', () => {
  bench('analysis + estimate and t contour specs', () => {
    const result = analyseOvb(nextInput());
    ovbContourPlot(result, { kind: 'estimate' });
    ovbContourPlot(result, { kind: 't' });
  }, options);
  bench('analysis + both contour specs + SVG text', () => {
    const result = analyseOvb(nextInput());
    renderSvgString(ovbContourPlot(result, { kind: 'estimate' }));
    renderSvgString(ovbContourPlot(result, { kind: 't' }));
  }, options);
  bench('one contour spec alone (estimate)', () => {
    ovbContourPlot(analyseOvb(nextInput()), { kind: 'estimate' });
  }, options);
  bench('extreme-scenario spec + SVG text', () => {
    renderSvgString(ovbExtremeScenarioPlot(analyseOvb(nextInput())));
  }, options);
});
