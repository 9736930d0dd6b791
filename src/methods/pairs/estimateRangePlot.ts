import type { PairsResult } from '../../core/pairsAnalysis';
import { estimateBandsPlot } from '../../plot/estimateBandsPlot';
import type { PlotSpec } from '../../plot/plotSpec';
import type { PairsPlotOptions } from './pValueByGammaPlot';

/**
 * The Hodges–Lehmann estimate under hidden bias (Rosenbaum 1993, JASA 88:1250–1253; Rosenbaum 2002,
 * §4.3.4–4.3.5): range and sensitivity interval by Γ as nested bands (see `estimateBandsPlot`). Null when the
 * result has no estimates (sign test, binary outcome).
 */
export function estimateRangePlot(result: PairsResult, options: PairsPlotOptions = {}): PlotSpec | null {
  return estimateBandsPlot(
    { id: 'pairs-estimate-range', estimateName: 'Hodges–Lehmann estimate', estimate: result.estimate, intervalLevel: result.intervalLevel, estimates: result.estimates },
    options,
  );
}
