import { type InputProblem, inputProblem, throwIfProblems } from './inputProblem';
import { INTERCEPT_NAME, type TriangularDesign, validateLeastSquares } from './linearModel';
import { fitLogisticRegression, type LogisticFit } from './logisticRegression';
import { isSeed } from './seededRandom';
import { StreamingQr } from './streamingQr';
import {
  DEFAULT_BOOTSTRAP,
  DEFAULT_LAMBDA_SEARCH_LIMIT,
  DEFAULT_LAMBDAS,
  DEFAULT_WEIGHTING_ALPHA,
  DEFAULT_WEIGHTING_SEED,
  MAX_BOOTSTRAP,
  type PropensityTrimming,
  type WeightingEstimand,
  type WeightingInput,
} from './weightingInput';

/** How many people were given, dropped (by reason) and used. */
export interface WeightingCounts {
  /** People in the input. */
  readonly given: number;
  /** People dropped for a missing value (NaN) in any used column. */
  readonly droppedMissing: number;
  /** For each column with missing values, how many people lack a value there (a person may count in several). */
  readonly missingByColumn: readonly { readonly column: string; readonly count: number }[];
  /** People dropped by the trimming rule: estimated propensity below `trim.below` / above `trim.above`. */
  readonly trimmedBelow: number;
  readonly trimmedAbove: number;
  /** People used, and of them treated and control. */
  readonly used: number;
  readonly treated: number;
  readonly control: number;
}

/**
 * An analysis made ready for resampling: the cleaned data, the fitted propensity model and the settings.
 * Plain data (numbers, strings, typed arrays), so it can be sent to a worker thread by structured clone.
 */
export interface PreparedWeighting {
  readonly estimand: WeightingEstimand;
  readonly lambdas: readonly number[];
  readonly bootstrap: number;
  readonly seed: number;
  readonly alpha: number;
  readonly trim: PropensityTrimming | null;
  readonly lambdaSearchLimit: number;
  /** Design columns: the intercept, then the covariates. */
  readonly columnNames: readonly string[];
  /** Number of design columns p. */
  readonly columnCount: number;
  /** People used, n. */
  readonly size: number;
  /** n×p row-major design (intercept column of ones first). */
  readonly design: Float64Array;
  /** 1 = treated, 0 = control. */
  readonly treatment: Uint8Array;
  readonly outcome: Float64Array;
  /** Indices of the treated / controls in ascending order of outcome (ties by index). */
  readonly treatedOrder: Int32Array;
  readonly controlOrder: Int32Array;
  /** Propensity model fitted to everyone used (after trimming, refitted to those kept). */
  readonly coefficients: Float64Array;
  readonly iterations: number;
  readonly converged: boolean;
  readonly deviance: number;
  /** Linear predictor η = logit(e) and propensity e by person. */
  readonly linearPredictor: Float64Array;
  readonly propensities: Float64Array;
  readonly counts: WeightingCounts;
}

interface Inspection {
  problems: InputProblem[];
  prepared?: PreparedWeighting;
}

/**
 * Checks a weighting analysis' input and returns every problem found (empty when it can be analysed).
 *
 * **Method.** Settings first (estimand, Λ values, B, seed, α, trimming rule, search limit), then the columns
 * (lengths, names, 0/1 treatment, numeric values), then — after dropping people with a missing value — the
 * group sizes, the rank of [1, covariates], single-covariate separation and the propensity fit, and again
 * for the people kept after trimming.
 *
 * **References.** Albert A, Anderson JA (1984) On the existence of maximum likelihood estimates in logistic
 * regression models. Biometrika 71(1):1–10 (complete and quasi-complete separation).
 *
 * **Special cases.** A missing value (NaN) is never a problem by itself; Infinity and non-numbers are.
 *
 * Fields and codes: `treatment` (`not-binary` with the count, `one-group`, `too-few-people`, `length`),
 * `outcome` (`not-numeric` with the count, `length`), `covariates[i].values` (`not-numeric`, `length`),
 * `covariates[i].name` (`empty-name`, `duplicate-name`), `covariates[i]` (`constant`, `collinear`,
 * `zero-column`, `separation` — the covariate splits the groups exactly), `covariates` (`separation` by a
 * combination of covariates, `not-converged`), `estimand`, `lambdas` / `lambdas[i]` (`below-one`,
 * `not-finite`, `empty`), `bootstrap`, `seed`, `alpha`, `trim` (`outside-interval`, `too-few-after-trimming`,
 * and the covariate problems again when they appear only after trimming), `lambdaSearchLimit`.
 *
 * The checks that need data run after people with a missing value are dropped; separation and collinearity
 * are judged by fitting the propensity model (R's `glm` rules: fitted probabilities within 10ε of 0 or 1, or
 * no convergence in 25 iterations; and coefficients still diverging: three further Newton steps from the
 * estimate still move some person's linear predictor by more than 1e-3, where at a finite maximum they move
 * it by rounding error only — the covariates whose coefficients move are named) and by the QR rank test of
 * the design at R's `lm` tolerance 1e-7.
 *
 * @param input the analysis input (any shape: every field is checked)
 */
