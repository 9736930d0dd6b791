import type { RegressionData } from './regressionData';
import type { OvbBenchmarkGroup, OvbRegressionSpec } from '../../core/ovbRegression';

/**
 * The sensitivity analysis' view of accumulated regression data: the design columns of outcome, treatment
 * and each covariate (a categorical covariate is the group of its dummy columns), and the benchmarks
 * (default: every covariate on its own).
 */
export function ovbSpecFromRegressionData(data: RegressionData, benchmarks?: readonly OvbBenchmarkGroup[]): OvbRegressionSpec {
  return {
    outcome: data.outcomeColumn,
    treatment: data.treatmentColumn,
    covariates: data.covariateColumns.map((c) => ({ name: c.column, designColumns: c.designColumns })),
    intercept: data.design.interceptColumn,
    ...(benchmarks ? { benchmarks } : {}),
  };
}

/**
 * Reads benchmark choices written as text: covariate names separated by commas, a group as names joined by
 * "+" (e.g. "age, income+education"). Empty text → undefined (every covariate on its own).
 */
export function parseBenchmarkList(text: string | undefined): OvbBenchmarkGroup[] | undefined {
  if (text === undefined || text.trim() === '') return undefined;
  return text
    .split(',')
    .map((part) => part.trim())
    .filter((part) => part !== '')
    .map((part) => {
      const covariates = part.split('+').map((name) => name.trim()).filter((name) => name !== '');
      return { name: covariates.join(' + '), covariates };
    });
}
