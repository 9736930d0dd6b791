import type { PairsResult } from '../../core/pairsAnalysis';
import { pValueBoundsPlot, type SensitivityPlotOptions } from '../../plot/pValueBoundsPlot';
import type { PlotSpec } from '../../plot/plotSpec';

export type PairsPlotOptions = SensitivityPlotOptions;

/**
 * The p-value bounds of a matched-pairs result against the hidden bias Γ (see `pValueBoundsPlot`): upper and
 * lower bound on a logarithmic p axis, α marked and the tipping Γ labelled (Rosenbaum 2002, §4.3).
 */
export function pValueByGammaPlot(result: PairsResult, options: PairsPlotOptions = {}): PlotSpec {
  const testName = result.test === 'signrank' ? 'signed-rank' : 'sign';
  return pValueBoundsPlot(
    {
      id: 'pairs-p-value-by-gamma',
      title: `How the ${testName} test's p-value bounds grow with hidden bias`,
      gammaAxisLabel: 'Hidden bias Γ (odds of treatment within a pair may differ by this factor)',
      tableCaption: `p-value bounds by Γ (${result.tailMethod === 'exact' ? 'exact' : 'normal approximation'})`,
      alpha: result.alpha,
      rows: result.rows,
      curve: result.curve,
      sensitivityValue: result.sensitivityValue,
      sensitivityStatus: result.sensitivityStatus,
    },
    options,
  );
}