export function validateWeighting(input: WeightingInput): InputProblem[] {
  return inspect(input).problems;
}

/**
 * Validates the input, drops and counts people with missing values, fits the propensity model by logistic
 * regression (Newton/IRLS), applies the optional trimming rule (refitting to those kept), and returns the
 * data ready for the point bounds and the bootstrap.
 *
 * **Method.** As `analyseWeighting`, steps (1)–(3); the people of each group are also listed in ascending
 * order of outcome (ties by position), which every bound computation reuses.
 *
 * **References.** Rosenbaum PR, Rubin DB (1983) The central role of the propensity score in observational
 * studies for causal effects. Biometrika 70(1):41–55.
 *
 * **Special cases.** Defaults are filled in (Λ values, B, seed, α, search limit). Trimming that drops nobody
 * keeps the first fit.
 *
 * @param input see {@link WeightingInput}
 * @throws InputError carrying every problem from {@link validateWeighting}
 */
export function prepareWeighting(input: WeightingInput): PreparedWeighting {
  const { problems, prepared } = inspect(input);
  throwIfProblems(problems);
  return prepared!;
}

function inspect(input: WeightingInput): Inspection {
  const problems: InputProblem[] = [];
  settingsProblems(input, problems);
  const treatment = input.treatment;
  const outcome = input.outcome;
  const covariates = Array.isArray(input.covariates) ? input.covariates : [];
  if (!Array.isArray(input.covariates)) problems.push(inputProblem('covariates', 'not-a-list', 'must be a list of columns (it may be empty).'));
  if (!Array.isArray(treatment)) {
    problems.push(inputProblem('treatment', 'not-a-list', 'must be a list of 0/1 values.'));
    return { problems };
  }
  const n = treatment.length;
  if (!Array.isArray(outcome)) problems.push(inputProblem('outcome', 'not-a-list', 'must be a list of numbers.'));
  else if (outcome.length !== n) problems.push(inputProblem('outcome', 'length', `has ${outcome.length} values but the treatment has ${n}.`, outcome.length));
  const names = new Set<string>();
  covariates.forEach((c, i) => {
    if (typeof c?.name !== 'string' || c.name.trim() === '') problems.push(inputProblem(`covariates[${i}].name`, 'empty-name', 'needs a name.'));
    else if (names.has(c.name) || c.name === INTERCEPT_NAME) problems.push(inputProblem(`covariates[${i}].name`, 'duplicate-name', `"${c.name}" is used twice.`, c.name));
    else names.add(c.name);
    if (!Array.isArray(c?.values)) problems.push(inputProblem(`covariates[${i}].values`, 'not-a-list', 'must be a list of numbers.'));
    else if (c.values.length !== n) problems.push(inputProblem(`covariates[${i}].values`, 'length', `has ${c.values.length} values but the treatment has ${n}.`, c.values.length));
  });
  if (problems.some((p) => p.code === 'length' || p.code === 'not-a-list')) return { problems };

  // Values: 0/1 treatment, numeric outcome and covariates (NaN = missing).
  let notBinary = 0;
  for (const t of treatment) if (!(t === 0 || t === 1 || Number.isNaN(t))) notBinary++;
  if (notBinary > 0) problems.push(inputProblem('treatment', 'not-binary', `must be 0 (control) or 1 (treated): ${countText(notBinary)} other.`, notBinary));
  const badOutcome = countNonNumeric(outcome);
  if (badOutcome > 0) problems.push(inputProblem('outcome', 'not-numeric', `must be numbers: ${countText(badOutcome)} not.`, badOutcome));
  covariates.forEach((c, i) => {
    const bad = countNonNumeric(c.values);
    if (bad > 0) problems.push(inputProblem(`covariates[${i}].values`, 'not-numeric', `must be numbers ("${c.name}"): ${countText(bad)} not.`, bad));
  });
  if (problems.length > 0) return { problems };

  // Drop people with a missing value, counting by column.
  const columns: { name: string; values: readonly number[] }[] = [
    { name: 'treatment', values: treatment },
    { name: 'outcome', values: outcome },
    ...covariates.map((c) => ({ name: c.name, values: c.values })),
  ];
  const keep: number[] = [];
  const missingByColumn = columns.map((c) => ({ column: c.name, count: 0 }));
  for (let i = 0; i < n; i++) {
    let ok = true;
    columns.forEach((c, k) => {
      if (Number.isNaN(c.values[i])) {
        missingByColumn[k].count++;
        ok = false;
      }
    });
    if (ok) keep.push(i);
  }
  const covariateNames = covariates.map((c) => c.name);
  const p = covariateNames.length + 1;
  const first = checkAndFit(keep, treatment, covariates, '');
  problems.push(...first.problems);
  if (problems.length > 0 || first.fit === undefined) return { problems };

  let used = keep;
  let fit = first.fit;
  let eta = first.eta!;
  let trimmedBelow = 0;
  let trimmedAbove = 0;
  const trim = input.trim ?? null;
  if (trim !== null) {
    const kept: number[] = [];
    keep.forEach((person, j) => {
      const e = propensity(eta[j]);
      if (e < trim.below) trimmedBelow++;
      else if (e > trim.above) trimmedAbove++;
      else kept.push(person);
    });
    if (trimmedBelow + trimmedAbove > 0) {
      const second = checkAndFit(kept, treatment, covariates, 'after trimming, ');
      if (second.problems.length > 0 || second.fit === undefined) {
        return { problems: second.problems.map((q) => inputProblem('trim', q.code === 'too-few-people' ? 'too-few-after-trimming' : q.code, q.message, q.value)) };
      }
      used = kept;
      fit = second.fit;
      eta = second.eta!;
    }
  }

  const size = used.length;
  const design = new Float64Array(size * p);
  const treat = new Uint8Array(size);
  const y = new Float64Array(size);
  used.forEach((person, j) => {
    design[j * p] = 1;
    covariates.forEach((c, k) => (design[j * p + k + 1] = c.values[person]));
    treat[j] = treatment[person];
    y[j] = outcome[person];
  });
  const treatedIdx: number[] = [];
  const controlIdx: number[] = [];
  for (let j = 0; j < size; j++) (treat[j] === 1 ? treatedIdx : controlIdx).push(j);
  const byOutcome = (a: number, b: number) => y[a] - y[b] || a - b;
  treatedIdx.sort(byOutcome);
  controlIdx.sort(byOutcome);
  const propensities = new Float64Array(size);
  for (let j = 0; j < size; j++) propensities[j] = propensity(eta[j]);

  const prepared: PreparedWeighting = {
    estimand: input.estimand,
    lambdas: Object.freeze([...(input.lambdas ?? DEFAULT_LAMBDAS)]),
    bootstrap: input.bootstrap ?? DEFAULT_BOOTSTRAP,
    seed: input.seed ?? DEFAULT_WEIGHTING_SEED,
    alpha: input.alpha ?? DEFAULT_WEIGHTING_ALPHA,
    trim: trim === null ? null : Object.freeze({ below: trim.below, above: trim.above }),
    lambdaSearchLimit: input.lambdaSearchLimit ?? DEFAULT_LAMBDA_SEARCH_LIMIT,
    columnNames: Object.freeze([INTERCEPT_NAME, ...covariateNames]),
    columnCount: p,
    size,
    design,
    treatment: treat,
    outcome: y,
    treatedOrder: Int32Array.from(treatedIdx),
    controlOrder: Int32Array.from(controlIdx),
    coefficients: Float64Array.from(fit.coefficients),
    iterations: fit.iterations,
    converged: fit.converged,
    deviance: fit.deviance,
    linearPredictor: eta,
    propensities,
    counts: Object.freeze({
      given: n,
      droppedMissing: n - keep.length,
      missingByColumn: Object.freeze(missingByColumn.filter((m) => m.count > 0).map((m) => Object.freeze(m))),
      trimmedBelow,
      trimmedAbove,
      used: size,
      treated: treatedIdx.length,
      control: controlIdx.length,
    }),
  };
  return { problems: [], prepared };
}

