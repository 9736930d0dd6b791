import type { MatchedSetsResult } from '../../core/matchedSetsAnalysis';
import { amplificationCurvePlot } from '../../plot/amplificationCurvePlot';
import { estimateBandsPlot } from '../../plot/estimateBandsPlot';
import type { PlotSpec } from '../../plot/plotSpec';
import { pValueBoundsPlot, type SensitivityPlotOptions } from '../../plot/pValueBoundsPlot';

/** The p-value bounds of a matched-sets result against Γ (see `pValueBoundsPlot`; Rosenbaum 2002, §4.3). */
export function setsPValuePlot(result: MatchedSetsResult, options: SensitivityPlotOptions = {}): PlotSpec {
  return pValueBoundsPlot(
    {
      id: 'sets-p-value-by-gamma',
      title: `How the ${result.outcomeKind === 'binary' ? 'event-count' : 'm-statistic'} test's p-value bounds grow with hidden bias`,
      gammaAxisLabel: 'Hidden bias Γ (odds of treatment within a matched set may differ by this factor)',
      tableCaption: `p-value bounds by Γ (${result.tail === 'exact' ? 'exact' : 'normal approximation'})`,
      alpha: result.alpha,
      rows: result.rows,
      curve: [],
      sensitivityValue: result.sensitivityValue,
      sensitivityStatus: result.sensitivityStatus,
    },
    options,
  );
}

/**
 * The m-estimate under hidden bias: range and sensitivity interval by Γ (Rosenbaum 2007, Biometrics
 * 63:456–464); an interval end the analysis found unbounded (null) is drawn to the plot's edge. Null for a
 * binary outcome.
 */
export function setsEstimatePlot(result: MatchedSetsResult, options: SensitivityPlotOptions = {}): PlotSpec | null {
  if (result.outcomeKind !== 'continuous' || result.estimate === null) return null;
  const estimates = result.rows.map((r) => ({
    gamma: r.gamma,
    estimateLow: r.estimateLow ?? result.estimate!,
    estimateHigh: r.estimateHigh ?? result.estimate!,
    intervalLow: r.intervalLow ?? -Infinity,
    intervalHigh: r.intervalHigh ?? Infinity,
  }));
  return estimateBandsPlot({ id: 'sets-estimate-range', estimateName: 'm-estimate', estimate: result.estimate, intervalLevel: result.intervalLevel, estimates }, options);
}

/** Amplification of the tipping Γ (Rosenbaum & Silber 2009); null when there is no tipping Γ. */
export function setsAmplificationPlot(result: MatchedSetsResult, options: SensitivityPlotOptions = {}): PlotSpec | null {
  return amplificationCurvePlot({ id: 'sets-amplification', sensitivityValue: result.sensitivityValue, amplification: result.amplification, alternative: result.alternative }, options);
}
