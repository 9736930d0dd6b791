import type { PairsResult } from '../../core/pairsAnalysis';
import { amplificationCurvePlot } from '../../plot/amplificationCurvePlot';
import type { PlotSpec } from '../../plot/plotSpec';
import type { PairsPlotOptions } from './pValueByGammaPlot';

/**
 * Amplification of the tipping Γ of a matched-pairs result (Rosenbaum & Silber 2009, JASA 104:1398–1405):
 * the (Λ, Δ) curve with the readable pairs marked (see `amplificationCurvePlot`). Null when there is no tipping Γ.
 */
export function amplificationPlot(result: PairsResult, options: PairsPlotOptions = {}): PlotSpec | null {
  return amplificationCurvePlot(
    { id: 'pairs-amplification', sensitivityValue: result.sensitivityValue, amplification: result.amplification, alternative: result.alternative },
    options,
  );
}