/** e = 1/(1 + exp(−η)) without overflow. */
function propensity(eta: number): number {
  if (eta >= 0) return 1 / (1 + Math.exp(-eta));
  const t = Math.exp(eta);
  return t / (1 + t);
}

function countText(k: number): string {
  return k === 1 ? '1 value is' : `${k} values are`;
}

function countNonNumeric(values: readonly unknown[]): number {
  let bad = 0;
  for (const v of values) if (typeof v !== 'number' || v === Infinity || v === -Infinity) bad++;
  return bad;
}

function settingsProblems(input: WeightingInput, problems: InputProblem[]): void {
  if (input.estimand !== 'ate' && input.estimand !== 'att') {
    problems.push(inputProblem('estimand', 'unknown', 'must be "ate" (average effect in everyone) or "att" (average effect in the treated).', input.estimand));
  }
  if (input.lambdas !== undefined) {
    if (!Array.isArray(input.lambdas) || input.lambdas.length === 0) problems.push(inputProblem('lambdas', 'empty', 'needs at least one value of Λ.'));
    else {
      input.lambdas.forEach((l, i) => {
        if (typeof l !== 'number' || !Number.isFinite(l)) problems.push(inputProblem(`lambdas[${i}]`, 'not-finite', 'must be a finite number.', l));
        else if (l < 1) problems.push(inputProblem(`lambdas[${i}]`, 'below-one', 'Λ must be at least 1 (Λ = 1 means no hidden bias).', l));
      });
    }
  }
  const b = input.bootstrap;
  if (b !== undefined && !(Number.isInteger(b) && b >= 0 && b <= MAX_BOOTSTRAP)) {
    problems.push(inputProblem('bootstrap', 'not-whole', `must be a whole number of resamples from 0 to ${MAX_BOOTSTRAP} (0 = point bounds only).`, b));
  }
  if (input.seed !== undefined && !isSeed(input.seed)) problems.push(inputProblem('seed', 'not-whole', 'must be a whole number from 0 to 2^53 − 1.', input.seed));
  const a = input.alpha;
  if (a !== undefined && !(typeof a === 'number' && a > 0 && a < 1)) problems.push(inputProblem('alpha', 'outside-interval', 'must be between 0 and 1 (e.g. 0.05).', a));
  const limit = input.lambdaSearchLimit;
  if (limit !== undefined && !(typeof limit === 'number' && Number.isFinite(limit) && limit > 1 && limit <= 1e6)) {
    problems.push(inputProblem('lambdaSearchLimit', 'outside-interval', 'must be above 1 and at most 1,000,000.', limit));
  }
  const t = input.trim;
  if (t !== undefined && t !== null) {
    const ok = typeof t.below === 'number' && typeof t.above === 'number' && t.below >= 0 && t.below < 0.5 && t.above > 0.5 && t.above <= 1;
    if (!ok) problems.push(inputProblem('trim', 'outside-interval', 'needs below in [0, 0.5) and above in (0.5, 1], e.g. below 0.1 and above 0.9.', t));
  }
}

