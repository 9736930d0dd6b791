import { analyseEValue } from '../../src/core/eValueAnalysis';
import { assessReferenceConfounder } from '../../src/core/referenceConfounder';
import { analyseOvb } from '../../src/core/ovbAnalysis';
import { analysePairs } from '../../src/core/pairsAnalysis';
import { fictionalPairDifferences, fictionalStudy } from '../../src/demo/fictionalStudy';
import { jointStrengthPlot } from '../../src/methods/evalue/jointStrengthPlot';
import { ovbContourPlot } from '../../src/methods/regression/ovbContourPlot';
import { ovbExtremeScenarioPlot } from '../../src/methods/regression/ovbExtremeScenarioPlot';
import { pValueByGammaPlot } from '../../src/methods/pairs/pValueByGammaPlot';
import { estimateRangePlot } from '../../src/methods/pairs/estimateRangePlot';
import { amplificationPlot } from '../../src/methods/pairs/amplificationPlot';
import type { PlotSpec } from '../../src/plot/plotSpec';

/**
 * Every figure of every calculator, for the demo (src/demo/fictionalStudy.ts, fictional) and for crowded
 * cases made up for these tests (many close benchmarks with long names, tiny ranges, huge ranges).
 */
export function figureCases(): { name: string; spec: PlotSpec }[] {
  const study = fictionalStudy().study;
  const cases: { name: string; spec: PlotSpec | null }[] = [];

  // E-value: the demo's risk ratio 0.72 (0.61 to 0.85) with its two reference confounders.
  const demoE = analyseEValue({ measure: 'rr', estimate: 0.72, lower: 0.61, upper: 0.85 });
  const demoConfounders = [
    { name: 'leisure-time exercise', rrExposure: 1.8, rrOutcome: 1.5 },
    { name: 'smoking', rrExposure: 1.3, rrOutcome: 1.6 },
  ].map((c) => assessReferenceConfounder(demoE, c));
  cases.push({ name: 'evalue demo', spec: jointStrengthPlot(demoE, { study, confounders: demoConfounders }) });
  const crowdedConfounders = Array.from({ length: 14 }, (_, i) => ({
    name: `neighbourhood deprivation index, quintile ${i + 1}`,
    rrExposure: 1.5 + 0.01 * i,
    rrOutcome: 1.6 + 0.008 * i,
  })).map((c) => assessReferenceConfounder(demoE, c));
  cases.push({ name: 'evalue crowded', spec: jointStrengthPlot(demoE, { study, confounders: crowdedConfounders }) });
  const huge = analyseEValue({ measure: 'rr', estimate: 4e5, lower: 3e5, upper: 6e5 });
  cases.push({ name: 'evalue huge', spec: jointStrengthPlot(huge, { study, confounders: [assessReferenceConfounder(huge, { name: 'a', rrExposure: 2, rrOutcome: 2 })] }) });
  const barely = analyseEValue({ measure: 'rr', estimate: 1.0004, lower: 0.9, upper: 1.1 });
  cases.push({ name: 'evalue tiny', spec: jointStrengthPlot(barely, { study }) });

  // Regression: the demo's table, then twenty close covariates, then a tiny estimate.
  const demoOvb = analyseOvb({
    estimate: -4.1,
    se: 1.2,
    df: 1482,
    k: [1, 2, 3],
    benchmarks: [
      { covariate: 'age', outcomeT: 9.5, treatmentT: -3.1 },
      { covariate: 'body-mass index', outcomeT: 7.2, treatmentT: -2.0 },
      { covariate: 'smoking', outcomeT: 2.8, treatmentT: -1.5 },
    ],
  });
  const crowdedOvb = analyseOvb({
    estimate: -4.1,
    se: 1.2,
    df: 1482,
    k: [1, 2, 3],
    scenario: { r2dz: 0.004, r2yz: 0.004 },
    benchmarks: Array.from({ length: 20 }, (_, i) => ({ covariate: `household income band ${i + 1}`, outcomeT: 2 + 0.05 * i, treatmentT: -1.5 - 0.03 * i })),
  });
  const tinyOvb = analyseOvb({ estimate: 2e-7, se: 1e-7, df: 40, benchmarks: [{ covariate: 'x', outcomeT: 0.2, treatmentT: 0.1 }] });
  for (const [label, r] of [
    ['demo', demoOvb],
    ['crowded', crowdedOvb],
    ['tiny', tinyOvb],
  ] as const) {
    cases.push({ name: `regression estimate ${label}`, spec: ovbContourPlot(r, { kind: 'estimate', study }) });
    cases.push({ name: `regression t ${label}`, spec: ovbContourPlot(r, { kind: 't', study }) });
    cases.push({ name: `regression extreme ${label}`, spec: ovbExtremeScenarioPlot(r, { study }) });
  }

  // Matched pairs: the demo's 90 differences; a tiny-range study; many Γ values.
  const demoPairs = analysePairs({ data: { kind: 'differences', differences: fictionalPairDifferences() }, test: 'signrank', alternative: 'less' });
  const tinyPairs = analysePairs({ data: { kind: 'differences', differences: Array.from({ length: 40 }, (_, i) => 1e-9 * (1 + (i % 7)) - 2e-9) } });
  const manyGammas = analysePairs({
    data: { kind: 'differences', differences: Array.from({ length: 200 }, (_, i) => ((i * 37) % 23) - 6) },
    gammas: Array.from({ length: 30 }, (_, i) => 1 + i * 0.05),
  });
  for (const [label, r] of [
    ['demo', demoPairs],
    ['tiny', tinyPairs],
    ['many Γ', manyGammas],
  ] as const) {
    cases.push({ name: `pairs p-value ${label}`, spec: pValueByGammaPlot(r, { study }) });
    cases.push({ name: `pairs estimate ${label}`, spec: estimateRangePlot(r, { study }) });
    cases.push({ name: `pairs amplification ${label}`, spec: amplificationPlot(r, { study }) });
  }
  return cases.filter((c): c is { name: string; spec: PlotSpec } => c.spec !== null);
}
