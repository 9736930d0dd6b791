import { LAMBDA_GRID_SIZE } from '../../core/weightingBootstrap';
import { DEFAULT_BOOTSTRAP, DEFAULT_LAMBDA_SEARCH_LIMIT, DEFAULT_LAMBDAS, MAX_BOOTSTRAP } from '../../core/weightingInput';
import { NUMBER_READING_RULE } from '../../data/numberText';
import { WEIGHTING_CAUTION } from './text';

/** The text of `lurk weighting --help`. */
export const WEIGHTING_HELP = `lurk weighting — how much hidden confounding could move an inverse-probability-weighted estimate?
Marginal sensitivity model: a hidden factor may change each person's odds of treatment by up to Λ-fold
from the odds the propensity model fits. For each Λ: the lowest and highest weighted effect, and a
percentile-bootstrap sensitivity interval; and the smallest Λ at which either includes no effect.

  lurk weighting --file F --treatment COL --outcome COL [options]

Data:
  --file F            a CSV file (comma, semicolon or tab separated) with a header row, one row per person;
                      read in chunks; a row with a missing cell (empty, NA, ...) in a used column is left out
                      and counted
  --treatment COL     the treatment column: 0 (control) or 1 (treated)
  --outcome COL       the numeric outcome column
  --covariates a,b    covariates of the propensity model (default: every other column); text columns are
                      dummy-coded (one indicator per level but the first in character order)
  --categorical c,d   numeric covariates to dummy-code as categories (e.g. a site code)

Analysis:
  --estimand E        ate (average effect in everyone, default) or att (average effect in the treated)
  --lambda L1,L2,...  the Λ values to tabulate, each 1 or more (default ${DEFAULT_LAMBDAS.join(',')})
  --bootstrap B       bootstrap resamples, a whole number 0 to ${MAX_BOOTSTRAP.toLocaleString('en')} (default ${DEFAULT_BOOTSTRAP}; 0 = point bounds only);
                      run on two threads
  --seed N            seed of the resampling, a whole number (default 1): the same seed gives the same result
  --alpha A           1 − coverage of the sensitivity interval, between 0 and 1 (default 0.05)
  --trim-below P --trim-above Q   optional trimming rule: leave out people whose estimated propensity is
                      below P or above Q (both needed; P < 0.5 < Q), then refit the propensity model
  --json              one JSON object: estimate, rows [{lambda, lowestEffect, highestEffect, intervalLow,
                      intervalHigh}], tippingLambdaPoint, tippingPointStatus, tippingLambdaInterval,
                      tippingIntervalStatus, propensityModel {coefficients [{name, value, standardError}],
                      iterations, converged}, overlap, weights, counts, reading, conventions, warnings, ...

Conventions:
  - Propensity model: logistic regression with an intercept, Newton/IRLS with R's glm stopping rule
    (|ΔD|/(|D| + 0.1) < 1e-8, at most 25 iterations); separation and collinearity are refused by name.
  - Weights: Hájek (normalised within each group). ATE: 1/e for the treated, 1/(1 − e) for controls;
    ATT: 1 for the treated, e/(1 − e) for controls.
  - Weight boxes at Λ: ATE treated weight in [1 + (1/e − 1)/Λ, 1 + (1/e − 1)·Λ], control in [1 + o/Λ, 1 + o·Λ]
    with o = e/(1 − e); ATT control weight in [o/Λ, o·Λ]; each person's weight anywhere in its box.
  - Bounds: the exact lowest and highest weighted effect over the boxes, by sorting each group's outcomes
    and scanning the thresholds (the extreme puts low weights on one side of a threshold and high on the other).
  - Bootstrap: stratified by treatment group (treated drawn from the treated, controls from the controls),
    the propensity model refitted in each resample; resamples with separation, no convergence or a lost
    covariate are counted and left out. Resample i uses its own random stream (SplitMix64 from seed and i),
    so the result does not depend on the number of threads.
  - Sensitivity interval at Λ: the α/2 quantile of the resampled lowest effects to the 1 − α/2 quantile of the
    resampled highest effects, quantile type 7 (R's default).
  - Tipping Λ of the point bounds: bisection in log Λ; of the interval: a grid of ${LAMBDA_GRID_SIZE} log-spaced Λ from 1
    to ${DEFAULT_LAMBDA_SEARCH_LIMIT}, refined by interpolation between neighbouring grid values.
  - Trimming (when asked): people outside [P, Q] are left out before weighting and the model refitted;
    trimming is not repeated within resamples. Overlap warning below 0.01 or above 0.99 (common practice, no source).
  - Coefficient standard errors: square roots of the diagonal of (XᵀWX)⁻¹, W = e(1 − e), as R's summary.glm.

${NUMBER_READING_RULE}

${WEIGHTING_CAUTION}
`;