/** A Newton step that still moves someone's linear predictor by more than this signals divergence (separation). */
const DIVERGENCE_STEP = 1e-3;

interface CheckedFit {
  problems: InputProblem[];
  fit?: LogisticFit;
  eta?: Float64Array;
}

/** Group sizes, constant/collinear covariates, single-covariate separation, then the propensity fit. */
function checkAndFit(people: readonly number[], treatment: readonly number[], covariates: WeightingInput['covariates'], prefix: string): CheckedFit {
  const problems: InputProblem[] = [];
  const p = covariates.length + 1;
  let treated = 0;
  for (const i of people) treated += treatment[i];
  const control = people.length - treated;
  const capital = (s: string) => (prefix === '' ? s : prefix + s.charAt(0).toLowerCase() + s.slice(1));
  if (treated === 0 || control === 0) {
    problems.push(
      inputProblem('treatment', 'one-group', capital(`Everyone used is ${treated === 0 ? 'in the control group' : 'treated'}: weighting needs treated and control people.`)),
    );
    return { problems };
  }
  if (treated < 2 || control < 2 || people.length < p + 2) {
    problems.push(
      inputProblem(
        'treatment',
        'too-few-people',
        capital(`Too few people: ${treated} treated and ${control} control; needs at least 2 in each group and more people than the ${p + 1} needed for ${p} coefficients.`),
        people.length,
      ),
    );
    return { problems };
  }
  // Rank of [1, covariates] by the QR rank test of linearModel (R's lm tolerance), response = treatment.
  const names = [INTERCEPT_NAME, ...covariates.map((c) => c.name), '(treatment)'];
  const qr = new StreamingQr(names.length);
  const row = new Float64Array(names.length);
  for (const i of people) {
    row[0] = 1;
    covariates.forEach((c, k) => (row[k + 1] = c.values[i]));
    row[p] = treatment[i];
    qr.addRow(row);
  }
  const design: TriangularDesign = { columnNames: names, r: qr.triangle(), rowCount: people.length, interceptColumn: INTERCEPT_NAME };
  const rank = validateLeastSquares(design, { response: '(treatment)', predictors: names.slice(0, p) });
  for (const q of rank) {
    const m = /^predictors\[(\d+)\]$/.exec(q.field);
    if (m && Number(m[1]) >= 1) problems.push(inputProblem(`covariates[${Number(m[1]) - 1}]`, q.code, capital(q.message), q.value));
  }
  if (problems.length > 0) return { problems };

  // A single covariate that separates the groups (quasi-complete when the two ranges touch).
  covariates.forEach((c, k) => {
    let min1 = Infinity;
    let max1 = -Infinity;
    let min0 = Infinity;
    let max0 = -Infinity;
    for (const i of people) {
      const v = c.values[i];
      if (treatment[i] === 1) {
        if (v < min1) min1 = v;
        if (v > max1) max1 = v;
      } else {
        if (v < min0) min0 = v;
        if (v > max0) max0 = v;
      }
    }
    let message = '';
    if (max0 <= min1) message = `every treated person has "${c.name}" ≥ ${min1} and every control ≤ ${max0}`;
    else if (max1 <= min0) message = `every treated person has "${c.name}" ≤ ${max1} and every control ≥ ${min0}`;
    if (message !== '') {
      problems.push(
        inputProblem(
          `covariates[${k}]`,
          'separation',
          capital(`"${c.name}" separates treated from control people (${message}), so the propensity model has no finite estimate and some weights would be infinite; drop or coarsen it, or restrict the analysis to the overlapping range.`),
          c.name,
        ),
      );
    }
  });
  if (problems.length > 0) return { problems };

  const x = new Float64Array(people.length * p);
  const y = new Float64Array(people.length);
  people.forEach((i, j) => {
    x[j * p] = 1;
    covariates.forEach((c, k) => (x[j * p + k + 1] = c.values[i]));
    y[j] = treatment[i];
  });
  const fit = fitLogisticRegression(x, p, y);
  if (fit.dependentColumn >= 1) {
    const k = fit.dependentColumn - 1;
    problems.push(inputProblem(`covariates[${k}]`, 'collinear', capital(`"${covariates[k].name}" is (numerically) a linear combination of the other covariates in the weighted fit; drop it.`), covariates[k].name));
    return { problems };
  }
  // Divergence: three more Newton steps from the estimate. At a finite maximum they move the linear predictor
  // by rounding error only (Newton converges quadratically); under separation the coefficients keep growing,
  // moving some people's η by about 1 per step. The covariates whose coefficients move are named.
  const further = fitLogisticRegression(x, p, y, { start: fit.coefficients, maxIterations: 3, tolerance: 0 });
  const moving: string[] = [];
  let diverging = false;
  if (further.dependentColumn < 0) {
    const delta = Array.from({ length: p }, (_, k) => further.coefficients[k] - fit.coefficients[k]);
    let largest = 0;
    for (let j = 0; j < people.length; j++) {
      let d = 0;
      for (let k = 0; k < p; k++) d += x[j * p + k] * delta[k];
      largest = Math.max(largest, Math.abs(d));
    }
    diverging = largest > DIVERGENCE_STEP;
    covariates.forEach((c, k) => {
      let lo = Infinity;
      let hi = -Infinity;
      for (const i of people) {
        lo = Math.min(lo, c.values[i]);
        hi = Math.max(hi, c.values[i]);
      }
      if (Math.abs(delta[k + 1]) * (hi - lo) > DIVERGENCE_STEP) moving.push(`"${c.name}"`);
    });
  }
  if (fit.fittedAtBoundary || diverging) {
    const named = moving.length > 0 ? ` (the coefficients of ${moving.join(', ')} grow without limit)` : '';
    problems.push(
      inputProblem(
        'covariates',
        'separation',
        capital(`A combination of the covariates separates treated from control people${named}: the propensity model has no finite estimate and some weights would be infinite; simplify the propensity model or restrict the analysis to the overlapping range.`),
        moving.map((m) => m.slice(1, -1)),
      ),
    );
    return { problems };
  }
  if (!fit.converged) {
    problems.push(
      inputProblem('covariates', 'not-converged', capital(`The propensity model did not converge in ${fit.iterations} iterations (often a sign of near-separation); simplify the model.`), fit.iterations),
    );
    return { problems };
  }
  const eta = new Float64Array(people.length);
  for (let j = 0; j < people.length; j++) {
    let s = 0;
    for (let k = 0; k < p; k++) s += x[j * p + k] * fit.coefficients[k];
    eta[j] = s;
  }
  return { problems, fit, eta };
}
