import { InputError, type InputProblem, inputProblem, throwIfProblems } from './inputProblem';
import { type LeastSquaresFit, type TriangularDesign, fitLeastSquares, groupPartialR2 } from './linearModel';
import type { OvbBenchmarkInput } from './ovbAnalysis';

/** A covariate as it enters the design: one column, or the dummy columns of a categorical variable. */
export interface OvbCovariate {
  /** The name shown to people (the CSV column). */
  readonly name: string;
  /** Its columns in the design. */
  readonly designColumns: readonly string[];
}

/** A benchmark: one covariate, or a group of covariates taken together. */
export interface OvbBenchmarkGroup {
  /** The name shown to people (e.g. "age" or "age + income"). */
  readonly name: string;
  /** Names of covariates (as in `covariates[].name`). */
  readonly covariates: readonly string[];
}

/** Which regressions to fit from a triangular design for the sensitivity analysis. */
export interface OvbRegressionSpec {
  /** Design column of the outcome Y. */
  readonly outcome: string;
  /** Design column of the treatment D. */
  readonly treatment: string;
  readonly covariates: readonly OvbCovariate[];
  /** Design column of the intercept (null: no intercept). */
  readonly intercept: string | null;
  /** Benchmarks; default: every covariate on its own. */
  readonly benchmarks?: readonly OvbBenchmarkGroup[];
}

/** The reported numbers the sensitivity analysis needs, computed from the data. */
export interface OvbRegressionSummary {
  readonly estimate: number;
  readonly se: number;
  readonly df: number;
  readonly n: number;
  /** R²yxj and R²dxj per benchmark (group partial R²s for groups and categorical covariates). */
  readonly benchmarks: readonly OvbBenchmarkInput[];
  /** Y ~ D + X. */
  readonly outcomeFit: LeastSquaresFit;
  /** D ~ X (the treatment regression that gives R²dxj). */
  readonly treatmentFit: LeastSquaresFit;
}

/**
 * Fits the two regressions of the sensitivity analysis from a triangular design (raw data or summary
 * statistics): Y on D and the covariates (estimate, se, df, R²yxj), and D on the covariates (R²dxj).
 *
 * **Method.** Both fits come from the same R factor (see `fitLeastSquares`); a benchmark's partial R²s are the
 * fits' t²/(t² + df) for a single design column, and the extra-sum-of-squares group partial R² for a group of
 * columns (a categorical covariate's dummies, or a user-chosen group).
 *
 * **References.** Cinelli C, Hazlett C (2020), JRSS-B 82(1):39–67, §6 (benchmarking with observed covariates
 * and groups of them); Draper & Smith (1998), Applied Regression Analysis, 3rd ed., §6.3 (extra sum of squares).
 *
 * @throws InputError naming the field (`treatment`, `outcome`, `covariates[i]`, `benchmarks[i]`) when the
 *   treatment is constant, a column is collinear with others, a column is chosen twice, or too few rows remain.
 */
export function ovbRegressionSummary(design: TriangularDesign, spec: OvbRegressionSpec): OvbRegressionSummary {
  throwIfProblems(validateOvbRegressionSpec(spec));
  const covariateColumns = spec.covariates.flatMap((c) => c.designColumns);
  const base = spec.intercept === null ? covariateColumns : [spec.intercept, ...covariateColumns];
  const outcomePredictors = [...base, spec.treatment];
  const outcomeFit = renameProblems(spec, () => fitLeastSquares(design, { response: spec.outcome, predictors: outcomePredictors }), outcomePredictors);
  const treatmentFit = renameProblems(
    spec,
    () => fitLeastSquares(design, { response: spec.treatment, predictors: base }),
    base,
    true,
  );
  const d = outcomeFit.predictors.indexOf(spec.treatment);
  const groups = spec.benchmarks ?? spec.covariates.map((c) => ({ name: c.name, covariates: [c.name] }));
  const benchmarks = groups.map((g): OvbBenchmarkInput => {
    const columns = g.covariates.flatMap((name) => spec.covariates.find((c) => c.name === name)!.designColumns);
    if (columns.length === 1) {
      return {
        covariate: g.name,
        r2yxj: outcomeFit.partialR2[outcomeFit.predictors.indexOf(columns[0])],
        r2dxj: treatmentFit.partialR2[treatmentFit.predictors.indexOf(columns[0])],
      };
    }
    return {
      covariate: g.name,
      r2yxj: groupPartialR2(design, { response: spec.outcome, predictors: outcomePredictors, group: columns }),
      r2dxj: groupPartialR2(design, { response: spec.treatment, predictors: base, group: columns }),
    };
  });
  return Object.freeze({
    estimate: outcomeFit.coefficients[d],
    se: outcomeFit.standardErrors[d],
    df: outcomeFit.residualDf,
    n: outcomeFit.rowCount,
    benchmarks: Object.freeze(benchmarks.map((b) => Object.freeze(b))),
    outcomeFit,
    treatmentFit,
  });
}

