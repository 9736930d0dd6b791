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
import { analyseMatchedSets, type MatchedSetsInput } from '../../src/core/matchedSetsAnalysis';
import { analyseWeighting } from '../../src/core/weightingAnalysis';
import { generatedInput } from './generatedWeightingInput';
import { SplitMix64 } from '../../src/core/seededRandom';
import { setsAmplificationPlot, setsEstimatePlot, setsPValuePlot } from '../../src/methods/sets/plots';
import { weightingPlots } from '../../src/methods/weighting/plots';

/** Invented matched sets (fictional): `sets` sets with 1–4 controls, a shift of `effect` for the treated. */
function fictionalSets(sets: number, effect: number, seed: number, binary = false): MatchedSetsInput {
  const g = new SplitMix64(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - g.nextDouble())) * Math.cos(2 * Math.PI * g.nextDouble());
  const setIds: number[] = [];
  const treated: number[] = [];
  const outcomes: number[] = [];
  for (let s = 0; s < sets; s++) {
    const controls = 1 + Math.floor(g.nextDouble() * 4);
    for (let u = 0; u <= controls; u++) {
      const y = 50 + 10 * normal() + (u === 0 ? effect : 0);
      setIds.push(s);
      treated.push(u === 0 ? 1 : 0);
      outcomes.push(binary ? (y > 55 ? 1 : 0) : y);
    }
  }
  return { setIds, treated, outcomes };
}


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
  // Matched sets: a continuous outcome, a binary one, and many Γ values.
  const setsContinuous = analyseMatchedSets(fictionalSets(120, 6, 11));
  const setsBinary = analyseMatchedSets(fictionalSets(300, 6, 12, true));
  const setsManyGammas = analyseMatchedSets({ ...fictionalSets(80, 8, 13), gammas: Array.from({ length: 30 }, (_, i) => 1 + i * 0.1) });
  for (const [label, r] of [
    ['continuous', setsContinuous],
    ['binary', setsBinary],
    ['many Γ', setsManyGammas],
  ] as const) {
    cases.push({ name: `sets p-value ${label}`, spec: setsPValuePlot(r, { study }) });
    cases.push({ name: `sets estimate ${label}`, spec: setsEstimatePlot(r, { study }) });
    cases.push({ name: `sets amplification ${label}`, spec: setsAmplificationPlot(r, { study }) });
  }

  // Weighting: the default Λ values, and many close ones with poor overlap.
  const weightingDefault = analyseWeighting(generatedInput(400, 21, { bootstrap: 40, seed: 7 }));
  const weightingCrowded = analyseWeighting(generatedInput(300, 22, { bootstrap: 40, seed: 7, lambdas: Array.from({ length: 14 }, (_, i) => 1 + i * 0.15) }));
  for (const [label, r] of [
    ['default', weightingDefault],
    ['crowded', weightingCrowded],
  ] as const) {
    const plots = weightingPlots(r);
    cases.push({ name: `weighting bounds ${label}`, spec: plots.bounds });
    cases.push({ name: `weighting overlap ${label}`, spec: plots.overlap });
    cases.push({ name: `weighting weights ${label}`, spec: plots.weights });
  }
  return cases.filter((c): c is { name: string; spec: PlotSpec } => c.spec !== null);
}