/** Checks the column choice: outcome, treatment and covariates distinct; benchmarks name known covariates. */
export function validateOvbRegressionSpec(spec: OvbRegressionSpec): InputProblem[] {
  const problems: InputProblem[] = [];
  if (spec.outcome === spec.treatment) {
    problems.push(inputProblem('treatment', 'chosen-twice', `"${spec.treatment}" is also the outcome; choose another column.`, spec.treatment));
  }
  const seen = new Set<string>([spec.outcome, spec.treatment]);
  spec.covariates.forEach((c, i) => {
    if (seen.has(c.name)) {
      const role = c.name === spec.outcome ? 'the outcome' : c.name === spec.treatment ? 'the treatment' : 'another covariate';
      problems.push(inputProblem(`covariates[${i}]`, 'chosen-twice', `"${c.name}" is chosen twice (it is also ${role}).`, c.name));
    }
    seen.add(c.name);
  });
  const names = new Set(spec.covariates.map((c) => c.name));
  const groupNames = new Set<string>();
  (spec.benchmarks ?? []).forEach((g, i) => {
    if (groupNames.has(g.name)) problems.push(inputProblem(`benchmarks[${i}]`, 'chosen-twice', `"${g.name}" is chosen twice.`, g.name));
    groupNames.add(g.name);
    if (g.covariates.length === 0) problems.push(inputProblem(`benchmarks[${i}]`, 'empty', 'needs at least one covariate.', g.name));
    const inGroup = new Set<string>();
    for (const name of g.covariates) {
      if (!names.has(name)) {
        problems.push(
          inputProblem(`benchmarks[${i}]`, 'not-a-covariate', `"${name}" is not one of the covariates (${[...names].join(', ') || 'none chosen'}).`, name),
        );
      } else if (inGroup.has(name)) {
        problems.push(inputProblem(`benchmarks[${i}]`, 'chosen-twice', `"${name}" is chosen twice in this group.`, name));
      }
      inGroup.add(name);
    }
  });
  return problems;
}

/** Runs a fit and renames the engine's `predictors[i]`/`response` fields to this analysis' fields. */
function renameProblems<T>(spec: OvbRegressionSpec, fit: () => T, predictors: readonly string[], treatmentIsResponse = false): T {
  try {
    return fit();
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    const renamed = error.problems.map((p) => {
      let field = p.field;
      const m = /^predictors\[(\d+)\]$/.exec(p.field);
      const column = m ? predictors[Number(m[1])] : p.field === 'response' ? (treatmentIsResponse ? spec.treatment : spec.outcome) : undefined;
      if (column === spec.treatment) field = 'treatment';
      else if (column === spec.outcome) field = 'outcome';
      else if (column !== undefined) {
        const i = spec.covariates.findIndex((c) => c.designColumns.includes(column));
        if (i >= 0) field = `covariates[${i}]`;
      }
      return inputProblem(field, p.code, p.message, p.value);
    });
    throw new InputError(renamed);
  }
}
